/**
 * What a Node.js server does once at start (instrumentation.ts): the environment is validated
 * before anything is served, so an invalid one (for example a production server with the
 * development session secret) stops the process instead of failing every request; a production
 * server refuses to run as a database role that escapes row-level security (README, "Database
 * roles"); then the e-mail worker starts, unless MAIL_WORKER=off; the payment reconciliation job,
 * unless PAYMENTS_WORKER=off; and the webhook delivery worker, unless WEBHOOK_WORKER=off (tried
 * again every 10 s while the database cannot be reached).
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
  const { startPaymentsWorker } = await import("@/lib/payments/worker");
  // in the background: a payment service that is slow to answer must not hold the server's start
  void startPaymentsWorker();
  const { startWebhookWorker } = await import("@/lib/webhooks/worker");
  const startWebhooks = () =>
    startWebhookWorker().catch((error: unknown) => {
      console.error(`[webhooks] worker did not start (${error instanceof Error ? error.message : String(error)}); trying again in 10 s`);
      setTimeout(() => void startWebhooks(), 10_000).unref();
    });
  await startWebhooks();
}
