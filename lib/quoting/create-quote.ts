import "server-only";
import { linkAttachmentsToRequest } from "@/db/queries/attachments";
import { loadShopCatalog } from "@/db/queries/catalog";
import { nextShopNumber } from "@/db/queries/counters";
import { getQuoteByIdempotencyKey, insertQuote, insertQuoteRevision } from "@/db/queries/quotes";
import { listStaffRecipients, recordQuoteMove } from "@/db/queries/quote-life";
import { getRequestByIdempotencyKey, insertBankRequest } from "@/db/queries/requests";
import { recordShopEvent } from "@/db/queries/shop-events";
import { isUniqueViolation, withShop } from "@/db/tx";
import type { Requirement } from "@/lib/bank";
import type { ActionResult } from "@/lib/auth/guards";
import type { ShopContext } from "@/lib/auth/context";
import { dispatchAfterCommit, enqueueQuoteReady } from "@/lib/mail/outbox";
import { enqueueReviewNeeded } from "@/lib/mail/quote-notices";
import type { ChooseArrangementInput } from "@/lib/validation/quote";
import { checkAutoQuoteLimits } from "./auto-quote-limits";
import { indexOfChosen, searchPricedOptions } from "./priced-search";
import { formatQuoteNumber, numberingYear } from "./quote-number";
import { revisionSheet } from "./revision-sheet";
import type { ChosenRecord } from "./types";
import { validUntilFrom } from "./validity";

export type CreateQuoteResult = { kind: "quote"; quoteNumber: string } | { kind: "review"; requestId: string };

const ALREADY_SUBMITTED: ActionResult<CreateQuoteResult> = { ok: false, code: "conflict", message: "This choice was already submitted." };

/**
 * What an earlier call with the same idempotency key made, if anything. The request is read before
 * the quote: both commit in one transaction, so once the request is visible its quote is too (read
 * the other way round, a call could miss a quote that committed between the two reads).
 */
async function findEarlier(shopId: string, userId: string, key: string): Promise<ActionResult<CreateQuoteResult> | null> {
  const request = await getRequestByIdempotencyKey(shopId, key);
  if (!request) return null;
  if (request.customerUserId !== userId) return ALREADY_SUBMITTED;
  const quote = await getQuoteByIdempotencyKey(shopId, key);
  if (quote) return { ok: true, data: { kind: "quote", quoteNumber: quote.number } };
  return { ok: true, data: { kind: "review", requestId: request.id } };
}

async function toReview(
  ctx: ShopContext,
  input: ChooseArrangementInput,
  reasons: string[],
  chosen: ChosenRecord | null,
): Promise<ActionResult<CreateQuoteResult>> {
  const shopId = ctx.shop.id;
  const id = await withShop(shopId, async (tx) => {
    const requestId = await insertBankRequest(tx, shopId, {
      customerUserId: ctx.user.id,
      status: "needs-review",
      requirement: input.requirement as Requirement,
      notes: input.notes,
      reviewReasons: reasons,
      chosenOption: chosen,
      idempotencyKey: input.idempotencyKey,
    });
    if (requestId) {
      await linkAttachmentsToRequest(tx, shopId, ctx.user.id, requestId, input.attachmentIds);
      await enqueueReviewNeeded(tx, { shopId, requestId, customerName: ctx.user.name, recipients: await listStaffRecipients(tx, shopId) });
    }
    return requestId;
  });
  if (id === null) return (await findEarlier(shopId, ctx.user.id, input.idempotencyKey)) ?? ALREADY_SUBMITTED;
  await dispatchAfterCommit(`review ${id}`);
  return { ok: true, data: { kind: "review", requestId: id } };
}

/**
 * The customer chose an arrangement. The server loads the catalog once and searches again (the
 * client's figures are never trusted), then either issues quote revision 1 — request, number,
 * quote, frozen revision and lines exactly as that search priced the option, attachments and the
 * outbox row in one transaction — or records the request for review by the estimators. A
 * repeated idempotency key answers what the first call made.
 */
export async function createQuoteFromChoice(ctx: ShopContext, input: ChooseArrangementInput, now: Date = new Date()): Promise<ActionResult<CreateQuoteResult>> {
  const shopId = ctx.shop.id;
  const earlier = await findEarlier(shopId, ctx.user.id, input.idempotencyKey);
  if (earlier) return earlier;

  const requirement = input.requirement as Requirement;
  const catalog = await loadShopCatalog(shopId);
  const found = searchPricedOptions(catalog, requirement);

  if (found.options.length === 0) {
    return toReview(ctx, input, ["No arrangement from the catalog fits this requirement.", ...found.reasons], input.option ?? null);
  }
  if (!input.option) return toReview(ctx, input, ["The customer asked for a review instead of choosing an option."], null);
  const i = indexOfChosen(found.options, input.option);
  const option = found.options[i];
  const record = found.records[i];
  if (!option || !record) return toReview(ctx, input, ["The chosen option is no longer offered by the catalog."], input.option);
  const reasons = checkAutoQuoteLimits(
    { maxVoltage: requirement.maxVoltage, storedEnergy: option.storedEnergy, cellCount: option.cellCount },
    catalog.autoQuoteLimits,
  );
  if (record.price === null) reasons.push("The chosen option could not be priced automatically.");
  if (reasons.length > 0 || record.price === null) return toReview(ctx, input, reasons, option);
  const pricing = record.price;
  const year = numberingYear(now);
  const validUntil = validUntilFrom(now, catalog.rules.quoteValidityDays);

  let made: { number: string } | null;
  try {
    // the rules' own price, as the customer reads it (the same lines a revision without a sheet shows)
    const sheet = revisionSheet({ sheet: null, pricing, arrangement: option, design: { source: "customer-choice" } });
    made = await withShop(shopId, async (tx) => {
      const requestId = await insertBankRequest(tx, shopId, {
        customerUserId: ctx.user.id,
        status: "quoted",
        requirement,
        notes: input.notes,
        chosenOption: option,
        idempotencyKey: input.idempotencyKey,
      });
      if (!requestId) return null; // a concurrent call with the same key got here first
      await linkAttachmentsToRequest(tx, shopId, ctx.user.id, requestId, input.attachmentIds);
      const number = formatQuoteNumber(year, await nextShopNumber(tx, shopId, "quote", year));
      const quoteId = await insertQuote(tx, shopId, { requestId, customerUserId: ctx.user.id, number, idempotencyKey: input.idempotencyKey });
      const revisionId = await insertQuoteRevision(tx, shopId, {
        quoteId,
        revision: 1,
        frozen: { requirement, arrangement: option, cell: record.cell, pricing },
        sheet,
        design: { source: "customer-choice" },
        validUntil,
        createdByUserId: ctx.user.id,
      });
      await recordQuoteMove(
        tx,
        shopId,
        { quoteId, revision: 1, fromStatus: null, toStatus: "sent", actor: "system", actorUserId: null },
        { currentRevision: 1 },
      );
      await recordShopEvent(tx, shopId, "quote.issued", { number, revision: 1, total: { amount: sheet.total, currency: sheet.currency }, validUntil });
      await enqueueQuoteReady(tx, { shopId, quoteRevisionId: revisionId, quoteNumber: number, revision: 1, toEmail: ctx.user.email });
      return { number };
    });
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    made = null;
  }
  if (made === null) return (await findEarlier(shopId, ctx.user.id, input.idempotencyKey)) ?? ALREADY_SUBMITTED;

  await dispatchAfterCommit(`quote ${made.number}`);
  return { ok: true, data: { kind: "quote", quoteNumber: made.number } };
}
