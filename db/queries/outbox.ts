import "server-only";
import { and, asc, count, desc, eq, sql } from "drizzle-orm";
import { db } from "@/db";
import { emailOutbox, quoteRevisions, quotes, shops } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { OutboxListQuery } from "@/lib/validation/lists";
import type { OutboxStatus } from "@/lib/vocabulary";
import { containsText, ranked, readPage, sortedBy, type Page } from "./paging";

export interface OutboxListRow {
  id: string;
  kind: string;
  toEmail: string;
  subject: string;
  status: OutboxStatus;
  attempts: number;
  lastError: string | null;
  createdAt: Date;
  sentAt: Date | null;
}

const OUTBOX_SORTS = {
  created: emailOutbox.createdAt,
  to: emailOutbox.toEmail,
  subject: emailOutbox.subject,
  // what went wrong first
  status: ranked(emailOutbox.status, ["failed", "waiting", "sent"]),
  attempts: emailOutbox.attempts,
  sent: emailOutbox.sentAt,
};

/** A page of the shop's outbox, filtered and sorted; ties newest first. */
export async function listOutbox(shopId: string, q: OutboxListQuery): Promise<Page<OutboxListRow>> {
  const where = and(
    eq(emailOutbox.shopId, shopId),
    q.status === "all" ? undefined : eq(emailOutbox.status, q.status),
    containsText(q.q, emailOutbox.toEmail, emailOutbox.subject),
  );
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(emailOutbox).where(where),
      (limit, offset) =>
        tx
          .select({
            id: emailOutbox.id,
            kind: emailOutbox.kind,
            toEmail: emailOutbox.toEmail,
            subject: emailOutbox.subject,
            status: emailOutbox.status,
            attempts: emailOutbox.attempts,
            lastError: emailOutbox.lastError,
            createdAt: emailOutbox.createdAt,
            sentAt: emailOutbox.sentAt,
          })
          .from(emailOutbox)
          .where(where)
          .orderBy(...sortedBy(OUTBOX_SORTS, q, desc(emailOutbox.createdAt), asc(emailOutbox.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
}

export async function getOutboxRow(shopId: string, id: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, id)))
      .limit(1),
  );
  return row ?? null;
}

/**
 * Waiting rows of every shop, oldest first, for the job queue's dispatcher. The one read across
 * shops: the database function `waiting_outbox` (drizzle/0009_row-level-security.sql) hands out
 * only ids and shops; each row is then sent in its own shop's `withShop`.
 */
export async function listWaitingOutboxIds(limit = 500): Promise<{ id: string; shopId: string }[]> {
  const rows = await db.execute<{ id: string; shop_id: string }>(sql`select id, shop_id from waiting_outbox(${limit})`);
  return rows.rows.map((r) => ({ id: r.id, shopId: r.shop_id }));
}

/** What the "quote ready" message says, read from the frozen revision (never the live catalog). */
export async function getQuoteReadyFacts(shopId: string, quoteRevisionId: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({
        shopName: shops.name,
        shopSlug: shops.slug,
        quoteNumber: quotes.number,
        revision: quoteRevisions.revision,
        currency: quoteRevisions.currency,
        quantity: quoteRevisions.quantity,
        total: quoteRevisions.total,
        validUntil: quoteRevisions.validUntil,
      })
      .from(quoteRevisions)
      .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
      .innerJoin(shops, eq(shops.id, quoteRevisions.shopId))
      .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.id, quoteRevisionId)))
      .limit(1),
  );
  return row ?? null;
}

/** How many of the shop's messages are in each state. */
export async function countOutboxByStatus(shopId: string): Promise<Record<"waiting" | "sent" | "failed", number>> {
  const rows = await withShop(shopId, (tx) =>
    tx.select({ status: emailOutbox.status, n: count() }).from(emailOutbox).where(eq(emailOutbox.shopId, shopId)).groupBy(emailOutbox.status),
  );
  const counts = { waiting: 0, sent: 0, failed: 0 };
  for (const r of rows) counts[r.status] = r.n;
  return counts;
}

export interface NewOutboxMessage {
  kind: string;
  /** one message per event: a second insert with the same key writes nothing */
  dedupeKey: string;
  toEmail: string;
  subject: string;
  quoteRevisionId: string | null;
  /** the request a "needs review" notice is about */
  requestId?: string | null;
  /** the thread message a "new message" notice carries */
  quoteMessageId?: string | null;
  /** the order an order message is about */
  orderId?: string | null;
}

/** Records a message in the caller's transaction, with what it announces; a repeated dedupe key is a no-op. */
export async function insertOutboxMessage(tx: Tx, shopId: string, m: NewOutboxMessage): Promise<void> {
  await tx
    .insert(emailOutbox)
    .values({ shopId, ...m })
    .onConflictDoNothing();
}

/**
 * Locks a row that is still waiting (`FOR UPDATE SKIP LOCKED`) for the rest of the caller's
 * transaction; false when it is sent, failed, gone, or another delivery holds it.
 */
export async function lockWaitingOutboxRow(tx: Tx, shopId: string, outboxId: string): Promise<boolean> {
  const [row] = await tx
    .select({ id: emailOutbox.id })
    .from(emailOutbox)
    .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, outboxId), eq(emailOutbox.status, "waiting")))
    .for("update", { skipLocked: true });
  return row !== undefined;
}

/** Marks a row sent with the SMTP Message-ID, counting the attempt. */
export async function markOutboxSent(tx: Tx, shopId: string, outboxId: string, messageId: string): Promise<void> {
  const now = new Date();
  await tx
    .update(emailOutbox)
    .set({ status: "sent", attempts: sql`${emailOutbox.attempts} + 1`, messageId, sentAt: now, lastError: null, updatedAt: now })
    .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, outboxId)));
}

/**
 * Counts a failed attempt on a row that is still waiting, keeping the reason; on the last attempt
 * marks it failed. Joins the caller's `withShop` transaction for this shop when there is one.
 */
export async function recordOutboxFailure(shopId: string, outboxId: string, reason: string, final: boolean): Promise<void> {
  await withShop(shopId, (tx) =>
    tx
      .update(emailOutbox)
      .set({ attempts: sql`${emailOutbox.attempts} + 1`, lastError: reason, status: final ? "failed" : "waiting", updatedAt: new Date() })
      .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, outboxId), eq(emailOutbox.status, "waiting"))),
  );
}

/**
 * A failed row goes back to waiting, in the caller's transaction: answers what it was, or null when
 * it is not failed (sent, waiting, gone, or another shop's). Attempts and the last reason stay.
 */
export async function requeueFailedOutboxRow(tx: Tx, shopId: string, outboxId: string) {
  const [row] = await tx
    .update(emailOutbox)
    .set({ status: "waiting", updatedAt: new Date() })
    .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, outboxId), eq(emailOutbox.status, "failed")))
    .returning({
      id: emailOutbox.id,
      toEmail: emailOutbox.toEmail,
      subject: emailOutbox.subject,
      attempts: emailOutbox.attempts,
      lastError: emailOutbox.lastError,
    });
  return row ?? null;
}
