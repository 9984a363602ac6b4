import "server-only";
import { and, asc, count, desc, eq } from "drizzle-orm";
import { db } from "@/db";
import { emailOutbox, quoteRevisions, quotes, shops } from "@/db/schema";
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
  return readPage(
    q,
    () => db.select({ n: count() }).from(emailOutbox).where(where),
    (limit, offset) =>
      db
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
  );
}

export async function getOutboxRow(shopId: string, id: string) {
  const [row] = await db
    .select()
    .from(emailOutbox)
    .where(and(eq(emailOutbox.shopId, shopId), eq(emailOutbox.id, id)))
    .limit(1);
  return row ?? null;
}

/**
 * Waiting rows of every shop, oldest first, for the job queue's dispatcher. The one read across
 * shops: it runs for the queue, never for a member, and hands out only ids.
 */
export async function listWaitingOutboxIds(limit = 500): Promise<{ id: string; shopId: string }[]> {
  return db
    .select({ id: emailOutbox.id, shopId: emailOutbox.shopId })
    .from(emailOutbox)
    .where(eq(emailOutbox.status, "waiting"))
    .orderBy(asc(emailOutbox.createdAt))
    .limit(limit);
}

/** What the "quote ready" message says, read from the frozen revision (never the live catalog). */
export async function getQuoteReadyFacts(shopId: string, quoteRevisionId: string) {
  const [row] = await db
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
    .limit(1);
  return row ?? null;
}

/** How many of the shop's messages are in each state. */
export async function countOutboxByStatus(shopId: string): Promise<Record<"waiting" | "sent" | "failed", number>> {
  const rows = await db
    .select({ status: emailOutbox.status, n: count() })
    .from(emailOutbox)
    .where(eq(emailOutbox.shopId, shopId))
    .groupBy(emailOutbox.status);
  const counts = { waiting: 0, sent: 0, failed: 0 };
  for (const r of rows) counts[r.status] = r.n;
  return counts;
}
