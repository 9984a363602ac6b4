import "server-only";
import { and, eq, inArray, isNull, sql } from "drizzle-orm";
import { db } from "@/db";
import { listActiveCells, listActiveComponents } from "@/db/queries/catalog";
import { getShopSettings } from "@/db/queries/shops";
import { bankRequests, quoteLines, quoteRevisions, quotes, requestAttachments, shopCounters } from "@/db/schema";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/db/schema/settings";
import type { Requirement } from "@/lib/bank";
import type { ActionResult } from "@/lib/auth/guards";
import type { ShopContext } from "@/lib/auth/context";
import { dispatchOutbox, enqueueQuoteReady } from "@/lib/mail/outbox";
import { DEFAULT_PRICING_RULES, tryPriceBank, type BankPrice, type PricingRules } from "@/lib/pricing";
import type { ChooseArrangementInput, ChosenOption } from "@/lib/validation/quote";
import { billFor, findArrangements, type PricedOption } from "./arrangements";
import { checkAutoQuoteLimits } from "./auto-quote-limits";
import { formatQuoteNumber, numberingYear } from "./quote-number";
import { validUntilFrom } from "./validity";

export type CreateQuoteResult = { kind: "quote"; quoteNumber: string } | { kind: "review"; requestId: string };

type Tx = Parameters<Parameters<typeof db.transaction>[0]>[0];

/** The option the customer chose, found again among the options the server computes now. */
export function matchOption<T extends { cell: { sku: string }; topology: string; seriesCount: number; parallelCount: number }>(options: readonly T[], chosen: ChosenOption): T | undefined {
  return options.find((o) => o.cell.sku === chosen.cellSku && o.topology === chosen.topology && o.seriesCount === chosen.seriesCount && o.parallelCount === chosen.parallelCount);
}

/** What an earlier call with the same idempotency key made, if anything. */
async function findEarlier(shopId: string, userId: string, key: string): Promise<ActionResult<CreateQuoteResult> | null> {
  const [quote] = await db
    .select({ number: quotes.number, customerUserId: quotes.customerUserId })
    .from(quotes)
    .where(and(eq(quotes.shopId, shopId), eq(quotes.idempotencyKey, key)))
    .limit(1);
  if (quote) {
    return quote.customerUserId === userId ? { ok: true, data: { kind: "quote", quoteNumber: quote.number } } : { ok: false, code: "conflict", message: "This choice was already submitted." };
  }
  const [request] = await db
    .select({ id: bankRequests.id, customerUserId: bankRequests.customerUserId, status: bankRequests.status })
    .from(bankRequests)
    .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.idempotencyKey, key)))
    .limit(1);
  if (!request) return null;
  if (request.customerUserId !== userId) return { ok: false, code: "conflict", message: "This choice was already submitted." };
  // a quoted request always has its quote (same transaction), so this is the review path
  return { ok: true, data: { kind: "review", requestId: request.id } };
}

/** Links the caller's own unlinked uploads in this shop to the request; others' ids are ignored. */
async function linkAttachments(tx: Tx, shopId: string, userId: string, requestId: string, ids: string[]) {
  if (ids.length === 0) return;
  await tx
    .update(requestAttachments)
    .set({ requestId })
    .where(and(eq(requestAttachments.shopId, shopId), eq(requestAttachments.uploadedByUserId, userId), isNull(requestAttachments.requestId), inArray(requestAttachments.id, ids)));
}

/** The next number of a kind in a shop and year; the upsert row-locks the counter until commit. */
async function nextNumber(tx: Tx, shopId: string, kind: string, year: number): Promise<number> {
  const [row] = await tx
    .insert(shopCounters)
    .values({ shopId, kind, year, value: 1 })
    .onConflictDoUpdate({ target: [shopCounters.shopId, shopCounters.kind, shopCounters.year], set: { value: sql`${sql.raw('"shop_counters"."value"')} + 1` } })
    .returning({ value: shopCounters.value });
  if (!row) throw new Error("counter upsert returned no row");
  return row.value;
}

async function toReview(ctx: ShopContext, input: ChooseArrangementInput, reasons: string[], chosen: PricedOption | ChosenOption | null): Promise<ActionResult<CreateQuoteResult>> {
  const shopId = ctx.shop.id;
  const id = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(bankRequests)
      .values({
        shopId,
        customerUserId: ctx.user.id,
        status: "needs-review",
        requirement: input.requirement as Requirement,
        notes: input.notes,
        reviewReasons: reasons,
        chosenOption: chosen ? (chosen as unknown as Record<string, unknown>) : null,
        idempotencyKey: input.idempotencyKey,
      })
      .onConflictDoNothing()
      .returning({ id: bankRequests.id });
    if (!row) return null;
    await linkAttachments(tx, shopId, ctx.user.id, row.id, input.attachmentIds);
    return row.id;
  });
  if (id === null) return (await findEarlier(shopId, ctx.user.id, input.idempotencyKey)) ?? { ok: false, code: "conflict", message: "This choice was already submitted." };
  return { ok: true, data: { kind: "review", requestId: id } };
}

function isUniqueViolation(error: unknown): boolean {
  let e: unknown = error;
  for (let i = 0; i < 4 && e && typeof e === "object"; i++) {
    if ((e as { code?: unknown }).code === "23505") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/**
 * The customer chose an arrangement. The server searches again (the client's figures are never
 * trusted) and either issues quote revision 1 — request, number, quote, frozen revision, lines,
 * attachments and the outbox row in one transaction — or records the request for review by the
 * estimators. A repeated idempotency key answers what the first call made.
 */
export async function createQuoteFromChoice(ctx: ShopContext, input: ChooseArrangementInput, now: Date = new Date()): Promise<ActionResult<CreateQuoteResult>> {
  const shopId = ctx.shop.id;
  const earlier = await findEarlier(shopId, ctx.user.id, input.idempotencyKey);
  if (earlier) return earlier;

  const requirement = input.requirement as Requirement;
  const [settings, found] = await Promise.all([getShopSettings(shopId), findArrangements(shopId, requirement)]);
  const limits = settings?.autoQuoteLimits ?? DEFAULT_AUTO_QUOTE_LIMITS;
  const rules: PricingRules = settings?.pricingRules ?? DEFAULT_PRICING_RULES;

  if (found.options.length === 0) {
    return toReview(ctx, input, ["No arrangement from the catalog fits this requirement.", ...found.reasons], input.option ?? null);
  }
  if (!input.option) return toReview(ctx, input, ["The customer asked for a review instead of choosing an option."], null);
  const option = matchOption(found.options, input.option);
  if (!option) return toReview(ctx, input, ["The chosen option is no longer offered by the catalog."], input.option);
  const reasons = checkAutoQuoteLimits({ maxVoltage: requirement.maxVoltage, storedEnergy: option.storedEnergy, cellCount: option.cellCount }, limits);
  if (option.price === null) reasons.push("The chosen option could not be priced automatically.");
  if (reasons.length > 0) return toReview(ctx, input, reasons, option);

  // the full price build-up for the frozen revision, from the same rows the search used
  const [cells, components] = await Promise.all([listActiveCells(shopId), listActiveComponents(shopId)]);
  const cell = cells.find((c) => c.sku === option.cell.sku);
  if (!cell) return toReview(ctx, input, ["The chosen cell was withdrawn from the catalog."], option);
  const boards = components.filter((c) => c.kind === "balancing-board");
  const quantity = requirement.quantity ?? 1;
  const priced = tryPriceBank(billFor({ ...option, cellId: cell.id }, cell, boards, quantity), rules);
  if (!priced.ok) return toReview(ctx, input, [`The chosen option could not be priced automatically: ${priced.message}`], option);
  const price: BankPrice = priced.data;
  const year = numberingYear(now);
  const validUntil = validUntilFrom(now, rules.quoteValidityDays);

  let made: { number: string } | null;
  try {
    made = await db.transaction(async (tx) => {
      const [request] = await tx
        .insert(bankRequests)
        .values({ shopId, customerUserId: ctx.user.id, status: "quoted", requirement, notes: input.notes, chosenOption: option as unknown as Record<string, unknown>, idempotencyKey: input.idempotencyKey })
        .onConflictDoNothing()
        .returning({ id: bankRequests.id });
      if (!request) return null; // a concurrent call with the same key got here first
      await linkAttachments(tx, shopId, ctx.user.id, request.id, input.attachmentIds);
      const number = formatQuoteNumber(year, await nextNumber(tx, shopId, "quote", year));
      const [quote] = await tx
        .insert(quotes)
        .values({ shopId, requestId: request.id, customerUserId: ctx.user.id, number, idempotencyKey: input.idempotencyKey })
        .returning({ id: quotes.id });
      if (!quote) throw new Error("quote insert returned no row");
      const [revision] = await tx
        .insert(quoteRevisions)
        .values({
          shopId,
          quoteId: quote.id,
          revision: 1,
          requirement,
          arrangement: option as unknown as Record<string, unknown>,
          cell: JSON.parse(JSON.stringify(cell)) as Record<string, unknown>,
          pricing: price as unknown as Record<string, unknown>,
          currency: price.currency,
          quantity: price.quantity,
          subtotal: price.subtotal,
          tax: price.tax,
          total: price.total,
          validUntil,
          createdByUserId: ctx.user.id,
        })
        .returning({ id: quoteRevisions.id });
      if (!revision) throw new Error("revision insert returned no row");
      if (price.lines.length > 0) {
        await tx.insert(quoteLines).values(
          price.lines.map((line, i) => ({
            shopId,
            revisionId: revision.id,
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
      await enqueueQuoteReady(tx, { shopId, quoteRevisionId: revision.id, quoteNumber: number, revision: 1, toEmail: ctx.user.email });
      return { number };
    });
  } catch (error) {
    if (!isUniqueViolation(error)) throw error;
    made = null;
  }
  if (made === null) return (await findEarlier(shopId, ctx.user.id, input.idempotencyKey)) ?? { ok: false, code: "conflict", message: "This choice was already submitted." };

  try {
    await dispatchOutbox();
  } catch (error) {
    // the row waits in the outbox; the queue's sweep delivers it later
    console.error("dispatchOutbox failed after quote", made.number, error);
  }
  return { ok: true, data: { kind: "quote", quoteNumber: made.number } };
}
