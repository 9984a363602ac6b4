import "server-only";
import type PgBoss from "pg-boss";
import { expireDueQuotes } from "./lifecycle";

/** The scheduled job that expires quotes past their validity (lib/quoting/lifecycle.ts expireDueQuotes). */
export const QUOTE_EXPIRY_QUEUE = "quote-expiry";
/** Every quarter of an hour: a quote is past its validity from the first minute of the day after its last valid day (UTC). */
export const QUOTE_EXPIRY_CRON = "*/15 * * * *";

async function runExpiry(): Promise<void> {
  const expired = await expireDueQuotes();
  if (expired > 0) console.info(`[quotes] expired ${expired} quote${expired === 1 ? "" : "s"} past their validity`);
}

/**
 * Creates the expiry queue, works it in this process, schedules it (pg-boss keeps one schedule
 * across servers, and each run is one job), and queues a run now for quotes that ran out while no
 * server was running. Called by the job worker at start (lib/mail/worker.ts).
 */
export async function startQuoteExpiry(boss: PgBoss): Promise<void> {
  await boss.createQueue(QUOTE_EXPIRY_QUEUE, { name: QUOTE_EXPIRY_QUEUE, retryLimit: 2, retryDelay: 60, expireInSeconds: 300 });
  await boss.work(QUOTE_EXPIRY_QUEUE, { pollingIntervalSeconds: 30 }, runExpiry);
  await boss.schedule(QUOTE_EXPIRY_QUEUE, QUOTE_EXPIRY_CRON);
  await boss.send(QUOTE_EXPIRY_QUEUE, {}, { singletonKey: "start", singletonSeconds: 60 });
}
