// `npm run bench`: prints speed figures (never a pass/fail test). Engine figures come from
// tests/bench/engine-bench.ts; the HTTP figures from autocannon against the production server
// (scripts/serve.mjs) on loopback, with PostgreSQL and the demo data set up as `npm start` does, in a
// database of its own: /api/health, the public arrangements endpoint (one requirement repeated, as
// a client polling would send it, and a different requirement on every request) and the 72-cell
// evaluation, at 20 connections for 15 s each, taken in five interleaved rounds of 3 s so that the
// machine's other work weighs on each alike (the ratio to /api/health is the median of the rounds'
// ratios) (the API limit is raised for the bench client; the
// limiter still counts in PostgreSQL, a lease at a time), 50 quotes made at once through
// the storefront's server action (numbers checked gap-free), the arrangements endpoint through two
// servers behind haproxy, and the storefront journey in headless Chromium.
//   npm run bench [-- --profile] [-- --reuse-build] [-- --http] [-- --quick]
// --http skips the engine, PDF and browser figures; --quick also runs each load for 5 s only.
// --pages prints only the page-speed figures (Lighthouse, mobile and desktop profiles, median of
// three, against the production build) and each route's first-load JavaScript; --mobile leaves out
// the desktop column.
// --profile also runs one server under `node --cpu-prof` while the arrangements endpoint is under
// load (a new requirement every request) and prints where its CPU time went. Ports: BENCH_PORT or BENCH_APP_PORT (3200; the haproxy run uses the
// next three), BENCH_PG_PORT (54339).
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import autocannon from "autocannon";
import { startCluster } from "./cluster.mjs";
import { arrangements, chooseCheapest, gapFree, percentile, serverActionIds, signIn } from "./http-client.mjs";
import { ensureDebianPackages, ensureNpmPackages, ensurePostgres, log, root, spawnService, stopAll, waitForPort } from "./services.mjs";

const APP_PORT = Number(process.env.BENCH_PORT ?? process.env.BENCH_APP_PORT ?? 3200);
const PG_PORT = Number(process.env.BENCH_PG_PORT ?? 54339);
// a build folder of its own (".next-slot-*" is ignored everywhere a build folder must be)
const DIST_DIR = ".next-slot-bench";
const args = process.argv.slice(2);
const quick = args.includes("--quick");
const httpOnly = quick || args.includes("--http");
const onlyPages = args.includes("--pages");
const DURATION = quick ? 5 : 15;
const CONNECTIONS = 20;
const SHOP = "kestrel-bank-works";
const REQUIREMENT = { maxVoltage: 48, minVoltage: 24, energy: 20_000 };
const bin = (name) => path.join(root, "node_modules", ".bin", name);

ensureDebianPackages(["postgresql", "chromium", "haproxy"]);
ensureNpmPackages();

if (!httpOnly && !onlyPages) {
  log("engine");
  const engine = spawnSync(bin("tsx"), ["tests/bench/engine-bench.ts"], { cwd: root, stdio: "inherit" });
  if (engine.status !== 0) process.exit(engine.status ?? 1);
  log("custom bank (network editor)");
  const custom = spawnSync(bin("tsx"), ["tests/bench/custom-bank-bench.ts"], { cwd: root, stdio: "inherit" });
  if (custom.status !== 0) process.exit(custom.status ?? 1);
  log("quote PDF");
  const pdf = spawnSync(bin("tsx"), ["tests/bench/pdf-bench.ts"], { cwd: root, stdio: "inherit" });
  if (pdf.status !== 0) process.exit(pdf.status ?? 1);
}

const pg = await ensurePostgres({ name: "pg-test", port: PG_PORT, fast: true });
const { appUrl: databaseUrl, ownerUrl } = await pg.ensureDatabase("faradsmith_bench", { recreate: true });
const appUrl = `http://127.0.0.1:${APP_PORT}`;
const env = {
  ...process.env,
  DATABASE_URL: databaseUrl,
  APP_URL: appUrl,
  BETTER_AUTH_URL: appUrl,
  BETTER_AUTH_SECRET: randomBytes(32).toString("base64url"),
  WEBHOOK_SECRET_KEY: randomBytes(32).toString("base64url"),
  // the limiter runs on every request, with a limit the bench never reaches
  API_RATE_LIMIT_PER_MINUTE: "100000000",
  AUTH_SIGN_IN_LIMIT: "1000",
  AUTH_RATE_LIMIT_MAX: "1000",
  MAIL_WORKER: "off" /* the bench server sends no e-mail */,
  PAYMENTS_WORKER: "off" /* and talks to no payment service */,
  NEXT_TELEMETRY_DISABLED: "1",
  NEXT_DIST_DIR: DIST_DIR,
};
delete env.NODE_ENV;

const line = (label, r) =>
  `${label.padEnd(44)} ${r.requests.average.toFixed(0).padStart(6)} req/s   p50 ${String(r.latency.p50).padStart(4)} ms   p99 ${String(r.latency.p99).padStart(5)} ms   errors ${r.errors + r.timeouts + r.non2xx}`;

/** autocannon at CONNECTIONS for `seconds` after a short warm-up of the same load. */
async function load(url, { method = "GET", body, vary } = {}, seconds = DURATION) {
  const opts = { url, method, connections: CONNECTIONS, headers: body || vary ? { "content-type": "application/json" } : {}, body };
  if (vary) {
    let i = 0;
    opts.requests = [{ setupRequest: (req) => ({ ...req, body: JSON.stringify(vary(i++)) }) }];
  }
  await autocannon({ ...opts, duration: 2 });
  return autocannon({ ...opts, duration: seconds });
}

/**
 * Several loads measured in interleaved rounds (each load `rounds` times for DURATION / rounds
 * seconds): requests per second is the mean over its rounds, p50 the median round's, p99 the worst
 * round's, errors the sum.
 */
async function interleaved(loads, rounds = quick ? 1 : 5) {
  const runs = Object.fromEntries(Object.keys(loads).map((k) => [k, []]));
  for (let r = 0; r < rounds; r++) for (const [k, l] of Object.entries(loads)) runs[k].push(await load(l.url, l, DURATION / rounds));
  return Object.fromEntries(
    Object.entries(runs).map(([k, rs]) => {
      const p50s = rs.map((x) => x.latency.p50).sort((a, b) => a - b);
      return [
        k,
        {
          requests: { average: rs.reduce((a, x) => a + x.requests.average, 0) / rs.length },
          latency: { p50: p50s[Math.floor(p50s.length / 2)], p99: Math.max(...rs.map((x) => x.latency.p99)) },
          errors: rs.reduce((a, x) => a + x.errors, 0),
          timeouts: rs.reduce((a, x) => a + x.timeouts, 0),
          non2xx: rs.reduce((a, x) => a + x.non2xx, 0),
          rounds: rs.map((x) => x.requests.average),
        },
      ];
    }),
  );
}

const evaluateBody = JSON.stringify({
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
});

function startServer(port, extraArgs = [], extraEnv = {}) {
  return spawnService(`app ${port}`, process.execPath, [...extraArgs, "scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...env, ...extraEnv },
    stdio: ["ignore", "ignore", "inherit"],
  });
}

/** Self time per place in a V8 CPU profile: our code by file, packages by name, the rest by kind. */
function summarizeProfile(file) {
  const profile = JSON.parse(fs.readFileSync(file, "utf8"));
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const interval = profile.timeDeltas.reduce((a, b) => a + b, 0) / profile.samples.length / 1000;
  const buckets = new Map();
  for (const id of profile.samples) {
    const { url, functionName } = byId.get(id).callFrame;
    const pkg = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url)?.[1];
    const place = pkg ? `package ${pkg}` : url ? `${url.replace(/^.*\/(server\/chunks\/)/, "app chunk ").slice(0, 70)}` : functionName || "(native)";
    buckets.set(place, (buckets.get(place) ?? 0) + interval);
  }
  const total = [...buckets.values()].reduce((a, b) => a + b, 0);
  return [...buckets.entries()]
    .sort((a, b) => b[1] - a[1])
    .slice(0, 15)
    .map(([place, ms]) => `  ${ms.toFixed(0).padStart(7)} ms  ${((100 * ms) / total).toFixed(1).padStart(5)} %  ${place}`);
}

try {
  const setup = spawnSync(bin("tsx"), ["scripts/db.ts", "setup"], { cwd: root, env: { ...env, MIGRATION_DATABASE_URL: ownerUrl }, stdio: "inherit" });
  if (setup.status !== 0) throw new Error("database set-up failed");
  if (!fs.existsSync(path.join(root, DIST_DIR, "BUILD_ID")) || !args.includes("--reuse-build")) {
    log("building the app");
    // a build into a folder of its own adds that folder to tsconfig.json: put the file back afterwards
    const tsconfig = fs.readFileSync(path.join(root, "tsconfig.json"), "utf8");
    const b = spawnSync(bin("next"), ["build"], { cwd: root, env, stdio: "inherit" });
    fs.writeFileSync(path.join(root, "tsconfig.json"), tsconfig);
    if (b.status !== 0) throw new Error("next build failed");
  }
  startServer(APP_PORT);
  await waitForPort(APP_PORT, "the app", 120_000);
  await fetch(`${appUrl}/api/health`);

  if (!onlyPages) {
    log(`one server, ${CONNECTIONS} connections, ${DURATION} s each, loopback (${os.cpus().length} cores, load average ${os.loadavg()[0].toFixed(1)})`);
    const arrangementsUrl = `${appUrl}/api/v1/shops/${SHOP}/arrangements`;
    const r = await interleaved({
      health: { url: `${appUrl}/api/health` },
      arrangements: { url: arrangementsUrl, method: "POST", body: JSON.stringify(REQUIREMENT) },
      // 40.00 V to 59.99 V by hundredths: every request a requirement not searched before
      varied: { url: arrangementsUrl, method: "POST", vary: (i) => ({ ...REQUIREMENT, maxVoltage: 40 + (i % 2000) / 100 }) },
      evaluate: { url: `${appUrl}/api/v1/networks/evaluate`, method: "POST", body: evaluateBody },
    });
    console.log(line("GET /api/health (framework + one query)", r.health));
    console.log(line("POST /api/v1/shops/{shop}/arrangements", r.arrangements));
    // each round's two figures were taken a few seconds apart: the median of their ratios
    const ratioOf = (a, b) => {
      const rs = a.rounds.map((x, i) => x / b.rounds[i]).sort((p, q) => p - q);
      return rs[Math.floor(rs.length / 2)];
    };
    const ratio = ratioOf(r.arrangements, r.health);
    console.log(`  arrangements / health = ${ratio.toFixed(2)} (median of the rounds) — target at least 0.5: ${ratio >= 0.5 ? "holds" : "MISSED"}`);
    console.log(line("  … a new requirement every request", r.varied));
    console.log(`  new requirements / health = ${ratioOf(r.varied, r.health).toFixed(2)} (median of the rounds)`);
    console.log(line("POST /api/v1/networks/evaluate (72 cells)", r.evaluate));

    log("50 quotes made at once (storefront server action over HTTP, one customer)");
    const actionId = serverActionIds(path.join(root, DIST_DIR)).chooseArrangement;
    // a demo customer of the shop (README, "Demo sign-ins")
    const cookie = await signIn(appUrl, "renske.haddow@tollmere-tramways.example", "faradsmith-demo-2026");
    const option = (await arrangements(appUrl, SHOP, REQUIREMENT)).body.options[0];
    const t0 = performance.now();
    const made = await Promise.all(
      Array.from({ length: 50 }, async () => {
        const s = performance.now();
        const r = await chooseCheapest(appUrl, { shop: SHOP, actionId, cookie, requirement: { ...REQUIREMENT, quantity: 1 }, option });
        return { ms: performance.now() - s, number: r.ok && r.data.kind === "quote" ? r.data.quoteNumber : null };
      }),
    );
    const wall = performance.now() - t0;
    const times = made.map((m) => m.ms).sort((a, b) => a - b);
    const numbers = made.map((m) => m.number).filter(Boolean);
    console.log(
      `50 concurrent quote creations: ${wall.toFixed(0)} ms in all (${((50 * 1000) / wall).toFixed(1)} quotes/s), each p50 ${percentile(times, 50).toFixed(0)} ms, p99 ${percentile(times, 99).toFixed(0)} ms; ${numbers.length} quotes, numbers ${numbers.length === 50 && gapFree(numbers) ? "unique and gap-free" : "NOT gap-free"} (${[...numbers].sort()[0]} … ${[...numbers].sort().at(-1)})`,
    );

    if (args.includes("--profile")) {
      log("profile: one more server under node --cpu-prof, arrangements endpoint under load");
      const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-profile-"));
      const port = APP_PORT + 4;
      const child = startServer(port, ["--cpu-prof", `--cpu-prof-dir=${dir}`]);
      await waitForPort(port, "the profiled app", 120_000);
      // a new requirement every request: the search itself, not the memory of it
      const r = await load(
        `http://127.0.0.1:${port}/api/v1/shops/${SHOP}/arrangements`,
        { method: "POST", vary: (i) => ({ ...REQUIREMENT, maxVoltage: 40 + (i % 2000) / 100 }) },
        10,
      );
      console.log(line("arrangements (new requirements) under the profiler", r));
      const exited = new Promise((resolve) => child.once("exit", resolve));
      process.kill(-child.pid, "SIGINT");
      await exited;
      const file = fs.readdirSync(dir).find((f) => f.endsWith(".cpuprofile"));
      if (file) {
        console.log(`where its CPU time went (self time; the profile is ${path.join(dir, file)}):`);
        for (const l of summarizeProfile(path.join(dir, file))) console.log(l);
      }
    }

    log("two servers behind haproxy (same database, same machine)");
    const lbPort = APP_PORT + 1;
    const lbUrl = `http://127.0.0.1:${lbPort}`;
    await startCluster({ env: { ...env, APP_URL: lbUrl, BETTER_AUTH_URL: lbUrl }, lbPort, appPorts: [APP_PORT + 2, APP_PORT + 3], label: "bench-app" });
    const lb = await interleaved({
      health: { url: `${lbUrl}/api/health` },
      arrangements: { url: `${lbUrl}/api/v1/shops/${SHOP}/arrangements`, method: "POST", body: JSON.stringify(REQUIREMENT) },
      varied: { url: `${lbUrl}/api/v1/shops/${SHOP}/arrangements`, method: "POST", vary: (i) => ({ ...REQUIREMENT, maxVoltage: 60 - (i % 2000) / 100 }) },
    });
    console.log(line("GET /api/health via haproxy, 2 servers", lb.health));
    console.log(line("POST arrangements via haproxy, 2 servers", lb.arrangements));
    console.log(line("  … a new requirement every request", lb.varied));
  }

  if (!httpOnly && !onlyPages) {
    log("storefront: submitting the request form to options on screen, headless Chromium");
    const { runJourneyBench } = await import(path.join(root, "tests", "bench", "journey-bench.mjs"));
    await runJourneyBench({ appUrl, databaseUrl, root });
  }
  if (!httpOnly) {
    log("page speed: Lighthouse, mobile and desktop profiles, against the production build");
    const { runPageBench } = await import(path.join(root, "tests", "bench", "page-bench.mjs"));
    await runPageBench({ appUrl, root, env, desktop: !args.includes("--mobile") });
    log("first-load JavaScript per route (this build)");
    const { routeScripts, printRouteScripts } = await import(path.join(root, "scripts", "route-js.mjs"));
    printRouteScripts(routeScripts({ distDir: DIST_DIR }).filter((r) => r.route === "/" || r.route.startsWith("/s/")));
  }
} finally {
  stopAll();
  pg.stop();
}
