// `npm run db:restore -- FILE [--into NAME | --force]`: restores a backup made by db:backup.
//   --into NAME  into a new database NAME on the same server (refused if NAME exists);
//   --force      in place of the configured database: the backup is restored into a new database
//                which then takes the configured one's name; the data it replaces is kept under
//                <name>_replaced_<time> until you drop it (stop the app first: a database in use
//                cannot be renamed);
//   neither      into the configured database only when it holds no tables yet.
// The configured database is MIGRATION_DATABASE_URL (or DATABASE_URL), or the one `npm start` uses;
// the restore runs as that URL's role, the tables' owner. Afterwards the app's role (DATABASE_URL's
// role when both are set, otherwise faradsmith_app) gets its rights on the restored database again
// (db/prepare.ts). A restore runs in one transaction into a database nobody uses yet, so one that
// fails part-way changes nothing.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import { APP_ROLE, databaseUrls, ensurePostgres, log, pgBin, root } from "./services.mjs";

const args = process.argv.slice(2);
const force = args.includes("--force");
const intoAt = args.indexOf("--into");
const into = intoAt >= 0 ? args[intoAt + 1] : undefined;
const file = args.find((a, i) => !a.startsWith("--") && (intoAt < 0 || i !== intoAt + 1));

class Refusal extends Error {}
/** Stops the restore with a message (after the finally blocks have run). */
function fail(message) {
  throw new Refusal(message);
}
const bin = pgBin();
function checkArguments() {
  if (!file) fail("usage: npm run db:restore -- FILE [--into NAME | --force]");
  if (!fs.existsSync(file)) fail(`no such backup: ${file}`);
  if (intoAt >= 0 && (!into || !/^[a-z_][a-z0-9_]{0,62}$/.test(into))) fail("--into needs a database name of lowercase letters, digits and underscores");
  if (into && force) fail("--into and --force do not go together: --into never replaces anything");
  if (spawnSync(path.join(bin, "pg_restore"), ["--list", file], { stdio: "ignore" }).status !== 0)
    fail(`${file} is not a backup pg_restore can read (made by npm run db:backup?)`);
}

async function query(databaseUrl, sql, params = []) {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    return (await client.query(sql, params)).rows;
  } finally {
    await client.end();
  }
}
let url = process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL;
const appRole = process.env.MIGRATION_DATABASE_URL && process.env.DATABASE_URL ? new URL(process.env.DATABASE_URL).username : APP_ROLE;
const withDatabase = (name, user) => {
  const u = new URL(url);
  u.pathname = `/${name}`;
  if (user) u.username = user;
  return u.toString();
};

/** Migrations the backup predates, and the app role's rights (restored without privileges). */
function prepareFor(database) {
  const r = spawnSync(path.join(root, "node_modules", ".bin", "tsx"), ["scripts/db.ts", "migrate"], {
    cwd: root,
    stdio: "inherit",
    env: { ...process.env, MIGRATION_DATABASE_URL: withDatabase(database), DATABASE_URL: withDatabase(database, appRole) },
  });
  if (r.status !== 0) log(`the restore is in place, but preparing it for the app failed; run: npm run db:migrate`);
}

let cluster = null;
try {
  checkArguments();
  if (!url) {
    const port = Number(process.env.START_PG_PORT ?? 54329);
    cluster = await ensurePostgres({ name: "pg", port });
    url = databaseUrls(port, "faradsmith").ownerUrl;
  }
  const restoreArgs = ["--no-owner", "--no-privileges", "--single-transaction", "--exit-on-error"];
  const name = decodeURIComponent(new URL(url).pathname.slice(1));
  let fresh;
  if (into) {
    const exists = await query(withDatabase("postgres"), "SELECT 1 FROM pg_database WHERE datname = $1", [into]);
    if (exists.length > 0) fail(`a database named ${into} exists already; --into restores only into a new one`);
    fresh = into;
  } else {
    const [{ n }] = await query(url, "SELECT count(*)::int AS n FROM information_schema.tables WHERE table_schema NOT IN ('pg_catalog', 'information_schema')");
    if (n > 0 && !force) fail(`${name} already holds ${n} tables; pass --force to replace them (stop the app first), or --into NAME to restore beside it`);
    fresh = `${name}_restoring_${Date.now().toString(36)}`.slice(0, 63);
  }
  await query(withDatabase("postgres"), `CREATE DATABASE "${fresh}"`);
  const r = spawnSync(path.join(bin, "pg_restore"), [...restoreArgs, `--dbname=${withDatabase(fresh)}`, file], { stdio: "inherit" });
  if (r.status !== 0) {
    await query(withDatabase("postgres"), `DROP DATABASE IF EXISTS "${fresh}"`);
    fail("pg_restore failed; nothing was changed");
  }
  let target = withDatabase(fresh);
  if (!into) {
    // the restored copy takes the configured database's name; what it replaces is kept aside
    const replaced = `${name}_replaced_${new Date().toISOString().replace(/\D/g, "").slice(0, 14)}`.slice(0, 63);
    try {
      await query(withDatabase("postgres"), `ALTER DATABASE "${name}" RENAME TO "${replaced}"`);
    } catch (error) {
      await query(withDatabase("postgres"), `DROP DATABASE IF EXISTS "${fresh}"`);
      fail(`${name} could not be replaced (${error.message}); stop the app and try again; nothing was changed`);
    }
    await query(withDatabase("postgres"), `ALTER DATABASE "${fresh}" RENAME TO "${name}"`);
    target = url;
    const [{ n }] = await query(
      withDatabase(replaced),
      "SELECT count(*)::int AS n FROM information_schema.tables WHERE table_schema NOT IN ('pg_catalog', 'information_schema')",
    );
    if (n > 0) log(`the data it replaced is kept as ${replaced}; drop it when you no longer need it: DROP DATABASE "${replaced}"`);
    else await query(withDatabase("postgres"), `DROP DATABASE "${replaced}"`);
  }
  prepareFor(decodeURIComponent(new URL(target).pathname.slice(1)));
  const tables = await query(target, "SELECT count(*)::int AS n FROM information_schema.tables WHERE table_schema = 'public'");
  log(`restored ${path.basename(file)} into ${decodeURIComponent(new URL(target).pathname.slice(1))} (${tables[0].n} tables)`);
} catch (error) {
  if (!(error instanceof Refusal)) throw error;
  log(error.message);
  process.exitCode = 1;
} finally {
  cluster?.stop();
}
