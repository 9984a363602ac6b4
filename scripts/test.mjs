// `npm test`: sets up what the tests need (Debian postgresql, chromium, ngspice, poppler-utils,
// haproxy; npm packages; a test PostgreSQL cluster and database; the mail stand-in), then runs
// typecheck, lint, unit, integration and browser tests, and the multi-server layer (two production
// servers behind haproxy). Its last line is the total over all layers: `N passed, N failed`.
import { spawnSync } from "node:child_process";
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { startCluster } from "./cluster.mjs";
import { ensureDebianPackages, ensureNpmPackages, ensurePostgres, log, root, startMaildev, startStripeStandin, stopAll } from "./services.mjs";

// TEST_SLOT=n lets several runs share the machine: each gets its own database, ports and build folder.
const SLOT = Number(process.env.TEST_SLOT ?? 0);
const PG_PORT = Number(process.env.TEST_PG_PORT ?? 54339);
const SMTP_PORT = 1125 + SLOT * 10;
const INBOX_PORT = 1180 + SLOT * 10;
const APP_PORT = 3100 + SLOT;
// the multi-server layer: haproxy, and two app servers behind it
const CLUSTER_PORT = 3400 + SLOT;
const CLUSTER_APP_PORTS = [3410 + 2 * SLOT, 3411 + 2 * SLOT];
const STRIPE_PORT = 12111 + 10 * (SLOT + 1);
const DB_NAME = SLOT ? `faradsmith_test_${SLOT}` : "faradsmith_test";
const DIST_DIR = SLOT ? `.next-slot-${SLOT}` : ".next";
const only = process.argv.slice(2); // e.g. `npm test -- unit integration`
const wants = (layer) => only.length === 0 || only.includes(layer);

const started = Date.now();
ensureDebianPackages(["postgresql", "chromium", "ngspice", "poppler-utils", "curl", "haproxy"]);
ensureNpmPackages();

const out = path.join(root, ".data", "test-results");
fs.mkdirSync(out, { recursive: true });

const pg = await ensurePostgres({ name: "pg-test", port: PG_PORT, fast: true });
// the app (and the tests' app code) connect as the role under row-level security; migrations,
// fixtures that work behind the app's back, and backups use the tables' owner
const { appUrl: databaseUrl, ownerUrl } = await pg.ensureDatabase(DB_NAME, { recreate: true });
const appUrl = `http://127.0.0.1:${APP_PORT}`;
const env = {
  ...process.env,
  NODE_ENV: undefined,
  DATABASE_URL: databaseUrl,
  MIGRATION_DATABASE_URL: ownerUrl,
  // the fault tests restart this cluster while requests are in flight
  TEST_PG_DATA_DIR: pg.dir,
  APP_URL: appUrl,
  BETTER_AUTH_URL: appUrl,
  // the browser tests run a production server, which refuses the development secret
  BETTER_AUTH_SECRET: process.env.BETTER_AUTH_SECRET ?? randomBytes(32).toString("base64url"),
  WEBHOOK_SECRET_KEY: process.env.WEBHOOK_SECRET_KEY ?? randomBytes(32).toString("base64url"),
  // the webhook tests' receivers listen on loopback; the production rule is tested on its own
  WEBHOOK_ALLOW_LOOPBACK: "true",
  APP_PORT: String(APP_PORT),
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(SMTP_PORT),
  MAIL_INBOX_URL: `http://127.0.0.1:${INBOX_PORT}`,
  AUTH_RATE_LIMIT_MAX: "1000",
  AUTH_SIGN_IN_LIMIT: "1000",
  API_RATE_LIMIT_PER_MINUTE: "100000",
  API_KEY_RATE_LIMIT_PER_MINUTE: "100000",
  UPLOAD_DIR: path.join(".data", `uploads-test-${SLOT}`),
  // The local Stripe stand-in; the key and webhook secret are lib/env.ts's fixed local values.
  STRIPE_API_BASE: `http://127.0.0.1:${STRIPE_PORT}`,
  // Test runs retry failed webhooks quickly: four attempts within about a second.
  STANDIN_WEBHOOK_MAX_ATTEMPTS: "4",
  STANDIN_WEBHOOK_RETRY_MS: "100",
  STANDIN_WEBHOOK_RETRY_MAX_MS: "1000",
  STANDIN_WEBHOOK_TIMEOUT_MS: "5000",
  NEXT_TELEMETRY_DISABLED: "1",
  NEXT_DIST_DIR: DIST_DIR,
  FORCE_COLOR: "0",
};
delete env.NODE_ENV;
// Tests always use lib/env.ts's fixed local Stripe key and webhook secret, whatever the shell has.
delete env.STRIPE_SECRET_KEY;
delete env.STRIPE_WEBHOOK_SECRET;

let passed = 0;
let failed = 0;
const summary = [];
const bin = (name) => path.join(root, "node_modules", ".bin", name);
function run(label, cmd, args, extraEnv = {}) {
  log(`— ${label}`);
  const t0 = Date.now();
  const r = spawnSync(cmd, args, { cwd: root, env: { ...env, ...extraEnv }, stdio: "inherit" });
  const seconds = ((Date.now() - t0) / 1000).toFixed(1);
  return { ok: r.status === 0, seconds };
}
function check(label, cmd, args) {
  const r = run(label, cmd, args);
  if (r.ok) passed += 1;
  else failed += 1;
  summary.push(`${label}: ${r.ok ? "ok" : "FAILED"} (${r.seconds} s)`);
}
function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, "utf8"));
  } catch {
    return null;
  }
}

try {
  const setup = run("migrations and demo data", bin("tsx"), ["scripts/db.ts", "setup"]);
  if (!setup.ok) {
    failed += 1;
    summary.push("database set-up: FAILED");
  }
  await startMaildev({ smtpPort: SMTP_PORT, webPort: INBOX_PORT, name: `maildev-test-${SLOT}` });
  await startStripeStandin({ apiBase: env.STRIPE_API_BASE, webhookUrl: `${appUrl}/api/webhooks/stripe`, env });

  if (wants("typecheck")) check("typecheck", bin("tsc"), ["--noEmit", "-p", "."]);
  if (wants("lint")) check("lint", bin("eslint"), [".", "--max-warnings=0"]);
  if (wants("lint")) check("format (prettier --check; npm run format fixes it)", bin("prettier"), ["--check", ".", "--log-level=warn"]);

  for (const project of ["unit", "integration"]) {
    if (!wants(project)) continue;
    const file = path.join(out, `vitest-${project}.json`);
    fs.rmSync(file, { force: true });
    const r = run(`${project} tests`, bin("vitest"), ["run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${file}`]);
    const j = readJson(file);
    const p = j?.numPassedTests ?? 0;
    // A file that fails to load has no failed test but fails the run: count it as one failure.
    const f = (j?.numFailedTests ?? 0) + (j == null || (!r.ok && (j?.numFailedTests ?? 0) === 0) ? 1 : 0);
    passed += p;
    failed += f;
    summary.push(`${project}: ${p} passed, ${f} failed (${r.seconds} s)`);
  }

  // a build into a slot's own folder adds that folder to tsconfig.json: put the file back afterwards
  const tsconfig = fs.readFileSync(path.join(root, "tsconfig.json"), "utf8");
  const build = wants("e2e") || wants("cluster") ? run("building the app for browser and multi-server tests", bin("next"), ["build"]) : null;
  fs.writeFileSync(path.join(root, "tsconfig.json"), tsconfig);
  if (build && !build.ok) {
    failed += 1;
    summary.push(`next build: FAILED (${build.seconds} s)`);
  }
  if (wants("e2e") && build?.ok) {
    const file = path.join(out, "playwright.json");
    fs.rmSync(file, { force: true });
    const r = run("browser tests", bin("playwright"), ["test", "--reporter=list,json"], { PLAYWRIGHT_JSON_OUTPUT_NAME: file });
    const j = readJson(file);
    const p = (j?.stats?.expected ?? 0) + (j?.stats?.flaky ?? 0);
    const f = (j?.stats?.unexpected ?? 0) + (j == null || (!r.ok && (j?.stats?.unexpected ?? 0) === 0) ? 1 : 0);
    passed += p;
    failed += f;
    summary.push(`browser: ${p} passed, ${f} failed (${r.seconds} s, build ${build.seconds} s)`);
  }
  if (wants("cluster") && build?.ok) {
    // two production servers behind haproxy on the test database; a low API limit so that sharing it shows
    const lbUrl = `http://127.0.0.1:${CLUSTER_PORT}`;
    const t0 = Date.now();
    let cluster = null;
    try {
      cluster = await startCluster({
        env: { ...env, APP_URL: lbUrl, BETTER_AUTH_URL: lbUrl, API_RATE_LIMIT_PER_MINUTE: "30" },
        lbPort: CLUSTER_PORT,
        appPorts: CLUSTER_APP_PORTS,
      });
    } catch (error) {
      log(`the multi-server layer could not start: ${error.message}`);
    }
    if (!cluster) {
      failed += 1;
      summary.push("multi-server: FAILED to start");
    } else {
      const file = path.join(out, "vitest-cluster.json");
      fs.rmSync(file, { force: true });
      const r = run(
        "multi-server tests",
        bin("vitest"),
        ["run", "--project", "cluster", "--reporter=default", "--reporter=json", `--outputFile.json=${file}`],
        {
          CLUSTER_URL: cluster.url,
          CLUSTER_SERVERS: cluster.servers.join(","),
        },
      );
      const j = readJson(file);
      const p = j?.numPassedTests ?? 0;
      const f = (j?.numFailedTests ?? 0) + (j == null || (!r.ok && (j?.numFailedTests ?? 0) === 0) ? 1 : 0);
      passed += p;
      failed += f;
      summary.push(`multi-server: ${p} passed, ${f} failed (${((Date.now() - t0) / 1000).toFixed(1)} s with start-up)`);
    }
  }
} finally {
  stopAll();
  if (!SLOT) pg.stop();
}

log(`summary after ${((Date.now() - started) / 1000).toFixed(0)} s:`);
for (const line of summary) log(`  ${line}`);
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
