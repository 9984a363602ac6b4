import "server-only";
import type PgBoss from "pg-boss";
import { z } from "zod";
import { listDueDeliveries } from "@/db/queries/webhooks";
import { env } from "@/lib/env";
import { getBoss } from "@/lib/mail/queue";
import { webhookSettings } from "./config";
import { attemptDelivery } from "./deliver";

/** One job per due attempt of a delivery: `{ id, shopId }`, keyed by the delivery (one queued, one in hand at most). */
export const WEBHOOK_QUEUE = "webhook-deliver";

const jobSchema = z.object({ id: z.string().uuid(), shopId: z.string().min(1) });

const state = globalThis as unknown as { faradsmithWebhookWorker?: { timer?: NodeJS.Timeout; polling: boolean } };

async function ensureQueue(boss: PgBoss): Promise<void> {
  // "stately": at most one queued and one active job per delivery; a crashed attempt is retried by
  // pg-boss after it expires (the delivery's own back-off is in its row, lib/webhooks/deliver.ts)
  const options = { name: WEBHOOK_QUEUE, policy: "stately" as const, retryLimit: 3, retryDelay: 30, retryBackoff: true, expireInSeconds: 120 };
  await boss.createQueue(WEBHOOK_QUEUE, options);
  await boss.updateQueue(WEBHOOK_QUEUE, options);
}

/** Queues every delivery that is due now (a delivery already queued is not queued twice). Answers how many were due. */
export async function dispatchWebhooks(): Promise<number> {
  const due = await listDueDeliveries();
  if (due.length === 0) return 0;
  const boss = await getBoss();
  await ensureQueue(boss);
  await boss.insert(due.map((d) => ({ name: WEBHOOK_QUEUE, data: d, singletonKey: d.id })));
  return due.length;
}

async function handle(job: PgBoss.Job<unknown>): Promise<void> {
  const data = jobSchema.safeParse(job.data);
  if (!data.success) {
    console.error(`[webhooks] job ${job.id} names no delivery; dropped`);
    return;
  }
  await attemptDelivery(data.data.shopId, data.data.id);
}

/**
 * Starts delivering in this process: a worker on the queue, and a dispatcher that looks for due
 * deliveries every `pollIntervalMs` (new events, retries whose time has come, replays). Skipped
 * with WEBHOOK_WORKER=off. Returns whether it runs.
 */
export async function startWebhookWorker(): Promise<boolean> {
  if (env.WEBHOOK_WORKER === "off") {
    console.info("[webhooks] WEBHOOK_WORKER=off: no webhook worker in this process");
    return false;
  }
  if (state.faradsmithWebhookWorker) return true;
  const boss = await getBoss();
  await ensureQueue(boss);
  if (state.faradsmithWebhookWorker) return true;
  const w: { timer?: NodeJS.Timeout; polling: boolean } = (state.faradsmithWebhookWorker = { polling: false });
  const s = webhookSettings();
  await boss.work(WEBHOOK_QUEUE, { batchSize: 1, pollingIntervalSeconds: Math.max(0.5, s.pollIntervalMs / 1000) }, async ([job]) => {
    if (job) await handle(job);
  });
  const poll = async () => {
    if (w.polling) return;
    w.polling = true;
    try {
      await dispatchWebhooks();
    } catch (error) {
      console.error(`[webhooks] dispatch failed: ${error instanceof Error ? error.message : String(error)}`);
    } finally {
      w.polling = false;
    }
  };
  w.timer = setInterval(() => void poll(), s.pollIntervalMs);
  w.timer.unref();
  await poll();
  console.info(`[webhooks] delivery worker started (up to ${s.maxAttempts} attempts, loopback ${s.allowLoopback ? "allowed" : "refused"})`);
  return true;
}

/** Stops the dispatcher and this process's worker on the queue (the shared job queue client stays). */
export async function stopWebhookWorker(): Promise<void> {
  const w = state.faradsmithWebhookWorker;
  state.faradsmithWebhookWorker = undefined;
  if (!w) return;
  if (w.timer) clearInterval(w.timer);
  const boss = await getBoss().catch(() => null);
  await boss?.offWork(WEBHOOK_QUEUE).catch(() => undefined);
}
