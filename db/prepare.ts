/**
 * Brings a database up to date for the app, as the migration role (the tables' owner): applies the
 * committed migrations, gives the app's role exactly the rights it needs on what they made, and
 * installs the job queue's schema owned by the app's role. Used by `scripts/db.ts` (npm start,
 * npm test) and the integration tests' global set-up. See DEVELOPERS.md, "Row-level security".
 */
import path from "node:path";
import { sql } from "drizzle-orm";
import { migrate } from "drizzle-orm/node-postgres/migrator";
import PgBoss from "pg-boss";
import { createDb, type Db } from "./client";

/** pg-boss's schema (lib/mail/queue.ts uses the same name). */
export const JOB_SCHEMA = "pgboss";

/**
 * Functions that read across shops for the app (SECURITY DEFINER, owned by the migration role),
 * each handing out only what its one caller needs; the app's role may call these and no others.
 */
export const CROSS_SHOP_FUNCTIONS = [
  "public_shop_list(integer)",
  "waiting_outbox(integer)",
  "stale_unlinked_attachments(double precision, integer)",
  "due_webhook_deliveries(integer)",
  "payment_of_intent(text)",
  "quotes_past_validity(date, integer)",
];

/** The role a connection string logs in as. */
export function roleOf(url: string): string {
  const user = decodeURIComponent(new URL(url).username);
  if (!user) throw new Error("the database URL names no user");
  return user;
}

async function one<T>(db: Db, query: ReturnType<typeof sql>): Promise<T | undefined> {
  return (await db.execute(query)).rows[0] as T | undefined;
}

/**
 * The app's role must not bypass row-level security (no superuser, no BYPASSRLS) and must not be
 * the role that owns the tables; throws a message that says how to fix it.
 */
export async function checkAppRole(owner: Db, appRole: string, ownerRole: string): Promise<void> {
  if (appRole === ownerRole) {
    throw new Error(
      `DATABASE_URL and MIGRATION_DATABASE_URL both log in as "${appRole}": the app must connect as a role that does not own the tables (README, "Database roles")`,
    );
  }
  const role = await one<{ rolsuper: boolean; rolbypassrls: boolean }>(owner, sql`select rolsuper, rolbypassrls from pg_roles where rolname = ${appRole}`);
  if (!role) throw new Error(`the app's database role "${appRole}" does not exist`);
  if (role.rolsuper || role.rolbypassrls) throw new Error(`the app's database role "${appRole}" bypasses row-level security (superuser or BYPASSRLS)`);
  const own = await one<{ rolsuper: boolean; rolbypassrls: boolean }>(owner, sql`select rolsuper, rolbypassrls from pg_roles where rolname = current_user`);
  if (!own?.rolsuper && !own?.rolbypassrls) {
    throw new Error(
      `the migration role "${ownerRole}" needs BYPASSRLS: the cross-shop functions, the demo data and backups read every shop (ALTER ROLE ... BYPASSRLS, as a superuser)`,
    );
  }
}

/** What the app's role may do: read and write rows, never change tables; audit entries are only added; shops are never deleted. */
async function grantAppRole(owner: Db, appRole: string): Promise<void> {
  const r = sql.identifier(appRole);
  await owner.execute(sql`grant usage on schema public to ${r}`);
  await owner.execute(sql`grant select, insert, update, delete on all tables in schema public to ${r}`);
  await owner.execute(sql`grant usage, select on all sequences in schema public to ${r}`);
  await owner.execute(sql`revoke delete on shops from ${r}`);
  await owner.execute(sql`revoke update, delete, truncate on audit_events from ${r}`);
  for (const fn of CROSS_SHOP_FUNCTIONS) await owner.execute(sql.raw(`grant execute on function ${fn} to "${appRole.replace(/"/g, '""')}"`));
}

/**
 * pg-boss keeps its jobs in a schema of its own, owned by the app's role (it creates a table per
 * queue as queues are added). The app's role may not create schemas, so it is installed here:
 * for the moment of the install the app's role may create in this database, then no longer. A
 * schema left by an older set-up under another owner is replaced (waiting e-mails are queued again
 * from the outbox when a server starts; nothing else is kept in it).
 */
async function ensureJobSchema(owner: Db, appUrl: string, appRole: string): Promise<void> {
  const current = await one<{ owner: string }>(owner, sql`select nspowner::regrole::text as owner from pg_namespace where nspname = ${JOB_SCHEMA}`);
  const quoted = `"${appRole.replace(/"/g, '""')}"`;
  if (current && current.owner.replace(/^"|"$/g, "") !== appRole) {
    console.log(`[faradsmith] the job queue's schema belonged to ${current.owner}; recreating it for ${appRole}`);
    await owner.execute(sql.raw(`drop schema ${JOB_SCHEMA} cascade`));
  }
  const database = (await one<{ name: string }>(owner, sql`select current_database() as name`))?.name ?? "";
  const db = `"${database.replace(/"/g, '""')}"`;
  await owner.execute(sql.raw(`grant create on database ${db} to ${quoted}`));
  try {
    const boss = new PgBoss({ connectionString: appUrl, schema: JOB_SCHEMA, max: 1, supervise: false, schedule: false });
    boss.on("error", (error) => console.error("[faradsmith] job queue:", error));
    await boss.start();
    await boss.stop({ graceful: false, wait: true });
  } finally {
    await owner.execute(sql.raw(`revoke create on database ${db} from ${quoted}`));
  }
}

/**
 * Migrates the database at `ownerUrl` and prepares it for the app at `appUrl`. Safe to run on
 * every start: every step is idempotent.
 */
export async function prepareDatabase({ ownerUrl, appUrl }: { ownerUrl: string; appUrl: string }): Promise<void> {
  const { db, pool } = createDb(ownerUrl, 2);
  try {
    await migrate(db, { migrationsFolder: path.join(process.cwd(), "drizzle") });
    const appRole = roleOf(appUrl);
    await checkAppRole(db, appRole, roleOf(ownerUrl));
    await grantAppRole(db, appRole);
    await ensureJobSchema(db, appUrl, appRole);
  } finally {
    await pool.end();
  }
}
