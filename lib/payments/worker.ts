import "server-only";
import { env } from "@/lib/env";
import { getBoss } from "@/lib/mail/queue";
import { reconcileStripeEvents } from "./reconcile";

/** The pg-boss queue of the reconciliation job, and how often it runs. */
export const RECONCILE_QUEUE = "payments-reconcile";
export const RECONCILE_CRON = "*/5 * * * *";

const state = globalThis as unknown as { faradsmithPaymentsWorker?: { running: boolean; retryTimer?: NodeJS.Timeout; retryDelayMs: number } };

async function runOnce(): Promise<void> {
  const report = await reconcileStripeEvents();
  if (report.handled > 0 || report.failed > 0)
    console.info(
      `[payments] reconciliation: ${report.listed} events listed, ${report.handled} handled that the webhook had missed, ${report.failed} left for the next run`,
    );
}

/**
 * Starts the reconciliation job in this process: a pg-boss worker on its queue and a schedule every
 * five minutes (pg-boss runs one job per tick however many app servers there are), and one run now
 * for whatever happened while no server was up. Skipped with PAYMENTS_WORKER=off. When the
 * database or the payment service is not reachable yet it tries again with growing waits.
 */
export async function startPaymentsWorker(): Promise<boolean> {
  if (env.PAYMENTS_WORKER === "off") {
    console.info("[payments] PAYMENTS_WORKER=off: no reconciliation job in this process");
    return false;
  }
  const w = (state.faradsmithPaymentsWorker ??= { running: false, retryDelayMs: 5000 });
  if (w.running) return true;
  try {
    const boss = await getBoss();
    await boss.createQueue(RECONCILE_QUEUE, { name: RECONCILE_QUEUE, retryLimit: 0, expireInSeconds: 240 });
    await boss.work(RECONCILE_QUEUE, { pollingIntervalSeconds: 30 }, async () => {
      await runOnce();
    });
    await boss.schedule(RECONCILE_QUEUE, RECONCILE_CRON);
    w.running = true;
    console.info(`[payments] reconciliation job scheduled (${RECONCILE_CRON})`);
  } catch (error) {
    console.error(
      `[payments] reconciliation job did not start (${error instanceof Error ? error.message : String(error)}); trying again in ${w.retryDelayMs / 1000} s`,
    );
    w.retryTimer = setTimeout(() => void startPaymentsWorker(), w.retryDelayMs);
    w.retryTimer.unref();
    w.retryDelayMs = Math.min(w.retryDelayMs * 2, 60_000);
    return false;
  }
  // what happened while no server was running; a failure here waits for the schedule
  await runOnce().catch((error: unknown) => console.error("[payments] reconciliation at start failed:", error instanceof Error ? error.message : error));
  return true;
}
