// `npm run db:backup`: a pg_dump of the database in PostgreSQL's custom format (compressed, for
// pg_restore) into .data/backups/faradsmith-<database>-<UTC time>.dump, readable by its owner only.
// The database is MIGRATION_DATABASE_URL (or DATABASE_URL) when set, otherwise the one `npm start`
// uses (its cluster is started for the dump if it is not running, and stopped again). It is read as
// the tables' owner, which bypasses row-level security: the app's role would see no shop's rows.
// BACKUP_DIR moves the folder.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { databaseUrls, ensurePostgres, log, pgBin, root } from "./services.mjs";

const dir = process.env.BACKUP_DIR ?? path.join(root, ".data", "backups");
let url = process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL;
let cluster = null;
if (!url) {
  const port = Number(process.env.START_PG_PORT ?? 54329);
  cluster = await ensurePostgres({ name: "pg", port });
  url = databaseUrls(port, "faradsmith").ownerUrl;
}

try {
  const database = decodeURIComponent(new URL(url).pathname.slice(1));
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const file = path.join(dir, `faradsmith-${database}-${stamp}.dump`);
  const partial = `${file}.partial`;
  // the dump holds password hashes and customers' data: owner-only from the first byte
  fs.closeSync(fs.openSync(partial, "w", 0o600));
  const r = spawnSync(
    path.join(pgBin(), "pg_dump"),
    [
      "--format=custom",
      "--no-owner",
      "--no-privileges",
      // the job queue is rebuilt on restore: waiting e-mails are queued again from the outbox
      "--exclude-schema=pgboss",
      `--file=${partial}`,
      `--dbname=${url}`,
    ],
    {
      stdio: "inherit",
    },
  );
  if (r.status !== 0) {
    fs.rmSync(partial, { force: true });
    log("pg_dump failed; no backup written");
    process.exitCode = 1;
  } else {
    fs.renameSync(partial, file);
    fs.chmodSync(file, 0o600);
    const shown = path.relative(process.cwd(), file).startsWith("..") ? file : path.relative(process.cwd(), file);
    log(`backup of ${database}: ${shown} (${(fs.statSync(file).size / 1024).toFixed(0)} KiB)`);
    log(`restore it with: npm run db:restore -- ${shown} --into <new database>`);
  }
} finally {
  cluster?.stop();
}
