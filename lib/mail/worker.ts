import "server-only";
import type PgBoss from "pg-boss";
import { z } from "zod";
import { startAttachmentSweep } from "@/lib/attachments/sweep";
import { env } from "@/lib/env";
import { mailSettings } from "./config";
import { deliverOutboxRow } from "./deliver";
import { startQuoteExpiry } from "@/lib/quoting/expiry-job";
import { dispatchOutbox } from "./outbox";
import { ensureQueues, getBoss, MAIL_QUEUE, stopBoss, SWEEP_QUEUE } from "./queue";

const jobSchema = z.object({ outboxId: z.string().uuid(), shopId: z.string().min(1) });

const state = globalThis as unknown as { faradsmithMailWorker?: { running: boolean; retryTimer?: NodeJS.Timeout; retryDelayMs: number } };

async function handleSendJob(job: PgBoss.JobWithMetadata<unknown>): Promise<void> {
  const data = jobSchema.safeParse(job.data);
  if (!data.success) {
    console.error(`[mail] job ${job.id} has no outbox row to send; dropped`);
    return;
  }
  const final = job.retryCount >= job.retryLimit;
  try {
    await deliverOutboxRow(data.data.shopId, data.data.outboxId, { final });
  } catch (error) {
    const what = final ? "gave up on" : `will retry (attempt ${job.retryCount + 1} of ${job.retryLimit + 1})`;
    console.error(`[mail] ${what} outbox ${data.data.outboxId}: ${error instanceof Error ? error.message : String(error)}`);
    throw error;
  }
}

async function startOnce(): Promise<void> {
  const boss = await getBoss();
  await ensureQueues(boss);
  const s = mailSettings();
  await boss.work<unknown>(MAIL_QUEUE, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: s.pollingIntervalSeconds }, async ([job]) => {
    if (job) await handleSendJob(job);
  });
  await boss.work(SWEEP_QUEUE, { pollingIntervalSeconds: 30 }, async () => {
    await dispatchOutbox();
  });
  await boss.schedule(SWEEP_QUEUE, s.sweepCron);
  // the job queue's other periodic work: uploads never attached to a request
  await startAttachmentSweep(boss);
  // the same worker runs the quotes' scheduled expiry
  await startQuoteExpiry(boss);
  // rows committed while no server was running (or whose dispatch failed) go out now
  await dispatchOutbox();
}

/**
 * Starts the e-mail worker in this process: pg-boss on DATABASE_URL, a worker on the send queue,
 * and the sweep (at start and on a schedule). Skipped with MAIL_WORKER=off. When the database is
 * not reachable yet it logs and tries again in the background with growing waits (up to a
 * minute), so the web server starts anyway; `{ retryOnFailure: false }` throws instead.
 * Returns whether the worker is running now.
 */
export async function startMailWorker({ retryOnFailure = true }: { retryOnFailure?: boolean } = {}): Promise<boolean> {
  if (env.MAIL_WORKER === "off") {
    console.info("[mail] MAIL_WORKER=off: no e-mail worker in this process");
    return false;
  }
  const w = (state.faradsmithMailWorker ??= { running: false, retryDelayMs: 2000 });
  if (w.running) return true;
  if (w.retryTimer) {
    clearTimeout(w.retryTimer);
    w.retryTimer = undefined;
  }
  try {
    await startOnce();
    w.running = true;
    w.retryDelayMs = 2000;
    const s = mailSettings();
    console.info(
      `[mail] e-mail worker started (SMTP ${s.smtpHost}:${s.smtpPort}, up to ${s.retryLimit} retries from ${s.retryDelaySeconds} s${s.retryBackoff ? ", doubling" : ""})`,
    );
    return true;
  } catch (error) {
    await stopBoss().catch(() => undefined);
    if (!retryOnFailure) throw error;
    console.error(`[mail] e-mail worker did not start (${error instanceof Error ? error.message : String(error)}); trying again in ${w.retryDelayMs / 1000} s`);
    w.retryTimer = setTimeout(() => {
      w.retryTimer = undefined;
      void startMailWorker({ retryOnFailure: true });
    }, w.retryDelayMs);
    w.retryTimer.unref();
    w.retryDelayMs = Math.min(w.retryDelayMs * 2, 60_000);
    return false;
  }
}

/** Stops the worker and the process's job queue client, letting a message in hand finish. */
export async function stopMailWorker(): Promise<void> {
  const w = state.faradsmithMailWorker;
  if (w?.retryTimer) clearTimeout(w.retryTimer);
  state.faradsmithMailWorker = undefined;
  await stopBoss();
}
