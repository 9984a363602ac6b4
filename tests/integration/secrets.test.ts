/**
 * The session secret: a production server refuses the development one (and a short one) and
 * stops before serving; `npm start` generates one into the project's data folder, readable by
 * its owner only, and reuses it on the next start.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";

const tsx = path.resolve("node_modules/.bin/tsx");

/** Runs `code` (a promise) in a fresh process with exactly this environment; a rejection exits 1. */
function load(code: string, env: Record<string, string>) {
  const r = spawnSync(tsx, ["-e", `${code}.catch((e) => { console.error(e.message); process.exit(1); })`], {
    encoding: "utf8",
    env: { PATH: process.env.PATH ?? "", HOME: process.env.HOME ?? "", DATABASE_URL: process.env.DATABASE_URL ?? "", ...env } as unknown as NodeJS.ProcessEnv,
    timeout: 60_000,
  });
  return { status: r.status, output: `${r.stdout}${r.stderr}` };
}
const loadEnv = (env: Record<string, string>) => load(`import("./lib/env.ts").then(() => console.log("env ok"))`, env);

describe("the session secret", () => {
  it("a production server refuses the built-in development secret", () => {
    const r = loadEnv({ NODE_ENV: "production" });
    expect(r.status).not.toBe(0);
    expect(r.output).toContain("BETTER_AUTH_SECRET is the built-in development secret");
  });

  it("a production server refuses a secret shorter than 32 characters", () => {
    const r = loadEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: "only-twenty-chars-ab" });
    expect(r.status).not.toBe(0);
    expect(r.output).toContain("at least 32 characters");
  });

  it("takes a proper secret in production, and the development one in development and while building", () => {
    expect(loadEnv({ NODE_ENV: "production", BETTER_AUTH_SECRET: "x".repeat(43), WEBHOOK_SECRET_KEY: "y".repeat(43) }).output).toContain("env ok");
    expect(loadEnv({ NODE_ENV: "development" }).output).toContain("env ok");
    expect(loadEnv({ NODE_ENV: "production", NEXT_PHASE: "phase-production-build" }).output).toContain("env ok");
  });

  it("the server's start-up hook stops the process instead of serving with it", () => {
    const r = load(`import("./instrumentation.ts").then((m) => m.register()).then(() => console.log("served"))`, {
      NODE_ENV: "production",
      NEXT_RUNTIME: "nodejs",
      MAIL_WORKER: "off",
    });
    expect(r.status).toBe(1);
    expect(r.output).toContain("not starting");
    expect(r.output).not.toContain("served");
  });

  it("npm start generates one into the data folder, mode 0600, and reuses it", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-secret-"));
    const ensure = () =>
      spawnSync(
        process.execPath,
        ["-e", `import("./scripts/services.mjs").then((m) => process.stdout.write("\\n" + m.ensureAuthSecret({ dir: ${JSON.stringify(dir)}, env: {} })))`],
        { encoding: "utf8" },
      )
        .stdout.trim()
        .split("\n")
        .pop() ?? "";
    const first = ensure();
    const file = path.join(dir, "auth-secret");
    expect(first.length).toBeGreaterThanOrEqual(32);
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    expect(ensure()).toBe(first);
    // a copy made readable by others is tightened again, and still the same secret
    fs.chmodSync(file, 0o644);
    expect(ensure()).toBe(first);
    expect(fs.statSync(file).mode & 0o777).toBe(0o600);
    // deleting it rotates it
    fs.rmSync(file);
    expect(ensure()).not.toBe(first);
  });

  it("a secret given in the environment wins and nothing is written", () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-secret-"));
    const given = "given-secret-".padEnd(40, "z");
    const out = spawnSync(
      process.execPath,
      [
        "-e",
        `import("./scripts/services.mjs").then((m) => process.stdout.write(m.ensureAuthSecret({ dir: ${JSON.stringify(dir)}, env: { BETTER_AUTH_SECRET: ${JSON.stringify(given)} } })))`,
      ],
      { encoding: "utf8" },
    ).stdout;
    expect(out.trim().endsWith(given)).toBe(true);
    expect(fs.existsSync(path.join(dir, "auth-secret"))).toBe(false);
  });
});
