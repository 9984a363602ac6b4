// Helpers shared by the start and test commands: Debian packages, npm packages, a project-local
// PostgreSQL cluster on 127.0.0.1, the mail stand-in. Plain Node (no TypeScript) so it runs
// before anything is installed.
import { spawn, spawnSync } from "node:child_process";
import { createHash, randomBytes } from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

export function log(message) {
  process.stdout.write(`[faradsmith] ${message}\n`);
}

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: opts.quiet ? "pipe" : "inherit", encoding: "utf8", ...opts });
  if (r.status !== 0 && !opts.allowFail) {
    const out = opts.quiet ? `\n${r.stdout ?? ""}${r.stderr ?? ""}` : "";
    throw new Error(`${cmd} ${args.join(" ")} exited with ${r.status}${out}`);
  }
  return r;
}

/** Installs Debian packages that are missing; with sudo when not root. */
export function ensureDebianPackages(packages) {
  const missing = packages.filter((p) => {
    const r = spawnSync("dpkg-query", ["-W", "-f=${Status}", p], { encoding: "utf8" });
    return r.status !== 0 || !r.stdout.includes("install ok installed");
  });
  if (missing.length === 0) return;
  log(`installing Debian packages${isRoot ? "" : " with sudo"}: ${missing.join(", ")}`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  const apt = (args) => (isRoot ? run("apt-get", args, { env }) : run("sudo", ["-E", "apt-get", ...args], { env }));
  apt(["update", "-qq"]);
  apt(["install", "-y", "-qq", "--no-install-recommends", ...missing]);
}

/** Runs `npm ci` (or install) when node_modules is missing or older than the lock file. */
export function ensureNpmPackages() {
  const lock = path.join(root, "package-lock.json");
  const stamp = path.join(root, "node_modules", ".package-lock.json");
  const fresh = fs.existsSync(stamp) && fs.existsSync(lock) && fs.statSync(stamp).mtimeMs >= fs.statSync(lock).mtimeMs;
  if (fresh) return;
  log("installing npm packages");
  run("npm", [fs.existsSync(lock) ? "ci" : "install", "--no-audit", "--no-fund"], { cwd: root });
}

export function pgBin() {
  const base = "/usr/lib/postgresql";
  const versions = fs.existsSync(base) ? fs.readdirSync(base).sort((a, b) => Number(b) - Number(a)) : [];
  for (const v of versions) {
    const bin = path.join(base, v, "bin");
    if (fs.existsSync(path.join(bin, "initdb"))) return bin;
  }
  throw new Error("PostgreSQL server binaries not found under /usr/lib/postgresql");
}

/** Where a cluster lives: inside .data/ for a normal user; for root a folder the postgres user can enter. */
export function dataDir(name) {
  if (!isRoot) return path.join(root, ".data", name);
  const hash = createHash("sha1").update(root).digest("hex").slice(0, 10);
  return path.join("/var/tmp", `faradsmith-${hash}`, name);
}

function asPostgres(args, opts = {}) {
  return isRoot ? run("runuser", ["-u", "postgres", "--", ...args], opts) : run(args[0], args.slice(1), opts);
}

export function portOpen(port, host = "127.0.0.1") {
  return new Promise((resolve) => {
    const s = net.connect({ port, host });
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

export async function waitForPort(port, label, timeoutMs = 60_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (await portOpen(port)) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${label} did not open port ${port} within ${timeoutMs / 1000} s`);
}

/**
 * Starts (or reuses) a project-local PostgreSQL cluster on 127.0.0.1:port with the migration role
 * (`faradsmith`, may create databases) and the app's role (`faradsmith_app`). Returns a stop
 * function that stops it only if we started it.
 */
export async function ensurePostgres({ name, port, fast = false }) {
  const bin = pgBin();
  const dir = dataDir(name);
  fs.mkdirSync(path.dirname(dir), { recursive: true });
  if (isRoot) {
    fs.chmodSync(path.dirname(dir), 0o755);
  }
  if (!fs.existsSync(path.join(dir, "PG_VERSION"))) {
    log(`creating PostgreSQL cluster in ${dir}`);
    fs.mkdirSync(dir, { recursive: true });
    if (isRoot) run("chown", ["-R", "postgres:postgres", dir]);
    fs.chmodSync(dir, 0o700);
    asPostgres([path.join(bin, "initdb"), "-D", dir, "-U", "postgres", "--auth=trust", "-E", "UTF8", "--locale=C.UTF-8"], { quiet: true });
  }
  const status = asPostgres([path.join(bin, "pg_ctl"), "-D", dir, "status"], { quiet: true, allowFail: true });
  let started = false;
  if (status.status !== 0) {
    const opts = [`-p ${port}`, "-c listen_addresses=127.0.0.1", "-c unix_socket_directories=''", "-c max_connections=200"];
    if (fast) opts.push("-c fsync=off", "-c synchronous_commit=off", "-c full_page_writes=off");
    const logFile = path.join(dir, "server.log");
    asPostgres([path.join(bin, "pg_ctl"), "-D", dir, "-l", logFile, "-o", opts.join(" "), "-w", "-t", "60", "start"], { quiet: true });
    started = true;
  }
  await waitForPort(port, "PostgreSQL");
  const psql = (sql, db = "postgres") =>
    run("psql", ["-h", "127.0.0.1", "-p", String(port), "-U", "postgres", "-d", db, "-v", "ON_ERROR_STOP=1", "-tAc", sql], { quiet: true });
  ensureRoles(psql);
  return {
    dir,
    psql,
    /** Creates (or recreates) a database owned by the migration role; answers both roles' URLs for it. */
    async ensureDatabase(db, { recreate = false } = {}) {
      const exists = psql(`SELECT 1 FROM pg_database WHERE datname = '${db}'`).stdout.trim() === "1";
      if (exists && recreate) psql(`DROP DATABASE "${db}" WITH (FORCE)`);
      if (!exists || recreate) psql(`CREATE DATABASE "${db}" OWNER ${OWNER_ROLE}`);
      return databaseUrls(port, db);
    },
    stop() {
      if (!started) return;
      asPostgres([path.join(bin, "pg_ctl"), "-D", dir, "-m", "fast", "stop"], { quiet: true, allowFail: true });
    },
  };
}

/**
 * The two database roles (README, "Database roles"): the migration role owns the tables, runs
 * migrations, the demo data and backups, and bypasses row-level security; the app's role reads and
 * writes rows only, under the policies. Local clusters trust loopback connections (no passwords).
 */
export const OWNER_ROLE = "faradsmith";
export const APP_ROLE = "faradsmith_app";

function ensureRoles(psql) {
  const has = (role) => psql(`SELECT 1 FROM pg_roles WHERE rolname = '${role}'`).stdout.trim() === "1";
  if (!has(OWNER_ROLE)) psql(`CREATE ROLE ${OWNER_ROLE} LOGIN CREATEDB BYPASSRLS`);
  else psql(`ALTER ROLE ${OWNER_ROLE} LOGIN CREATEDB BYPASSRLS`);
  if (!has(APP_ROLE)) psql(`CREATE ROLE ${APP_ROLE} LOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOBYPASSRLS`);
}

/** `{ appUrl, ownerUrl }` for a database on the local cluster. */
export function databaseUrls(port, db) {
  return { appUrl: `postgres://${APP_ROLE}@127.0.0.1:${port}/${db}`, ownerUrl: `postgres://${OWNER_ROLE}@127.0.0.1:${port}/${db}` };
}

/**
 * Restarts a cluster this machine runs (`pg_ctl restart -m fast`: open connections are cut, the
 * server comes back with the same options); for the fault tests. Resolves when it accepts
 * connections again.
 */
export function restartPostgres(dir) {
  const args = [path.join(pgBin(), "pg_ctl"), "-D", dir, "-m", "fast", "-w", "-t", "60", "restart"];
  const [cmd, ...rest] = isRoot ? ["runuser", "-u", "postgres", "--", ...args] : args;
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, rest, { stdio: "ignore" });
    child.once("error", reject);
    child.once("exit", (code) => (code === 0 ? resolve() : reject(new Error(`pg_ctl restart exited with ${code}`))));
  });
}

const children = new Set();
/** Spawns a long-running child in its own process group; stopAll() ends them. */
export function spawnService(label, cmd, args, opts = {}) {
  const child = spawn(cmd, args, { cwd: root, stdio: opts.stdio ?? ["ignore", "inherit", "inherit"], env: opts.env ?? process.env, detached: true });
  children.add(child);
  child.on("exit", (code, signal) => {
    children.delete(child);
    if (opts.onExit) opts.onExit(code, signal);
    else if (!stopping && code !== 0) log(`${label} exited (${code ?? signal})`);
  });
  return child;
}

let stopping = false;
export function stopAll() {
  stopping = true;
  for (const c of children) {
    try {
      process.kill(-c.pid, "SIGTERM");
    } catch {
      /* already gone */
    }
  }
}

/** maildev: SMTP and web inbox, both on loopback, mail kept in a data folder. */
export async function startMaildev({ smtpPort, webPort, name }) {
  if (await portOpen(smtpPort)) {
    log(`mail stand-in already listening on ${smtpPort}; reusing it`);
    return null;
  }
  const dir = path.join(root, ".data", name);
  fs.mkdirSync(dir, { recursive: true });
  const bin = path.join(root, "node_modules", ".bin", "maildev");
  const child = spawnService(
    "maildev",
    bin,
    ["--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "--smtp", String(smtpPort), "--web", String(webPort), "--mail-directory", dir, "--silent"],
    { stdio: ["ignore", "ignore", "inherit"] },
  );
  await waitForPort(smtpPort, "maildev SMTP");
  await waitForPort(webPort, "maildev web");
  return child;
}

/**
 * The local Stripe stand-in (dev/stripe-standin) on the loopback port of `apiBase`, delivering
 * webhooks to `webhookUrl`. Not started when STRIPE_API_BASE points elsewhere (the real service).
 * `env` carries STRIPE_API_BASE and any STANDIN_* settings; the key and webhook secret come from
 * lib/env.ts, as in the app.
 */
export async function startStripeStandin({ apiBase, webhookUrl, env }) {
  const base = new URL(apiBase);
  if (!["127.0.0.1", "localhost"].includes(base.hostname) || base.protocol !== "http:") {
    log(`STRIPE_API_BASE is ${apiBase}: not starting the local Stripe stand-in`);
    return null;
  }
  const port = Number(base.port || 80);
  if (await portOpen(port)) {
    log(`Stripe stand-in already listening on ${port}; reusing it`);
    return null;
  }
  const bin = path.join(root, "node_modules", ".bin", "tsx");
  let exited;
  const early = new Promise((_, reject) => {
    exited = (code) => reject(new Error(`the Stripe stand-in exited (${code}) before opening port ${port}; see its message above`));
  });
  early.catch(() => undefined); // a late exit is reported by onExit, not as an unhandled rejection
  let up = false;
  const child = spawnService("Stripe stand-in", bin, ["dev/stripe-standin/main.ts"], {
    env: { ...env, STRIPE_API_BASE: apiBase, STANDIN_WEBHOOK_URL: webhookUrl },
    stdio: ["ignore", "ignore", "inherit"],
    onExit: (code, signal) => {
      if (!up) exited(code ?? signal);
      else if (!stopping && code !== 0) log(`Stripe stand-in exited (${code ?? signal})`);
    },
  });
  await Promise.race([waitForPort(port, "Stripe stand-in"), early]);
  up = true;
  return child;
}

/**
 * The session-signing secret for this checkout: BETTER_AUTH_SECRET when the environment gives one,
 * otherwise generated once into .data/auth-secret (mode 0600, readable by this user only) and
 * reused on every start, so sessions survive restarts. Deleting the file (or setting another
 * BETTER_AUTH_SECRET) rotates it: every session signed with the old one ends (README, "Secrets").
 */
export function ensureAuthSecret({ dir = path.join(root, ".data"), env = process.env } = {}) {
  return ensureSecretFile({ given: env.BETTER_AUTH_SECRET, file: path.join(dir, "auth-secret"), what: "a session secret" });
}

/**
 * The key webhook signing secrets are encrypted with: WEBHOOK_SECRET_KEY when the environment gives
 * one, otherwise generated once into .data/webhook-key like the session secret. Losing or changing
 * it makes the stored signing secrets unreadable: each endpoint then needs a new secret (README, "Secrets").
 */
export function ensureWebhookKey({ dir = path.join(root, ".data"), env = process.env } = {}) {
  return ensureSecretFile({ given: env.WEBHOOK_SECRET_KEY, file: path.join(dir, "webhook-key"), what: "a webhook key" });
}

function ensureSecretFile({ given, file, what }) {
  if (given) return given;
  const dir = path.dirname(file);
  fs.mkdirSync(dir, { recursive: true });
  try {
    const secret = fs.readFileSync(file, "utf8").trim();
    if ((fs.statSync(file).mode & 0o077) !== 0) {
      fs.chmodSync(file, 0o600);
      log(`${path.relative(root, file)} was readable by others; made it 0600`);
    }
    if (secret.length >= 32) return secret;
    log(`${path.relative(root, file)} holds no usable secret; generating a new one`);
  } catch (error) {
    if (error.code !== "ENOENT") throw error;
  }
  const secret = randomBytes(32).toString("base64url");
  fs.writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  fs.chmodSync(file, 0o600);
  log(`generated ${what} in ${path.relative(root, file)} (keep it private; see README, "Secrets")`);
  return secret;
}
