/**
 * What a Node.js server does once at start (instrumentation.ts): the environment is validated
 * before anything is served, so an invalid one (for example a production server with the
 * development session secret) stops the process instead of failing every request; a production
 * server refuses to run as a database role that escapes row-level security (README, "Database
 * roles"); then the e-mail worker starts, unless MAIL_WORKER=off.
 */
export async function startServer(): Promise<void> {
  let production = false;
  try {
    production = (await import("@/lib/env")).env.NODE_ENV === "production";
  } catch (error) {
    console.error(`[faradsmith] not starting: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  }
  const { appRoleEscapesRowSecurity } = await import("@/db/queries/database-role");
  const check = await appRoleEscapesRowSecurity().catch(() => null); // unreachable now: the pool retries per request
  if (check?.escapes) {
    const message = `DATABASE_URL logs in as "${check.role}", which escapes row-level security (superuser, BYPASSRLS or a table's owner); the app must use its own role`;
    if (production) {
      console.error(`[faradsmith] not starting: ${message}`);
      process.exit(1);
    }
    console.warn(`[faradsmith] ${message}`);
  }
  const { startMailWorker } = await import("@/lib/mail/worker");
  await startMailWorker();
}
