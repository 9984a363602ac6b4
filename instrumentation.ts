/**
 * Runs once when a Next.js server starts: the environment is validated (lib/env.ts), and the
 * e-mail worker starts in the Node.js server (not in the edge runtime, not during `next build`),
 * unless MAIL_WORKER=off.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  // The environment is checked before anything is served: an invalid one (for example a production
  // server with the development session secret) stops the server instead of failing every request.
  try {
    await import("./lib/env");
  } catch (error) {
    console.error(`[faradsmith] not starting: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  }
  const { startMailWorker } = await import("./lib/mail/worker");
  await startMailWorker();
}
