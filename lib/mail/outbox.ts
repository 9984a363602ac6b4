import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { getOutboxRow, insertOutboxMessage, listWaitingOutboxIds, requeueFailedOutboxRow } from "@/db/queries/outbox";
import { withShop, type Tx } from "@/db/tx";
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

/**
 * A manager sends a failed message again: the row waits once more (recorded in the audit log in
 * the same transaction) and is handed to the queue with a fresh job, which gets the full retry
 * policy. Answers "missing" for no such message in this shop, "not-failed" for one that is sent or
 * still waiting.
 */
export async function requeueFailedMessage(shopId: string, outboxId: string, actorUserId: string): Promise<"requeued" | "missing" | "not-failed"> {
  const current = await getOutboxRow(shopId, outboxId);
  if (!current) return "missing";
  if (current.status !== "failed") return "not-failed";
  // the job that gave up keeps the row's id, and a job id is queued once: it goes first (it has
  // finished, so removing it changes nothing if the rest does not happen)
  const boss = await getBoss();
  await boss.deleteJob(MAIL_QUEUE, outboxId);
  const row = await withShop(shopId, async (tx) => {
    const requeued = await requeueFailedOutboxRow(tx, shopId, outboxId);
    if (!requeued) return null;
    await recordAudit(tx, shopId, {
      actorUserId,
      action: "outbox.requeue",
      subjectType: "outbox-message",
      subjectId: requeued.id,
      summary: `Sent again: "${requeued.subject}" to ${requeued.toEmail}, after ${requeued.attempts} failed attempt${requeued.attempts === 1 ? "" : "s"}${requeued.lastError ? ` (${requeued.lastError.slice(0, 200)})` : ""}`,
      changes: { status: { from: "failed", to: "waiting" } },
    });
    return requeued;
  });
  if (!row) return "not-failed"; // another manager was quicker
  await dispatchOutbox();
  return "requeued";
}

/** dispatchOutbox after a commit, for callers that have answered already: a failure only delays the mail (the queue's sweep delivers it later). */
export async function dispatchAfterCommit(what: string): Promise<void> {
  try {
    await dispatchOutbox();
  } catch (error) {
    console.error("dispatchOutbox failed after", what, error);
  }
}
