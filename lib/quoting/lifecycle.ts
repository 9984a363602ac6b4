import "server-only";
import { recordAudit } from "@/db/queries/audit";
import {
  getAcceptance,
  getRevisionOf,
  getUserIdentity,
  insertQuoteMessage,
  listQuotesPastValidity,
  listStaffRecipients,
  lockQuoteByNumber,
  markChangeRequested,
  recordQuoteMove,
} from "@/db/queries/quote-life";
import { recordShopEvent } from "@/db/queries/shop-events";
import { withShop, type Tx } from "@/db/tx";
import type { ShopContext } from "@/lib/auth/context";
import type { ActionResult } from "@/lib/auth/guards";
import { maySee } from "@/lib/auth/ownership";
import { can } from "@/lib/auth/permissions";
import { limits } from "@/lib/http/limits";
import { dispatchAfterCommit, enqueueQuoteReady } from "@/lib/mail/outbox";
import { enqueueQuoteUpdated, enqueueThreadMessage, type Recipient } from "@/lib/mail/quote-notices";
import type { QuoteMessageKind, QuoteStatus } from "@/lib/vocabulary";
import { isQuoteNumber } from "./quote-number";
import { nextState, type QuoteActor, type QuoteMove } from "./quote-states";
import { isExpired } from "./validity";

/**
 * The moves of a quote after it is issued: the customer accepts, declines or asks for a change;
 * either side writes in the thread; the shop withdraws or re-sends; the scheduled job expires what
 * ran past its validity. Each move locks the quote's row first (`FOR UPDATE`), so moves of one
 * quote — an accept racing the shop's next revision, two accepts from two tabs — happen one after
 * the other and each sees what the one before did; the state machine (quote-states.ts) decides.
 */

type Locked = NonNullable<Awaited<ReturnType<typeof lockQuoteByNumber>>>;

const NOT_FOUND = { ok: false, code: "not-found", message: "No such quote." } as const;
const conflict = (message: string) => ({ ok: false as const, code: "conflict" as const, message });

/** The quote, locked, when the member may see it; null otherwise (another customer's quote is "not found"). */
async function lockVisible(tx: Tx, ctx: ShopContext, number: string): Promise<Locked | null> {
  if (!isQuoteNumber(number)) return null;
  const quote = await lockQuoteByNumber(tx, ctx.shop.id, number);
  return quote && maySee(ctx, "quote", quote.customerUserId) ? quote : null;
}

/** The side a member writes for: the quote's customer, or the shop's staff. */
function sideOf(ctx: ShopContext): "customer" | "shop" {
  return can(ctx.role, "quote:read-all") ? "shop" : "customer";
}

/** Who hears of a message: the shop's staff when the customer wrote, the customer when the shop did. */
async function otherSide(tx: Tx, shopId: string, quote: Locked, side: "customer" | "shop"): Promise<Recipient[]> {
  if (side === "customer") return listStaffRecipients(tx, shopId);
  const customer = await getUserIdentity(tx, quote.customerUserId);
  return customer ? [{ userId: customer.id, email: customer.email }] : [];
}

/** Writes a message in the quote's thread and queues it to the other side, in the caller's transaction. */
async function writeMessage(tx: Tx, ctx: ShopContext, quote: Locked, kind: QuoteMessageKind, body: string, revision = quote.currentRevision) {
  const side = sideOf(ctx);
  const messageId = await insertQuoteMessage(tx, ctx.shop.id, { quoteId: quote.id, revision, authorUserId: ctx.user.id, side, kind, body });
  await enqueueThreadMessage(tx, {
    shopId: ctx.shop.id,
    messageId,
    kind,
    quoteNumber: quote.number,
    recipients: await otherSide(tx, ctx.shop.id, quote, side),
  });
  return messageId;
}

/** Makes one move of the quote's latest revision, or says why not (the state machine's reason). */
async function move(tx: Tx, shopId: string, quote: Locked, m: QuoteMove, actor: QuoteActor, actorUserId: string | null, reason?: string, at?: Date) {
  const next = nextState(quote.status, m, actor);
  if (!next.ok) return next;
  await recordQuoteMove(
    tx,
    shopId,
    { quoteId: quote.id, revision: quote.currentRevision, fromStatus: quote.status, toStatus: next.to, actor, actorUserId, reason, at },
    quote,
  );
  return next;
}

/** A revision that has run past its last valid day is expired on the spot (the job may not have run yet). */
async function expireIfDue(tx: Tx, shopId: string, quote: Locked, now: Date): Promise<boolean> {
  if (quote.status !== "sent") return false;
  const rev = await getRevisionOf(tx, shopId, quote.id, quote.currentRevision);
  if (!rev || !isExpired(rev.validUntil, now)) return false;
  await move(tx, shopId, quote, "expire", "system", null);
  return true;
}

function refusalFor(quote: Locked, revision: number, reason: string) {
  if (revision < quote.currentRevision) return conflict(`Revision ${revision} was replaced by revision ${quote.currentRevision}; see the latest revision.`);
  return conflict(reason);
}

/** What the payments work receives when a revision is accepted: enough to open a checkout for it. */
export interface AcceptedRevision {
  quoteId: string;
  number: string;
  revision: number;
  revisionId: string;
  currency: string;
  /** the revision's total, a decimal string in `currency` */
  total: string;
  acceptedAt: Date;
  /** true when this call found the revision already accepted (a second tab, a retry): nothing was recorded again */
  alreadyAccepted: boolean;
}

/**
 * The customer accepts a revision of their quote: only the latest sent revision, not expired or
 * superseded, and at most once (a unique index on the quote's acceptance backs the row lock).
 * Accepting the revision that is already accepted answers it again with `alreadyAccepted`, so a
 * checkout opened twice finds the same acceptance. Records the `quote.accepted` shop event.
 * For checkout: call right before creating the payment session, with the signed-in customer's context.
 */
export async function acceptQuoteRevision(
  ctx: ShopContext,
  input: { number: string; revision: number },
  now: Date = new Date(),
): Promise<ActionResult<AcceptedRevision>> {
  return withShop(ctx.shop.id, (tx) => acceptQuoteRevisionIn(tx, ctx, input, now));
}

/**
 * acceptQuoteRevision in the caller's transaction (the checkout opens its payment in the same one,
 * so an accept and its payment page stand or fall together). Locks the quote's row first.
 */
export async function acceptQuoteRevisionIn(
  tx: Tx,
  ctx: ShopContext,
  input: { number: string; revision: number },
  now: Date = new Date(),
): Promise<ActionResult<AcceptedRevision>> {
  if (!can(ctx.role, "quote:accept")) return { ok: false, code: "forbidden", message: "Only the quote's customer may accept it." };
  const shopId = ctx.shop.id;
  const quote = await lockVisible(tx, ctx, input.number);
  if (!quote || input.revision < 1 || input.revision > quote.currentRevision) return NOT_FOUND;
  const rev = await getRevisionOf(tx, shopId, quote.id, input.revision);
  if (!rev) return NOT_FOUND;
  const answer = (alreadyAccepted: boolean, acceptedAt: Date): ActionResult<AcceptedRevision> => ({
    ok: true,
    data: {
      quoteId: quote.id,
      number: quote.number,
      revision: rev.revision,
      revisionId: rev.id,
      currency: rev.currency,
      total: rev.total,
      acceptedAt,
      alreadyAccepted,
    },
  });
  if (quote.status === "accepted" && input.revision === quote.currentRevision)
    return answer(true, (await getAcceptance(tx, shopId, quote.id))?.createdAt ?? now);
  if (input.revision !== quote.currentRevision) return refusalFor(quote, input.revision, "");
  if (await expireIfDue(tx, shopId, quote, now)) return conflict(`Revision ${rev.revision} expired on ${rev.validUntil}; ask the shop for a new one.`);
  const next = await move(tx, shopId, quote, "accept", "customer", ctx.user.id, undefined, now);
  if (!next.ok) return conflict(next.reason);
  await recordShopEvent(tx, shopId, "quote.accepted", {
    number: quote.number,
    revision: rev.revision,
    total: { amount: rev.total, currency: rev.currency },
    acceptedAt: now.toISOString(),
  });
  return answer(false, now);
}

/** The customer declines the latest sent revision, with a reason the shop reads (in the thread, e-mailed to the staff). */
export async function declineQuoteRevision(
  ctx: ShopContext,
  input: { number: string; revision: number; reason: string },
  now: Date = new Date(),
): Promise<ActionResult<{ number: string; revision: number }>> {
  if (!can(ctx.role, "quote:accept")) return { ok: false, code: "forbidden", message: "Only the quote's customer may decline it." };
  const result = await withShop(ctx.shop.id, async (tx): Promise<ActionResult<{ number: string; revision: number }>> => {
    const quote = await lockVisible(tx, ctx, input.number);
    if (!quote || input.revision < 1 || input.revision > quote.currentRevision) return NOT_FOUND;
    if (input.revision !== quote.currentRevision) return refusalFor(quote, input.revision, "");
    if (await expireIfDue(tx, ctx.shop.id, quote, now)) return conflict("This revision has expired; there is nothing to decline.");
    const next = await move(tx, ctx.shop.id, quote, "decline", "customer", ctx.user.id, input.reason);
    if (!next.ok) return conflict(next.reason);
    await writeMessage(tx, ctx, quote, "decline", input.reason);
    return { ok: true, data: { number: quote.number, revision: quote.currentRevision } };
  });
  if (result.ok) await dispatchAfterCommit(`decline of ${input.number}`);
  return result;
}

/**
 * A message in the quote's thread, from its customer or the shop's staff, e-mailed to the other
 * side once. A customer's "change-request" sends the quote back to the estimators (the request
 * shows as needs review, the quote as change asked for) until the next revision answers it.
 */
export async function postQuoteMessage(
  ctx: ShopContext,
  input: { number: string; body: string; kind: "message" | "change-request" },
  now: Date = new Date(),
): Promise<ActionResult<{ id: string }>> {
  const side = sideOf(ctx);
  if (input.kind === "change-request" && side !== "customer")
    return { ok: false, code: "forbidden", message: "Only the customer asks for a change; staff revise the quote." };
  const gate = await limits.quoteMessages.hit(ctx.user.id);
  if (!gate.allowed) return { ok: false, code: "rate-limited", message: `Too many messages; try again in ${gate.retryAfterSeconds} s.` };
  const result = await withShop(ctx.shop.id, async (tx): Promise<ActionResult<{ id: string }>> => {
    const quote = await lockVisible(tx, ctx, input.number);
    if (!quote) return NOT_FOUND;
    if (input.kind === "change-request") {
      if (quote.status === "accepted") return conflict("This quote is accepted; ask the shop in a message, and it will make a new quote if needed.");
      await markChangeRequested(tx, ctx.shop.id, quote.id, quote.requestId, now);
    }
    const id = await writeMessage(tx, ctx, quote, input.kind, input.body);
    if (side === "shop") {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: "quote.message",
        subjectType: "quote",
        subjectId: quote.number,
        summary: `Wrote to the customer about ${quote.number}`,
      });
    }
    return { ok: true, data: { id } };
  });
  if (result.ok) await dispatchAfterCommit(`message on ${input.number}`);
  return result;
}

/** The shop withdraws the latest sent revision (it can no longer honour it), saying why; the customer is told in the thread. */
export async function withdrawQuote(ctx: ShopContext, input: { number: string; reason: string }): Promise<ActionResult<{ number: string; revision: number }>> {
  const result = await withShop(ctx.shop.id, async (tx): Promise<ActionResult<{ number: string; revision: number }>> => {
    const quote = await lockVisible(tx, ctx, input.number);
    if (!quote) return NOT_FOUND;
    const next = await move(tx, ctx.shop.id, quote, "withdraw", "staff", ctx.user.id, input.reason);
    if (!next.ok) return conflict(next.reason);
    await writeMessage(tx, ctx, quote, "withdrawal", input.reason);
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "quote.withdraw",
      subjectType: "quote",
      subjectId: quote.number,
      summary: `Withdrew ${quote.number} revision ${quote.currentRevision}: ${input.reason}`,
      changes: { status: { from: quote.status, to: next.to } },
    });
    return { ok: true, data: { number: quote.number, revision: quote.currentRevision } };
  });
  if (result.ok) await dispatchAfterCommit(`withdrawal of ${input.number}`);
  return result;
}

/** States whose quote e-mail may be sent again: the open one, and the accepted one (a copy for the customer's records). */
const RESENDABLE: readonly QuoteStatus[] = ["sent", "accepted"];

/**
 * The shop sends the latest revision's e-mail (with its PDF) to the customer again. One per
 * revision and minute, so a double click sends one.
 */
export async function resendQuoteEmail(
  ctx: ShopContext,
  input: { number: string },
  now: Date = new Date(),
): Promise<ActionResult<{ number: string; revision: number; to: string }>> {
  const result = await withShop(ctx.shop.id, async (tx): Promise<ActionResult<{ number: string; revision: number; to: string }>> => {
    const quote = await lockVisible(tx, ctx, input.number);
    if (!quote) return NOT_FOUND;
    if (!RESENDABLE.includes(quote.status))
      return conflict(`The latest revision is ${quote.status}: there is nothing to send again. Issue a new revision instead.`);
    const [rev, customer] = await Promise.all([getRevisionOf(tx, ctx.shop.id, quote.id, quote.currentRevision), getUserIdentity(tx, quote.customerUserId)]);
    if (!rev || !customer) return NOT_FOUND;
    const dedupeKey = `quote-resend:${rev.id}:${now.toISOString().slice(0, 16)}`;
    const message = { shopId: ctx.shop.id, quoteRevisionId: rev.id, quoteNumber: quote.number, revision: rev.revision, toEmail: customer.email, dedupeKey };
    if (rev.revision === 1) await enqueueQuoteReady(tx, message);
    else await enqueueQuoteUpdated(tx, message);
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "quote.resend",
      subjectType: "quote",
      subjectId: quote.number,
      summary: `Sent ${quote.number} revision ${rev.revision} to ${customer.email} again`,
    });
    return { ok: true, data: { number: quote.number, revision: rev.revision, to: customer.email } };
  });
  if (result.ok) await dispatchAfterCommit(`re-send of ${input.number}`);
  return result;
}

/**
 * The scheduled job: every sent quote whose latest revision's last valid day has passed becomes
 * expired, each in its own shop-scoped transaction under the quote's row lock (a quote accepted
 * meanwhile stays accepted). Answers how many it expired. Bounded per run; the next run takes the rest.
 */
export async function expireDueQuotes(now: Date = new Date()): Promise<number> {
  const today = now.toISOString().slice(0, 10);
  let expired = 0;
  for (const due of await listQuotesPastValidity(today)) {
    const done = await withShop(due.shopId, async (tx) => {
      const quote = await lockQuoteByNumber(tx, due.shopId, due.number);
      return quote ? expireIfDue(tx, due.shopId, quote, now) : false;
    });
    if (done) expired++;
  }
  return expired;
}
