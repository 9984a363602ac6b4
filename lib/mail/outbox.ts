import "server-only";
import { insertOutboxMessage, listWaitingOutboxIds } from "@/db/queries/outbox";
import type { Tx } from "@/db/tx";
import { getBoss, MAIL_QUEUE, type MailJob } from "./queue";

export interface QuoteReadyMessage {
  shopId: string;
  quoteRevisionId: string;
  quoteNumber: string;
  revision: number;
  toEmail: string;
  /** another key than the revision's own, for a copy sent again on purpose */
  dedupeKey?: string;
}

/**
 * Records "your quote is ready" in the outbox inside the caller's transaction (one row per
 * revision: the dedupe key makes a retry or a double submit write nothing new). Call
 * `dispatchOutbox()` after the transaction commits to hand it to the job queue.
 */
export async function enqueueQuoteReady(tx: Tx, m: QuoteReadyMessage): Promise<void> {
  await insertOutboxMessage(tx, m.shopId, {
    kind: "quote-ready",
    dedupeKey: m.dedupeKey ?? `quote-ready:${m.quoteRevisionId}`,
    toEmail: m.toEmail,
    subject: `Your quote ${m.quoteNumber} (revision ${m.revision}) is ready`,
    quoteRevisionId: m.quoteRevisionId,
  });
}

/**
 * Hands every waiting outbox row to the job queue, in one statement. The job's id is the row's id
 * (and so is its singleton key), so a row already queued, retrying or in hand is not queued again:
 * calling this twice, or from two servers at once, sends nothing twice.
 */
export async function dispatchOutbox(): Promise<void> {
  const rows = await listWaitingOutboxIds();
  if (rows.length === 0) return;
  const boss = await getBoss();
  await boss.insert(
    rows.map((row) => {
      const data: MailJob = { outboxId: row.id, shopId: row.shopId };
      return { id: row.id, name: MAIL_QUEUE, data, singletonKey: row.id };
    }),
  );
}

/** dispatchOutbox after a commit, for callers that have answered already: a failure only delays the mail (the queue's sweep delivers it later). */
export async function dispatchAfterCommit(what: string): Promise<void> {
  try {
    await dispatchOutbox();
  } catch (error) {
    console.error("dispatchOutbox failed after", what, error);
  }
}
