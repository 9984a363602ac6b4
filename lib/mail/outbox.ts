import "server-only";
import type { Db } from "@/db/client";
import { emailOutbox } from "@/db/schema";

/** A transaction handle or the client: outbox rows are written with what they announce. */
type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0] | Db;

export interface QuoteReadyMessage {
  shopId: string;
  quoteRevisionId: string;
  quoteNumber: string;
  revision: number;
  toEmail: string;
}

/**
 * Records "your quote is ready" in the outbox inside the caller's transaction (one row per
 * revision: the dedupe key makes a retry or a double submit write nothing new). Call
 * `dispatchOutbox()` after the transaction commits to hand it to the job queue.
 */
export async function enqueueQuoteReady(tx: Tx, m: QuoteReadyMessage): Promise<void> {
  await tx
    .insert(emailOutbox)
    .values({
      shopId: m.shopId,
      kind: "quote-ready",
      dedupeKey: `quote-ready:${m.quoteRevisionId}`,
      toEmail: m.toEmail,
      subject: `Your quote ${m.quoteNumber} (revision ${m.revision}) is ready`,
      quoteRevisionId: m.quoteRevisionId,
    })
    .onConflictDoNothing();
}

/** Hands waiting outbox rows to the job queue. (Filled in by the mail queue.) */
export async function dispatchOutbox(): Promise<void> {}
