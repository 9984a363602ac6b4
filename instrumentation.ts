/**
 * Runs once when a Next.js server starts: in the Node.js server (not in the edge runtime, not
 * during `next build`), lib/server-start.ts validates the environment and starts the e-mail worker.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startServer } = await import("./lib/server-start");
  await startServer();
}
