// The JavaScript each route loads before it can run (Next.js's runtime plus the route's own client
// components, without lazy chunks), from the build's own `diagnostics/route-bundle-stats.json`,
// with the compressed size added: under Turbopack `next build` no longer prints these figures.
//   node scripts/route-js.mjs [route prefix]    e.g. node scripts/route-js.mjs /s/
// Used by `npm run bench`; NEXT_DIST_DIR picks another build folder.
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { gzipSync } from "node:zlib";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** @returns {{ route: string, files: number, bytes: number, gzipBytes: number }[]} */
export function routeScripts({ distDir = process.env.NEXT_DIST_DIR || ".next", prefix = "" } = {}) {
  const stats = JSON.parse(fs.readFileSync(path.join(root, distDir, "diagnostics", "route-bundle-stats.json"), "utf8"));
  const gzipped = new Map();
  const gzipOf = (file) => {
    if (!gzipped.has(file))
      gzipped.set(file, gzipSync(fs.readFileSync(path.join(root, distDir, file.replace(/^.*?\/static\//, "static/"))), { level: 9 }).length);
    return gzipped.get(file);
  };
  return stats
    .filter((r) => r.route.startsWith(prefix))
    .map((r) => ({
      route: r.route,
      files: r.firstLoadChunkPaths.length,
      bytes: r.firstLoadUncompressedJsBytes,
      gzipBytes: r.firstLoadChunkPaths.reduce((sum, f) => sum + gzipOf(f), 0),
    }))
    .sort((a, b) => a.route.localeCompare(b.route));
}

export function printRouteScripts(rows) {
  const kib = (n) => `${(n / 1024).toFixed(1)} KiB`;
  const width = Math.max(5, ...rows.map((r) => r.route.length));
  console.log(`${"route".padEnd(width)}  ${"first-load JS".padStart(13)}  ${"gzip".padStart(10)}  chunks`);
  for (const r of rows) console.log(`${r.route.padEnd(width)}  ${kib(r.bytes).padStart(13)}  ${kib(r.gzipBytes).padStart(10)}  ${r.files}`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  printRouteScripts(routeScripts({ prefix: process.argv[2] ?? "" }));
}
