/**
 * What a Node.js server does once at start (instrumentation.ts): the environment is validated
 * before anything is served, so an invalid one (for example a production server with the
 * development session secret) stops the process instead of failing every request; then the
 * e-mail worker starts, unless MAIL_WORKER=off, and the payment reconciliation job, unless
 * PAYMENTS_WORKER=off.
 */
export async function startServer(): Promise<void> {
  try {
    await import("@/lib/env");
  } catch (error) {
    console.error(`[faradsmith] not starting: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  }
  const { startMailWorker } = await import("@/lib/mail/worker");
  await startMailWorker();
  const { startPaymentsWorker } = await import("@/lib/payments/worker");
  // in the background: a payment service that is slow to answer must not hold the server's start
  void startPaymentsWorker();
}
