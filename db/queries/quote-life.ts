import "server-only";
import { and, asc, desc, eq, inArray, ne, sql } from "drizzle-orm";
import { db } from "@/db";
import {
  bankRequests,
  catalogCells,
  members,
  quoteDrafts,
  quoteMessages,
  quoteMoves,
  quoteRevisions,
  quotes,
  requestAttachments,
  shops,
  users,
} from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { QuoteActor } from "@/lib/quoting/quote-states";
import type { WorkbenchDraft } from "@/lib/validation/workbench";
import type { QuoteMessageKind, QuoteStatus, RequestStatus } from "@/lib/vocabulary";

/**
 * The life of a quote: its moves (append-only; a revision's state is its latest move's), its
 * thread, the estimator's drafts, and the reads the quote page, the workbench and the expiry job
 * need. Every read and write runs in a shop-scoped transaction (db/tx.ts withShop), or in the
 * caller's, which opened one.
 */

/** The quote row as a move needs it, locked (`FOR UPDATE`) for the rest of the caller's transaction. */
export async function lockQuoteByNumber(tx: Tx, shopId: string, number: string) {
  const [row] = await tx
    .select({
      id: quotes.id,
      number: quotes.number,
      status: quotes.status,
      currentRevision: quotes.currentRevision,
      customerUserId: quotes.customerUserId,
      requestId: quotes.requestId,
      changeRequestedAt: quotes.changeRequestedAt,
    })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
    .for("update")
    .limit(1);
  return row ?? null;
}

/** The same, found by its request (the workbench knows the request). */
export async function lockQuoteOfRequest(tx: Tx, shopId: string, requestId: string) {
  const [row] = await tx
    .select({ id: quotes.id, number: quotes.number, status: quotes.status, currentRevision: quotes.currentRevision })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.requestId, requestId)))
    .for("update")
    .limit(1);
  return row ?? null;
}

/** One frozen revision of a quote (no lock: revisions never change). */
export async function getRevisionOf(tx: Tx, shopId: string, quoteId: string, revision: number) {
  const [row] = await tx
    .select()
    .from(quoteRevisions)
    .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.quoteId, quoteId), eq(quoteRevisions.revision, revision)))
    .limit(1);
  return row ?? null;
}

/** The move that accepted a quote, if any (at most one: a unique index). */
export async function getAcceptance(tx: Tx, shopId: string, quoteId: string) {
  const [row] = await tx
    .select({ revision: quoteMoves.revision, actorUserId: quoteMoves.actorUserId, createdAt: quoteMoves.createdAt })
    .from(quoteMoves)
    .where(and(eq(quoteMoves.shopId, shopId), eq(quoteMoves.quoteId, quoteId), eq(quoteMoves.toStatus, "accepted")))
    .limit(1);
  return row ?? null;
}

export interface NewQuoteMove {
  quoteId: string;
  revision: number;
  fromStatus: QuoteStatus | null;
  toStatus: QuoteStatus;
  actor: QuoteActor;
  actorUserId: string | null;
  reason?: string | null;
  /** when it happened (default: the database's now) */
  at?: Date;
}

/** Records a move and puts the quote's own state in step when the move is its latest revision's. */
export async function recordQuoteMove(tx: Tx, shopId: string, m: NewQuoteMove, quote: { currentRevision: number }): Promise<void> {
  const { at, ...move } = m;
  await tx.insert(quoteMoves).values({ shopId, ...move, reason: m.reason ?? null, ...(at ? { createdAt: at } : {}) });
  if (m.revision === quote.currentRevision) {
    await tx
      .update(quotes)
      .set({ status: m.toStatus })
      .where(and(eq(quotes.shopId, shopId), eq(quotes.id, m.quoteId)));
  }
}

/** Makes `revision` the quote's latest, in `status`, with no change asked for. */
export async function setCurrentRevision(tx: Tx, shopId: string, quoteId: string, revision: number, status: QuoteStatus): Promise<void> {
  await tx
    .update(quotes)
    .set({ currentRevision: revision, status, changeRequestedAt: null })
    .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId)));
}

/** Marks that the customer asked for a change (the quote and its request go back to the estimators). */
export async function markChangeRequested(tx: Tx, shopId: string, quoteId: string, requestId: string, at: Date): Promise<void> {
  await tx
    .update(quotes)
    .set({ changeRequestedAt: at })
    .where(and(eq(quotes.shopId, shopId), eq(quotes.id, quoteId)));
  await setRequestStatus(tx, shopId, requestId, "needs-review");
}

export async function setRequestStatus(tx: Tx, shopId: string, requestId: string, status: RequestStatus): Promise<void> {
  await tx
    .update(bankRequests)
    .set({ status })
    .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.id, requestId)));
}

export interface NewQuoteMessage {
  quoteId: string;
  revision: number;
  authorUserId: string | null;
  side: "customer" | "shop";
  kind: QuoteMessageKind;
  body: string;
}

export async function insertQuoteMessage(tx: Tx, shopId: string, m: NewQuoteMessage): Promise<string> {
  const [row] = await tx
    .insert(quoteMessages)
    .values({ shopId, ...m })
    .returning({ id: quoteMessages.id });
  if (!row) throw new Error("message insert returned no row");
  return row.id;
}

/** Whom the shop's side of a quote is: its managers and estimators, with their addresses. */
export async function listStaffRecipients(tx: Tx, shopId: string) {
  return tx
    .select({ userId: users.id, name: users.name, email: users.email })
    .from(members)
    .innerJoin(users, eq(users.id, members.userId))
    .where(and(eq(members.shopId, shopId), inArray(members.role, ["manager", "estimator"])))
    .orderBy(asc(users.email));
}

export async function getUserIdentity(tx: Tx, userId: string) {
  const [row] = await tx.select({ id: users.id, name: users.name, email: users.email }).from(users).where(eq(users.id, userId)).limit(1);
  return row ?? null;
}

/** Everything the quote page shows of a quote's life: every revision (frozen), every move and the thread, oldest first. */
export async function getQuoteLife(shopId: string, quoteId: string) {
  return withShop(shopId, async (tx) => {
    const [revisions, moves, messages] = await Promise.all([
      tx
        .select({ revision: quoteRevisions, createdByName: users.name })
        .from(quoteRevisions)
        .leftJoin(users, eq(users.id, quoteRevisions.createdByUserId))
        .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.quoteId, quoteId)))
        .orderBy(asc(quoteRevisions.revision)),
      tx
        .select({
          revision: quoteMoves.revision,
          fromStatus: quoteMoves.fromStatus,
          toStatus: quoteMoves.toStatus,
          actor: quoteMoves.actor,
          actorName: users.name,
          reason: quoteMoves.reason,
          at: quoteMoves.createdAt,
        })
        .from(quoteMoves)
        .leftJoin(users, eq(users.id, quoteMoves.actorUserId))
        .where(and(eq(quoteMoves.shopId, shopId), eq(quoteMoves.quoteId, quoteId)))
        .orderBy(asc(quoteMoves.createdAt), asc(quoteMoves.id)),
      tx
        .select({
          id: quoteMessages.id,
          revision: quoteMessages.revision,
          side: quoteMessages.side,
          kind: quoteMessages.kind,
          body: quoteMessages.body,
          authorName: users.name,
          at: quoteMessages.createdAt,
        })
        .from(quoteMessages)
        .leftJoin(users, eq(users.id, quoteMessages.authorUserId))
        .where(and(eq(quoteMessages.shopId, shopId), eq(quoteMessages.quoteId, quoteId)))
        .orderBy(asc(quoteMessages.createdAt), asc(quoteMessages.id)),
    ]);
    return { revisions, moves, messages };
  });
}

export type QuoteLife = Awaited<ReturnType<typeof getQuoteLife>>;

/** A request with its customer and the quote made from it, if any (the workbench's header). */
export async function getRequestForReview(shopId: string, requestId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({
        request: bankRequests,
        customerName: users.name,
        customerEmail: users.email,
        quoteId: quotes.id,
        quoteNumber: quotes.number,
        quoteStatus: quotes.status,
        currentRevision: quotes.currentRevision,
        changeRequestedAt: quotes.changeRequestedAt,
      })
      .from(bankRequests)
      .innerJoin(users, eq(users.id, bankRequests.customerUserId))
      .leftJoin(quotes, and(eq(quotes.shopId, bankRequests.shopId), eq(quotes.requestId, bankRequests.id)))
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.id, requestId)))
      .limit(1);
    return row ?? null;
  });
}

/** A customer's quotes in the shop, newest first (the workbench shows their earlier ones). */
export async function listCustomerQuotes(shopId: string, customerUserId: string, limit = 20) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        number: quotes.number,
        status: quotes.status,
        revision: quotes.currentRevision,
        total: quoteRevisions.total,
        currency: quoteRevisions.currency,
        createdAt: quotes.createdAt,
        requestId: quotes.requestId,
      })
      .from(quotes)
      .innerJoin(
        quoteRevisions,
        and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)),
      )
      .where(and(eq(quotes.shopId, shopId), eq(quotes.customerUserId, customerUserId)))
      .orderBy(desc(quotes.createdAt))
      .limit(Math.min(Math.max(1, limit), 100)),
  );
}

/** The shop's retired cells (an estimator may offer one for a request). */
export async function listRetiredCells(shopId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select()
      .from(catalogCells)
      .where(and(eq(catalogCells.shopId, shopId), eq(catalogCells.isActive, false)))
      .orderBy(asc(catalogCells.sku)),
  );
}

/** The estimator's saved draft for a request, if any. */
export async function getQuoteDraft(shopId: string, requestId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ body: quoteDrafts.body, version: quoteDrafts.version, updatedAt: quoteDrafts.updatedAt, updatedByName: users.name })
      .from(quoteDrafts)
      .leftJoin(users, eq(users.id, quoteDrafts.updatedByUserId))
      .where(and(eq(quoteDrafts.shopId, shopId), eq(quoteDrafts.requestId, requestId)))
      .limit(1);
    return row ?? null;
  });
}

/**
 * Saves a draft when the caller started from the version stored now (0: none yet); answers the new
 * version, or null when someone else saved in between (the caller reloads, nothing is overwritten).
 */
export async function saveQuoteDraft(shopId: string, requestId: string, body: WorkbenchDraft, version: number, userId: string): Promise<number | null> {
  return withShop(shopId, async (tx) => {
    if (version === 0) {
      const [row] = await tx
        .insert(quoteDrafts)
        .values({ shopId, requestId, body, version: 1, updatedByUserId: userId })
        .onConflictDoNothing()
        .returning({ version: quoteDrafts.version });
      return row?.version ?? null;
    }
    const [row] = await tx
      .update(quoteDrafts)
      .set({ body, version: sql`${quoteDrafts.version} + 1`, updatedByUserId: userId, updatedAt: new Date() })
      .where(and(eq(quoteDrafts.shopId, shopId), eq(quoteDrafts.requestId, requestId), eq(quoteDrafts.version, version)))
      .returning({ version: quoteDrafts.version });
    return row?.version ?? null;
  });
}

export async function deleteQuoteDraft(tx: Tx, shopId: string, requestId: string): Promise<void> {
  await tx.delete(quoteDrafts).where(and(eq(quoteDrafts.shopId, shopId), eq(quoteDrafts.requestId, requestId)));
}

/**
 * Sent quotes whose latest revision's last valid day is before `today` (YYYY-MM-DD), across shops,
 * for the expiry job, through the narrow SECURITY DEFINER function `quotes_past_validity`
 * (drizzle/0017): run by the job queue, never for a member, it hands out only shops and numbers.
 * Each is expired in its own shop-scoped transaction.
 */
export async function listQuotesPastValidity(today: string, limit = 500): Promise<{ shopId: string; number: string }[]> {
  const { rows } = await db.execute<{ shop_id: string; number: string }>(sql`select shop_id, number from quotes_past_validity(${today}::date, ${limit})`);
  return rows.map((r) => ({ shopId: r.shop_id, number: r.number }));
}

/** Quotes whose customer asked for a change no revision has answered, newest first (the desk's queue). */
export async function countChangeRequests(shopId: string): Promise<number> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ n: sql<number>`count(*)::int` })
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), sql`${quotes.changeRequestedAt} is not null`, ne(quotes.status, "accepted")));
    return row?.n ?? 0;
  });
}

/** What the "quote updated" e-mail says: the revision, the one before it, and the shop. */
export async function getRevisionMailFacts(shopId: string, revisionId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ revision: quoteRevisions, quoteNumber: quotes.number, shopName: shops.name, shopSlug: shops.slug })
      .from(quoteRevisions)
      .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
      .innerJoin(shops, eq(shops.id, quoteRevisions.shopId))
      .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.id, revisionId)))
      .limit(1);
    if (!row) return null;
    const previous = row.revision.revision > 1 ? await getRevisionOf(tx, shopId, row.revision.quoteId, row.revision.revision - 1) : null;
    return { ...row, previous };
  });
}

/** What a thread message's e-mail says: the message, its author, its quote and the shop. */
export async function getMessageMailFacts(shopId: string, messageId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ message: quoteMessages, authorName: users.name, quoteNumber: quotes.number, shopName: shops.name, shopSlug: shops.slug })
      .from(quoteMessages)
      .innerJoin(quotes, and(eq(quotes.shopId, quoteMessages.shopId), eq(quotes.id, quoteMessages.quoteId)))
      .innerJoin(shops, eq(shops.id, quoteMessages.shopId))
      .leftJoin(users, eq(users.id, quoteMessages.authorUserId))
      .where(and(eq(quoteMessages.shopId, shopId), eq(quoteMessages.id, messageId)))
      .limit(1);
    return row ?? null;
  });
}

/** What the "needs review" e-mail says: the request, its customer, how many files came with it, and the shop. */
export async function getReviewMailFacts(shopId: string, requestId: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({
        requirement: bankRequests.requirement,
        notes: bankRequests.notes,
        reviewReasons: bankRequests.reviewReasons,
        customerName: users.name,
        shopName: shops.name,
        shopSlug: shops.slug,
        attachments: sql<number>`(select count(*)::int from ${requestAttachments} a where a.shop_id = ${bankRequests.shopId} and a.request_id = ${bankRequests.id})`,
      })
      .from(bankRequests)
      .innerJoin(users, eq(users.id, bankRequests.customerUserId))
      .innerJoin(shops, eq(shops.id, bankRequests.shopId))
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.id, requestId)))
      .limit(1);
    return row ?? null;
  });
}

/** A customer of the shop by e-mail (staff quoting for them through the API); null when there is no such customer. */
export async function findShopCustomerByEmail(shopId: string, email: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ id: users.id, name: users.name, email: users.email })
      .from(members)
      .innerJoin(users, eq(users.id, members.userId))
      .where(and(eq(members.shopId, shopId), eq(members.role, "customer"), eq(users.email, email)))
      .limit(1);
    return row ?? null;
  });
}

/** A quote by number with every revision (frozen) and each revision's state, for the API; null when not in this shop. */
export async function getQuoteWithRevisions(shopId: string, number: string) {
  return withShop(shopId, async (tx) => {
    const [quote] = await tx
      .select({ id: quotes.id, number: quotes.number, status: quotes.status, currentRevision: quotes.currentRevision, customerUserId: quotes.customerUserId })
      .from(quotes)
      .where(and(eq(quotes.shopId, shopId), eq(quotes.number, number)))
      .limit(1);
    if (!quote) return null;
    const [revisions, moves] = await Promise.all([
      tx
        .select()
        .from(quoteRevisions)
        .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.quoteId, quote.id)))
        .orderBy(asc(quoteRevisions.revision)),
      tx
        .select({ revision: quoteMoves.revision, toStatus: quoteMoves.toStatus })
        .from(quoteMoves)
        .where(and(eq(quoteMoves.shopId, shopId), eq(quoteMoves.quoteId, quote.id)))
        .orderBy(asc(quoteMoves.createdAt), asc(quoteMoves.id)),
    ]);
    return { quote, revisions, moves };
  });
}

/** The id of one revision of a quote, by the quote's number; null when there is no such revision in this shop. */
export async function getRevisionIdByNumber(shopId: string, number: string, revision: number): Promise<string | null> {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({ id: quoteRevisions.id })
      .from(quoteRevisions)
      .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
      .where(and(eq(quoteRevisions.shopId, shopId), eq(quotes.number, number), eq(quoteRevisions.revision, revision)))
      .limit(1);
    return row?.id ?? null;
  });
}
