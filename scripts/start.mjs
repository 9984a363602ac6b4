// `npm start`: installs what is missing, starts PostgreSQL and the mail stand-in on loopback,
// migrates, loads the demo data into an empty database, builds and serves the app on
// http://127.0.0.1:3000. `npm run dev` does the same with hot reload instead of a build.
// `npm run cluster` (--cluster) serves it from two production servers behind haproxy on the same
// address (the servers on PORT+10 and PORT+11, or CLUSTER_APP_PORTS). Ctrl-C stops everything this
// command started.
import { spawnSync } from "node:child_process";
import path from "node:path";
import {
  ensureAuthSecret,
  ensureWebhookKey,
  ensureDebianPackages,
  ensureNpmPackages,
  ensurePostgres,
  log,
  portOpen,
  root,
  spawnService,
  startMaildev,
  startStripeStandin,
  stopAll,
  waitForPort,
} from "./services.mjs";

const dev = process.argv.includes("--dev");
const cluster = process.argv.includes("--cluster");
const PORT = Number(process.env.PORT ?? 3000);
// Ports can be moved (two checkouts on one machine); the defaults are the README's.
const PG_PORT = Number(process.env.START_PG_PORT ?? 54329);
const SMTP_PORT = Number(process.env.START_SMTP_PORT ?? 1025);
const INBOX_PORT = Number(process.env.START_INBOX_PORT ?? 1080);
const STRIPE_PORT = Number(process.env.START_STRIPE_PORT ?? 12111);

if (await portOpen(PORT)) {
  log(`port ${PORT} is already in use (another Faradsmith still running?); stop it or set PORT=…`);
  process.exit(1);
}

ensureDebianPackages(cluster ? ["postgresql", "haproxy"] : ["postgresql"]);
ensureNpmPackages();

const pg = await ensurePostgres({ name: "pg", port: PG_PORT });
// the app connects as a role under row-level security; migrations run as the tables' owner
const { appUrl: databaseUrl, ownerUrl } = await pg.ensureDatabase("faradsmith");
const appUrl = `http://127.0.0.1:${PORT}`;
const env = {
  ...process.env,
  DATABASE_URL: databaseUrl,
  APP_URL: appUrl,
  BETTER_AUTH_URL: appUrl,
  BETTER_AUTH_SECRET: ensureAuthSecret(),
  WEBHOOK_SECRET_KEY: ensureWebhookKey(),
  // endpoints on this machine (a receiver you run yourself) are allowed locally; set "false" to try the production rule
  WEBHOOK_ALLOW_LOOPBACK: process.env.WEBHOOK_ALLOW_LOOPBACK ?? "true",
  SMTP_HOST: "127.0.0.1",
  SMTP_PORT: String(SMTP_PORT),
  MAIL_INBOX_URL: `http://127.0.0.1:${INBOX_PORT}`,
  // The local Stripe stand-in unless STRIPE_API_BASE is set (to the real service, for example).
  STRIPE_API_BASE: process.env.STRIPE_API_BASE ?? `http://127.0.0.1:${STRIPE_PORT}`,
  NEXT_TELEMETRY_DISABLED: "1",
};

let shuttingDown = false;
function shutdown(code = 0) {
  if (shuttingDown) return;
  shuttingDown = true;
  log("stopping");
  stopAll();
  setTimeout(() => {
    pg.stop();
    process.exit(code);
  }, 500);
}
process.on("SIGINT", () => shutdown(0));
process.on("SIGTERM", () => shutdown(0));

const bin = (name) => path.join(root, "node_modules", ".bin", name);
const step = (label, cmd, args, extraEnv = {}) => {
  log(label);
  const r = spawnSync(cmd, args, { cwd: root, env: { ...env, ...extraEnv }, stdio: "inherit" });
  if (r.status !== 0) {
    log(`${label} failed`);
    shutdown(1);
    return false;
  }
  return true;
};

// only this step holds the owner's URL; the app's processes never see it
if (step("applying migrations and demo data", bin("tsx"), ["scripts/db.ts", "setup"], { MIGRATION_DATABASE_URL: ownerUrl })) {
  await startMaildev({ smtpPort: SMTP_PORT, webPort: INBOX_PORT, name: "maildev" });
  await startStripeStandin({ apiBase: env.STRIPE_API_BASE, webhookUrl: `${appUrl}/api/webhooks/stripe`, env });
  if (dev) {
    spawnService("next dev", bin("next"), ["dev", "-H", "127.0.0.1", "-p", String(PORT)], { env, onExit: () => shutdown(0) });
  } else if (step("building the app", bin("next"), ["build"])) {
    if (cluster) {
      const appPorts = (process.env.CLUSTER_APP_PORTS ?? `${PORT + 10},${PORT + 11}`).split(",").map(Number);
      const { startCluster } = await import("./cluster.mjs");
      await startCluster({ env, lbPort: PORT, appPorts }).catch((error) => {
        log(`the servers did not start: ${error.message}`);
        shutdown(1);
      });
    } else {
      spawnService("next start", process.execPath, ["scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(PORT)], { env, onExit: () => shutdown(0) });
    }
  }
  if (!shuttingDown) {
    await waitForPort(PORT, "the app", 180_000);
    const { demoSignIns } = await import("./demo-sign-ins.mjs");
    log(`Faradsmith is running at ${appUrl}`);
    log(`mail inbox (local stand-in): http://127.0.0.1:${INBOX_PORT}`);
    log(`payments: ${env.STRIPE_API_BASE}${env.STRIPE_API_BASE.startsWith("http://127.0.0.1") ? " (local Stripe stand-in, test cards only)" : ""}`);
    log("demo sign-ins (password for all: see README):");
    for (const line of demoSignIns()) log(`  ${line}`);
    log("press Ctrl-C to stop");
  }
}
