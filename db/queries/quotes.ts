import "server-only";
import { and, asc, count, desc, eq, ilike, or, type SQL } from "drizzle-orm";
import { db } from "@/db";
import { quoteLines, quoteRevisions, quotes, shops, users } from "@/db/schema";
import type { OwnerScope } from "@/lib/auth/ownership";
import type { QuoteListQuery } from "@/lib/validation/quote";

export interface QuoteListRow {
  id: string;
  number: string;
  status: "issued" | "accepted" | "expired" | "withdrawn";
  revision: number;
  customerName: string;
  customerEmail: string;
  currency: string;
  quantity: number;
  total: string;
  validUntil: string;
  createdAt: Date;
}

const escapeLike = (s: string) => `%${s.replace(/[%_\\]/g, (c) => `\\${c}`)}%`;

/** A page of a shop's quotes (optionally one customer's), each with its current revision's totals. */
async function listQuotesWhere(shopId: string, q: QuoteListQuery, customerUserId?: string): Promise<{ rows: QuoteListRow[]; total: number }> {
  const where: SQL[] = [eq(quotes.shopId, shopId)];
  if (customerUserId !== undefined) where.push(eq(quotes.customerUserId, customerUserId));
  if (q.status !== "all") where.push(eq(quotes.status, q.status));
  if (q.q) {
    const like = escapeLike(q.q);
    where.push(customerUserId !== undefined ? ilike(quotes.number, like) : or(ilike(quotes.number, like), ilike(users.name, like), ilike(users.email, like))!);
  }
  const column = { number: quotes.number, created: quotes.createdAt, total: quoteRevisions.total, validUntil: quoteRevisions.validUntil }[q.sort];
  const join = and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision));
  const rows = await db
    .select({
      id: quotes.id,
      number: quotes.number,
      status: quotes.status,
      revision: quotes.currentRevision,
      customerName: users.name,
      customerEmail: users.email,
      currency: quoteRevisions.currency,
      quantity: quoteRevisions.quantity,
      total: quoteRevisions.total,
      validUntil: quoteRevisions.validUntil,
      createdAt: quotes.createdAt,
    })
    .from(quotes)
    .innerJoin(quoteRevisions, join)
    .innerJoin(users, eq(users.id, quotes.customerUserId))
    .where(and(...where))
    .orderBy(q.dir === "asc" ? asc(column) : desc(column), desc(quotes.number))
    .limit(q.size)
    .offset((q.page - 1) * q.size);
  const [t] = await db
    .select({ n: count() })
    .from(quotes)
    .innerJoin(users, eq(users.id, quotes.customerUserId))
    .where(and(...where));
  return { rows, total: t?.n ?? 0 };
}

/** The shop's quotes the member sees (lib/auth/ownership.ts): all of them, or one customer's own. */
export function listQuotes(shopId: string, scope: OwnerScope, q: QuoteListQuery) {
  return listQuotesWhere(shopId, q, scope.all ? undefined : scope.userId);
}

/** A quote by its number with its current revision's id; null when not in this shop. */
export async function getQuoteByNumber(shopId: string, number: string) {
  const [row] = await db
    .select({
      id: quotes.id,
      number: quotes.number,
      status: quotes.status,
      customerUserId: quotes.customerUserId,
      requestId: quotes.requestId,
      currentRevision: quotes.currentRevision,
      revisionId: quoteRevisions.id,
      createdAt: quotes.createdAt,
    })
    .from(quotes)
    .innerJoin(quoteRevisions, and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)))
    .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
    .limit(1);
  return row ?? null;
}

/** One frozen revision with its quote, shop, customer and lines in order; null when not in this shop. */
export async function getRevision(shopId: string, revisionId: string) {
  const [row] = await db
    .select({
      revision: quoteRevisions,
      quoteNumber: quotes.number,
      quoteStatus: quotes.status,
      customerUserId: quotes.customerUserId,
      customerName: users.name,
      customerEmail: users.email,
      shopName: shops.name,
      shopSlug: shops.slug,
    })
    .from(quoteRevisions)
    .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
    .innerJoin(users, eq(users.id, quotes.customerUserId))
    .innerJoin(shops, eq(shops.id, quoteRevisions.shopId))
    .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.id, revisionId)))
    .limit(1);
  if (!row) return null;
  const lines = await db
    .select()
    .from(quoteLines)
    .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.revisionId, revisionId)))
    .orderBy(asc(quoteLines.position));
  return { ...row, lines };
}

export type RevisionWithLines = NonNullable<Awaited<ReturnType<typeof getRevision>>>;
