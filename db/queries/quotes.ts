import "server-only";
import { and, asc, count, desc, eq } from "drizzle-orm";
import { quoteLines, quoteRevisions, quotes, shops, users } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { OwnerScope } from "@/lib/auth/ownership";
import type { PriceLine, PriceSheet } from "@/lib/pricing";
import type { FrozenQuote, RevisionDesign } from "@/lib/quoting/types";
import type { QuoteListQuery } from "@/lib/validation/lists";
import type { QuoteStatus } from "@/lib/vocabulary";
import { containsText, ranked, readPage, sortedBy, type Page } from "./paging";

export interface QuoteListRow {
  id: string;
  number: string;
  status: QuoteStatus;
  revision: number;
  customerName: string;
  customerEmail: string;
  currency: string;
  quantity: number;
  total: string;
  validUntil: string;
  createdAt: Date;
  /** the customer asked for a change no revision has answered yet */
  changeRequestedAt: Date | null;
}

const QUOTE_SORTS = {
  number: quotes.number,
  customer: users.name,
  // open quotes first
  status: ranked(quotes.status, ["sent", "accepted", "declined", "expired", "withdrawn", "superseded", "draft"]),
  total: quoteRevisions.total,
  validUntil: quoteRevisions.validUntil,
  created: quotes.createdAt,
};

/**
 * A page of the shop's quotes the member sees (lib/auth/ownership.ts): all of them, or one
 * customer's own. Each row carries its current revision's totals; ties by number, newest first.
 */
export async function listQuotes(shopId: string, scope: OwnerScope, q: QuoteListQuery): Promise<Page<QuoteListRow>> {
  const where = and(
    eq(quotes.shopId, shopId),
    scope.all ? undefined : eq(quotes.customerUserId, scope.userId),
    q.status === "all" ? undefined : eq(quotes.status, q.status),
    scope.all ? containsText(q.q, quotes.number, users.name, users.email) : containsText(q.q, quotes.number),
  );
  const current = and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision));
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(quotes).innerJoin(users, eq(users.id, quotes.customerUserId)).where(where),
      (limit, offset) =>
        tx
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
            changeRequestedAt: quotes.changeRequestedAt,
          })
          .from(quotes)
          .innerJoin(quoteRevisions, current)
          .innerJoin(users, eq(users.id, quotes.customerUserId))
          .where(where)
          .orderBy(...sortedBy(QUOTE_SORTS, q, desc(quotes.number)))
          .limit(limit)
          .offset(offset),
    ),
  );
}

/** A quote by its number with its current revision's id; null when not in this shop. */
export async function getQuoteByNumber(shopId: string, number: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({
        id: quotes.id,
        number: quotes.number,
        status: quotes.status,
        customerUserId: quotes.customerUserId,
        requestId: quotes.requestId,
        currentRevision: quotes.currentRevision,
        changeRequestedAt: quotes.changeRequestedAt,
        revisionId: quoteRevisions.id,
        createdAt: quotes.createdAt,
      })
      .from(quotes)
      .innerJoin(
        quoteRevisions,
        and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)),
      )
      .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
      .limit(1),
  );
  return row ?? null;
}

/** One frozen revision with its quote, shop, customer and lines in order; null when not in this shop. */
export async function getRevision(shopId: string, revisionId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
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
    const lines = await tx
      .select()
      .from(quoteLines)
      .where(and(eq(quoteLines.shopId, shopId), eq(quoteLines.revisionId, revisionId)))
      .orderBy(asc(quoteLines.position));
    return { ...row, lines };
  });
}

export type RevisionWithLines = NonNullable<Awaited<ReturnType<typeof getRevision>>>;

/** The quote an earlier submit with this idempotency key made in the shop, if any. */
export async function getQuoteByIdempotencyKey(shopId: string, idempotencyKey: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({ number: quotes.number, customerUserId: quotes.customerUserId })
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.idempotencyKey, idempotencyKey)))
      .limit(1),
  );
  return row ?? null;
}

export interface NewQuote {
  requestId: string;
  customerUserId: string;
  number: string;
  idempotencyKey: string;
}

export async function insertQuote(tx: Tx, shopId: string, q: NewQuote): Promise<string> {
  const [row] = await tx
    .insert(quotes)
    .values({ shopId, ...q })
    .returning({ id: quotes.id });
  if (!row) throw new Error("quote insert returned no row");
  return row.id;
}

export interface NewQuoteRevision {
  quoteId: string;
  revision: number;
  /** requirement, arrangement, cell and price build-up as the search computed them */
  frozen: FrozenQuote;
  /** YYYY-MM-DD */
  validUntil: string;
  createdByUserId: string;
  /** the sell prices the customer sees (lib/quoting/revision-sheet.ts) */
  sheet: PriceSheet;
  /** how the bank was arrived at */
  design: RevisionDesign;
  /** the shop's note to the customer with this revision */
  note?: string;
}

/**
 * Freezes a revision and its price lines (one per line of the bank's build-up, in order); returns its
 * id. The revision's totals are its sheet's: what the customer pays.
 */
export async function insertQuoteRevision(tx: Tx, shopId: string, r: NewQuoteRevision): Promise<string> {
  const { requirement, arrangement, cell, pricing } = r.frozen;
  const [row] = await tx
    .insert(quoteRevisions)
    .values({
      shopId,
      quoteId: r.quoteId,
      revision: r.revision,
      requirement,
      arrangement,
      cell,
      pricing,
      sheet: r.sheet,
      design: r.design,
      note: r.note ?? "",
      currency: r.sheet.currency,
      quantity: pricing.quantity,
      subtotal: r.sheet.subtotal,
      tax: r.sheet.tax,
      total: r.sheet.total,
      validUntil: r.validUntil,
      createdByUserId: r.createdByUserId,
    })
    .returning({ id: quoteRevisions.id });
  if (!row) throw new Error("revision insert returned no row");
  await insertQuoteLines(tx, shopId, row.id, pricing.lines);
  return row.id;
}

async function insertQuoteLines(tx: Tx, shopId: string, revisionId: string, lines: readonly PriceLine[]) {
  if (lines.length === 0) return;
  await tx.insert(quoteLines).values(
    lines.map((line, i) => ({
      shopId,
      revisionId,
      position: i + 1,
      code: line.code,
      kind: line.kind,
      description: line.description,
      quantity: String(line.quantity),
      unit: line.unit,
      unitPrice: line.unitPrice,
      amount: line.amount,
    })),
  );
}
