/**
 * Runs once when a Next.js server starts: the e-mail worker lives in the Node.js server
 * (not in the edge runtime, not during `next build`), unless MAIL_WORKER=off.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startMailWorker } = await import("./lib/mail/worker");
  await startMailWorker();
}
