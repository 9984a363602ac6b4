import "server-only";
import { findShopCustomerByEmail, getQuoteWithRevisions } from "@/db/queries/quote-life";
import { getRequest, getRequestByIdempotencyKey } from "@/db/queries/requests";
import type { QuoteRevisionRow } from "@/db/schema";
import type { ShopContext } from "@/lib/auth/context";
import { maySee } from "@/lib/auth/ownership";
import { can } from "@/lib/auth/permissions";
import type { CreateQuoteRequest, QuoteRevisionResponse } from "@/lib/validation/quote-api";
import { createQuoteFromChoice } from "./create-quote";
import { isQuoteNumber } from "./quote-number";
import { revisionStates } from "./quote-states";
import { revisionSheet } from "./revision-sheet";
import type { ChosenRecord } from "./types";

/** A JSON answer: its status, its body and whether it repeats an earlier call with the same key. */
export interface ApiAnswer {
  status: number;
  body: unknown;
  replayed?: boolean;
}

const error = (status: number, message: string, issues?: { path: string; message: string }[]): ApiAnswer => ({
  status,
  body: issues ? { error: message, issues } : { error: message },
});

/** Objects with their keys sorted, so two equal bodies compare equal whatever order their keys came in. */
function canonical(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) =>
    v && typeof v === "object" && !Array.isArray(v) ? Object.fromEntries(Object.entries(v as Record<string, unknown>).sort(([a], [b]) => (a < b ? -1 : 1))) : v,
  );
}

function chosenIdentity(c: ChosenRecord | null): string {
  if (!c) return "";
  return "cellSku" in c ? `${c.cellSku}|${c.topology}|${c.seriesCount}|${c.parallelCount}` : `${c.cell.sku}|${c.topology}|${c.seriesCount}|${c.parallelCount}`;
}

/**
 * POST /api/v1/shops/{shop}/quotes: the storefront's quoting path for programs. A customer quotes
 * for themselves; staff name one of the shop's customers. The same idempotency key with the same
 * body answers what the first call made (marked as a replay); with another body, 409.
 */
export async function createQuoteForApi(ctx: ShopContext, input: CreateQuoteRequest): Promise<ApiAnswer> {
  const staff = can(ctx.role, "quote:issue");
  let customer = ctx.user;
  if (staff) {
    if (!input.customerEmail)
      return error(400, "Name the customer the quote is for.", [{ path: "customerEmail", message: "Required when staff make a quote" }]);
    const found = await findShopCustomerByEmail(ctx.shop.id, input.customerEmail);
    if (!found) return error(400, "No customer of this shop has that e-mail address.", [{ path: "customerEmail", message: "Not a customer of this shop" }]);
    customer = found;
  } else if (input.customerEmail && input.customerEmail !== ctx.user.email.toLowerCase()) {
    return error(403, "Customers make quotes for themselves only.");
  }

  const earlier = await getRequestByIdempotencyKey(ctx.shop.id, input.idempotencyKey);
  if (earlier) {
    const row = await getRequest(ctx.shop.id, earlier.id);
    const same =
      row !== null &&
      row.customerUserId === customer.id &&
      canonical(row.requirement) === canonical(input.requirement) &&
      row.notes === input.notes &&
      chosenIdentity(row.chosenOption) === `${input.choice.sku}|${input.choice.topology}|${input.choice.seriesCount}|${input.choice.parallelCount}`;
    if (!same) return error(409, "This idempotency key was used with another body; use a new key for a new quote.");
  }

  const result = await createQuoteFromChoice(
    { user: customer, shop: ctx.shop, role: "customer" },
    {
      idempotencyKey: input.idempotencyKey,
      requirement: input.requirement,
      notes: input.notes,
      attachmentIds: [],
      option: { cellSku: input.choice.sku, topology: input.choice.topology, seriesCount: input.choice.seriesCount, parallelCount: input.choice.parallelCount },
    },
  );
  if (!result.ok) return error(result.code === "conflict" ? 409 : 400, result.message ?? "The quote could not be made.");
  const replayed = earlier !== null;
  if (result.data.kind === "review") return { status: 202, body: { requestId: result.data.requestId, status: "needs-review" }, replayed };
  const made = await getQuoteWithRevisions(ctx.shop.id, result.data.quoteNumber);
  const latest = made?.revisions.at(-1);
  if (!made || !latest) return error(500, "The quote was made but could not be read back.");
  return {
    status: 201,
    body: { number: made.quote.number, revision: latest.revision, total: { amount: latest.sheet?.total ?? latest.total, currency: latest.currency } },
    replayed,
  };
}

function revisionBody(number: string, rev: QuoteRevisionRow): Omit<QuoteRevisionResponse, "state" | "quoteState" | "latestRevision" | "revisions"> {
  const o = rev.arrangement;
  const sheet = revisionSheet(rev);
  const money = (amount: string) => ({ amount, currency: sheet.currency });
  return {
    number,
    revision: rev.revision,
    issuedAt: rev.createdAt.toISOString(),
    validUntil: rev.validUntil,
    requirement: rev.requirement as unknown as Record<string, unknown>,
    arrangement: {
      source: rev.design?.source ?? "customer-choice",
      topology: o.topology,
      seriesCount: o.seriesCount,
      parallelCount: o.parallelCount,
      cellCount: o.cellCount,
      cell: { sku: o.cell.sku, technology: o.cell.technology, capacitance: o.cell.capacitance, ratedVoltage: o.cell.ratedVoltage },
      capacitance: o.capacitance,
      maxVoltage: o.maxVoltage,
      storedEnergy: o.storedEnergy,
      usableEnergy: o.usableEnergy,
      esr: o.esr,
      mass: o.mass,
      volume: o.volume,
      worstCellVoltage: o.worstCellVoltage,
      leadTimeDays: o.leadTimeDays,
      ...(rev.design?.source === "custom" ? { network: rev.design.network } : {}),
    },
    lines: sheet.lines.map((l) => ({
      code: l.code,
      description: l.description,
      quantity: l.quantity,
      unit: l.unit,
      unitPrice: money(l.unitPrice),
      amount: money(l.amount),
    })),
    totals: {
      lines: money(sheet.lineTotal),
      quantityDiscount: money(sheet.breakDiscount),
      discount: sheet.discount ? { amount: money(sheet.discount.amount), reason: sheet.discount.reason } : null,
      subtotal: money(sheet.subtotal),
      tax: { ratePct: sheet.taxPct, amount: money(sheet.tax) },
      total: money(sheet.total),
    },
    cautions: o.cautions ?? [],
  };
}

/**
 * GET …/quotes/{number} (the latest revision) and GET …/quotes/{number}/revisions/{n}: for the
 * quote's own customer and the shop's staff; anyone else in the shop gets 404.
 */
export async function quoteRevisionForApi(ctx: ShopContext, number: string, revision?: number): Promise<ApiAnswer> {
  const found = isQuoteNumber(number) ? await getQuoteWithRevisions(ctx.shop.id, number) : null;
  if (!found || !maySee(ctx, "quote", found.quote.customerUserId)) return error(404, "No such quote.");
  const wanted = revision ?? found.quote.currentRevision;
  const rev = found.revisions.find((r) => r.revision === wanted);
  if (!rev) return error(404, `Quote ${number} has no revision ${wanted}.`);
  const states = revisionStates(found.moves);
  const body: QuoteRevisionResponse = {
    ...revisionBody(found.quote.number, rev),
    state: states.get(rev.revision) ?? "sent",
    quoteState: found.quote.status,
    latestRevision: found.quote.currentRevision,
    revisions: found.revisions.map((r) => ({ revision: r.revision, state: states.get(r.revision) ?? "sent", issuedAt: r.createdAt.toISOString() })),
  };
  return { status: 200, body };
}
