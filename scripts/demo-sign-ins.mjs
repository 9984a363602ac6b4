// Reads the demo people from the seed module's source so the start command can print them
// without compiling TypeScript.
import fs from "node:fs";
import path from "node:path";
import { root } from "./services.mjs";

export function demoSignIns() {
  const src = fs.readFileSync(path.join(root, "db", "seed", "people.ts"), "utf8");
  const password = /DEMO_PASSWORD\s*=\s*"([^"]+)"/.exec(src)?.[1] ?? "(see README)";
  const emails = [...src.matchAll(/email:\s*"([^"]+)"/g)].map((m) => m[1]);
  return [`password: ${password}`, ...emails];
}
