import "server-only";
import PgBoss from "pg-boss";
import { env } from "@/lib/env";
import { mailSettings } from "./config";

/** One job per outbox row: `{ outboxId, shopId }`, job id = outbox id, so a row is queued once. */
export const MAIL_QUEUE = "email-send";
/** The periodic sweep that queues waiting rows whose dispatch was missed. */
export const SWEEP_QUEUE = "email-sweep";
export const PGBOSS_SCHEMA = "pgboss";

export interface MailJob {
  outboxId: string;
  shopId: string;
}

// One pg-boss per process, shared by the dispatcher (server actions) and the worker
// (instrumentation.ts), which Next may load as separate module instances.
const state = globalThis as unknown as { faradsmithBoss?: Promise<PgBoss> };

async function startBoss(): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: env.DATABASE_URL, schema: PGBOSS_SCHEMA, max: 4, application_name: "faradsmith-mail" });
  // pg-boss reports connection trouble as "error" events; unhandled they would end the process
  boss.on("error", (error) => console.error("[mail] job queue error:", error));
  await boss.start();
  await ensureQueues(boss);
  return boss;
}

/** Creates the queues, or brings their retry policy up to the current settings. */
export async function ensureQueues(boss: PgBoss): Promise<void> {
  const s = mailSettings();
  const options = {
    name: MAIL_QUEUE,
    retryLimit: s.retryLimit,
    retryDelay: s.retryDelaySeconds,
    retryBackoff: s.retryBackoff,
    expireInSeconds: s.expireInSeconds,
  };
  await boss.createQueue(MAIL_QUEUE, options);
  await boss.updateQueue(MAIL_QUEUE, options);
  await boss.createQueue(SWEEP_QUEUE, { name: SWEEP_QUEUE, retryLimit: 0, expireInSeconds: 60 });
}

/** The process's started pg-boss (started on first use; a failed start is tried again next call). */
export function getBoss(): Promise<PgBoss> {
  if (!state.faradsmithBoss) {
    state.faradsmithBoss = startBoss().catch((error: unknown) => {
      state.faradsmithBoss = undefined;
      throw error;
    });
  }
  return state.faradsmithBoss;
}

/** Stops the process's pg-boss, waiting for jobs in hand to finish. */
export async function stopBoss(): Promise<void> {
  const pending = state.faradsmithBoss;
  state.faradsmithBoss = undefined;
  if (!pending) return;
  const boss = await pending.catch(() => null);
  await boss?.stop({ graceful: true, wait: true, timeout: 30_000 });
}
