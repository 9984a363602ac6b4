// `npm run bench`: prints speed figures (never a pass/fail test). Engine figures come from
// tests/bench/engine-bench.ts; the HTTP figures from autocannon against `next start` on loopback,
// with PostgreSQL and the demo data set up as `npm start` does, in a database of its own.
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import autocannon from "autocannon";
import { ensureDebianPackages, ensureNpmPackages, ensurePostgres, log, root, spawnService, stopAll, waitForPort } from "./services.mjs";

// Ports can be moved (several checkouts on one machine); PostgreSQL shares the test cluster's folder.
const APP_PORT = Number(process.env.BENCH_PORT ?? 3200);
const PG_PORT = Number(process.env.BENCH_PG_PORT ?? process.env.TEST_PG_PORT ?? 54339);
// `npm run bench -- --pages`: only the page-speed figures (Lighthouse), not the engine and HTTP ones
// (`--mobile` leaves out the desktop column of the page figures)
const onlyPages = process.argv.includes("--pages");
const bin = (name) => path.join(root, "node_modules", ".bin", name);

ensureDebianPackages(["postgresql", "chromium"]);
ensureNpmPackages();

if (!onlyPages) {
  log("engine");
  const engine = spawnSync(bin("tsx"), ["tests/bench/engine-bench.ts"], { cwd: root, stdio: "inherit" });
  if (engine.status !== 0) process.exit(engine.status ?? 1);
  log("quote PDF");
  const pdf = spawnSync(bin("tsx"), ["tests/bench/pdf-bench.ts"], { cwd: root, stdio: "inherit" });
  if (pdf.status !== 0) process.exit(pdf.status ?? 1);
}

const pg = await ensurePostgres({ name: "pg-test", port: PG_PORT, fast: true });
const databaseUrl = await pg.ensureDatabase("faradsmith_bench", { recreate: true });
const appUrl = `http://127.0.0.1:${APP_PORT}`;
const env = {
  ...process.env,
  DATABASE_URL: databaseUrl,
  APP_URL: appUrl,
  BETTER_AUTH_URL: appUrl,
  BETTER_AUTH_SECRET: randomBytes(32).toString("base64url"),
  WEBHOOK_SECRET_KEY: randomBytes(32).toString("base64url"),
  API_RATE_LIMIT_PER_MINUTE: "10000000",
  MAIL_WORKER: "off" /* the bench server sends no e-mail */,
  NEXT_TELEMETRY_DISABLED: "1",
};
try {
  const setup = spawnSync(bin("tsx"), ["scripts/db.ts", "setup"], { cwd: root, env, stdio: "inherit" });
  if (setup.status !== 0) throw new Error("database set-up failed");
  if (!fs.existsSync(path.join(root, ".next", "BUILD_ID")) || process.argv.includes("--build")) {
    log("building the app");
    const b = spawnSync(bin("next"), ["build"], { cwd: root, env, stdio: "inherit" });
    if (b.status !== 0) throw new Error("next build failed");
  }
  spawnService("next start", process.execPath, ["scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(APP_PORT)], {
    env,
    stdio: ["ignore", "ignore", "inherit"],
  });
  await waitForPort(APP_PORT, "the app", 120_000);
  await fetch(`${appUrl}/api/health`);

  if (!onlyPages) {
    const network = {
      appliedVoltage: 48,
      network: {
        kind: "series",
        children: Array.from({ length: 18 }, (_, g) => ({
          kind: "parallel",
          children: Array.from({ length: 4 }, (_, i) => ({
            kind: "cell",
            id: `g${g}c${i}`,
            capacitance: 3000 * (1 + 0.002 * ((g + i) % 5)),
            ratedVoltage: 2.7,
            esr: 0.00029,
          })),
        })),
      },
    };
    const body = JSON.stringify(network);
    // warm-up: 3 s of the same load, so the figures are of a warm server
    await autocannon({
      url: `${appUrl}/api/v1/networks/evaluate`,
      method: "POST",
      headers: { "content-type": "application/json" },
      body,
      connections: 50,
      duration: 3,
    });
    const base = await autocannon({ url: `${appUrl}/api/health`, connections: 50, duration: 5 });
    console.log(
      `baseline GET /api/health (framework + one query): ${base.requests.average.toFixed(0)} req/s, median ${base.latency.p50} ms, p99 ${base.latency.p99} ms`,
    );
    log("POST /api/v1/networks/evaluate under autocannon: 50 connections, 10 s, loopback");
    const r = await autocannon({
      url: `${appUrl}/api/v1/networks/evaluate`,
      method: "POST",
      headers: { "content-type": "application/json" },
      body,
      connections: 50,
      duration: 10,
    });
    const errors = r.errors + r.timeouts + r.non2xx;
    console.log(
      `evaluate endpoint: ${r.requests.average.toFixed(0)} req/s, latency median ${r.latency.p50} ms, p95 ${r.latency.p97_5 ?? r.latency.p99} ms (p97.5), p99 ${r.latency.p99} ms, errors ${errors} — target p99 < 50 ms with no errors: ${r.latency.p99 < 50 && errors === 0 ? "holds" : "MISSED"}`,
    );

    log("storefront: submitting the request form to options on screen, headless Chromium");
    const { runJourneyBench } = await import(path.join(root, "tests", "bench", "journey-bench.mjs"));
    await runJourneyBench({ appUrl, databaseUrl, root });
  }
  log("page speed: Lighthouse, mobile and desktop profiles, against the production build");
  const { runPageBench } = await import(path.join(root, "tests", "bench", "page-bench.mjs"));
  await runPageBench({ appUrl, root, env, desktop: !process.argv.includes("--mobile") });
  log("first-load JavaScript per route (this build)");
  const { routeScripts, printRouteScripts } = await import(path.join(root, "scripts", "route-js.mjs"));
  printRouteScripts(routeScripts().filter((r) => r.route === "/" || r.route.startsWith("/s/")));
} finally {
  stopAll();
  pg.stop();
}
