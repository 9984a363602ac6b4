import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { loadShopCatalog } from "@/db/queries/catalog";
import { nextShopNumber } from "@/db/queries/counters";
import {
  deleteQuoteDraft,
  getRequestForReview,
  getRevisionOf,
  insertQuoteMessage,
  listRetiredCells,
  lockQuoteOfRequest,
  recordQuoteMove,
  setCurrentRevision,
  setRequestStatus,
} from "@/db/queries/quote-life";
import { insertQuote, insertQuoteRevision } from "@/db/queries/quotes";
import { recordShopEvent } from "@/db/queries/shop-events";
import { isUniqueViolation, withShop } from "@/db/tx";
import type { ShopContext } from "@/lib/auth/context";
import type { ActionResult } from "@/lib/auth/guards";
import { dispatchAfterCommit, enqueueQuoteReady } from "@/lib/mail/outbox";
import { enqueueQuoteUpdated } from "@/lib/mail/quote-notices";
import { formatMoney } from "@/lib/pricing";
import type { IssueRevisionInput } from "@/lib/validation/workbench";
import { composeRevision, resolveCustomBank, resolveEngineOption, type ResolveResult } from "./compose-revision";
import { formatQuoteNumber, numberingYear } from "./quote-number";
import { mayRevise, nextState } from "./quote-states";
import { effectiveFactors, searchWithOverrides } from "./review-search";
import { validUntilFrom } from "./validity";

export interface IssuedRevision {
  number: string;
  revision: number;
}

const conflict = (message: string) => ({ ok: false as const, code: "conflict" as const, message });

/**
 * The estimator issues the workbench's draft as a new numbered revision: revision 1 of a new quote
 * for a request under review, or the next revision of the request's quote (the open one is
 * superseded). The server searches and prices again from the catalog as it is now; the revision
 * freezes the bank (option or custom tree, with every override), its cost build-up and the sell
 * sheet. In one transaction under the quote's row lock: the revision, the moves, the request's
 * status, the note in the thread, the customer's e-mail, the `quote.issued` shop event and the
 * audit entry. `basedOnRevision` is the latest revision the estimator saw: when someone issued
 * another meanwhile the call is refused and nothing changes.
 */
export async function issueQuoteRevision(ctx: ShopContext, input: IssueRevisionInput, now: Date = new Date()): Promise<ActionResult<IssuedRevision>> {
  const shopId = ctx.shop.id;
  const found = await getRequestForReview(shopId, input.requestId);
  if (!found) return { ok: false, code: "not-found", message: "No such request." };
  const request = found.request;
  const [catalog, retired] = await Promise.all([loadShopCatalog(shopId), listRetiredCells(shopId)]);
  const { draft } = input;
  const overrides = draft.bank.overrides;
  const requirement = request.requirement;
  const quantity = requirement.quantity ?? 1;
  const retiredSkus = new Set(retired.map((c) => c.sku));

  let resolved: ResolveResult;
  if (draft.bank.kind === "engine") {
    if (!draft.bank.choice)
      return { ok: false, code: "invalid", message: "Choose one of the engine's options.", fieldErrors: { bank: ["Choose one of the engine's options."] } };
    const search = searchWithOverrides(catalog, retired, requirement, overrides);
    resolved = resolveEngineOption(search, draft.bank.choice, {
      cells: [...catalog.cells, ...retired],
      retiredSkus,
      components: catalog.components,
      rules: catalog.rules,
      shopFactors: catalog.factors,
      overrides,
      quantity,
    });
  } else {
    resolved = resolveCustomBank(draft.bank.network, {
      cells: [...catalog.cells, ...retired],
      retiredSkus,
      components: catalog.components,
      rules: catalog.rules,
      factors: effectiveFactors(catalog.factors, overrides),
      shopFactors: catalog.factors,
      overrides,
      requirement,
    });
  }
  if (!resolved.ok) {
    const details = resolved.issues?.map((i) => (i.at ? `${i.at}: ${i.message}` : i.message)) ?? [];
    return { ok: false, code: "invalid", message: resolved.message, fieldErrors: { bank: [resolved.message, ...details] } };
  }
  const bank = resolved.bank;
  const composed = composeRevision(bank, draft, catalog.rules, quantity);
  if (!composed.ok) return { ok: false, code: "invalid", message: composed.message, fieldErrors: composed.fieldErrors };
  const { sheet, option } = composed;
  const validUntil = validUntilFrom(now, draft.validityDays);

  let made: ActionResult<IssuedRevision>;
  try {
    made = await withShop(shopId, async (tx): Promise<ActionResult<IssuedRevision>> => {
      const existing = await lockQuoteOfRequest(tx, shopId, request.id);
      let quoteId: string;
      let number: string;
      let revision: number;
      let previousTotal: string | null = null;
      if (existing) {
        if (existing.currentRevision !== input.basedOnRevision) {
          return conflict(
            `Revision ${existing.currentRevision} of ${existing.number} was issued meanwhile: reload the workbench to see it (your draft is kept).`,
          );
        }
        if (!mayRevise(existing.status)) return conflict(`${existing.number} is ${existing.status}: it cannot be revised. Make a new quote instead.`);
        const superseded = nextState(existing.status, "supersede", "system");
        if (superseded.ok) {
          await recordQuoteMove(
            tx,
            shopId,
            {
              quoteId: existing.id,
              revision: existing.currentRevision,
              fromStatus: existing.status,
              toStatus: superseded.to,
              actor: "system",
              actorUserId: null,
            },
            existing,
          );
        }
        previousTotal = (await getRevisionOf(tx, shopId, existing.id, existing.currentRevision))?.total ?? null;
        ({ id: quoteId, number } = existing);
        revision = existing.currentRevision + 1;
      } else {
        if (input.basedOnRevision !== 0) return conflict("This request's quote is gone: reload the workbench.");
        const year = numberingYear(now);
        number = formatQuoteNumber(year, await nextShopNumber(tx, shopId, "quote", year));
        quoteId = await insertQuote(tx, shopId, {
          requestId: request.id,
          customerUserId: request.customerUserId,
          number,
          idempotencyKey: request.idempotencyKey ?? `review:${request.id}`,
        });
        revision = 1;
      }
      const revisionId = await insertQuoteRevision(tx, shopId, {
        quoteId,
        revision,
        frozen: { requirement, arrangement: option, cell: bank.cell, pricing: bank.cost },
        sheet,
        design: bank.design,
        note: draft.note.trim(),
        validUntil,
        createdByUserId: ctx.user.id,
      });
      await setCurrentRevision(tx, shopId, quoteId, revision, "sent");
      await recordQuoteMove(
        tx,
        shopId,
        { quoteId, revision, fromStatus: null, toStatus: "sent", actor: "staff", actorUserId: ctx.user.id },
        { currentRevision: revision },
      );
      await setRequestStatus(tx, shopId, request.id, "quoted");
      if (draft.note.trim() !== "") {
        // the note travels in the "quote updated" e-mail; in the thread it is not sent again
        await insertQuoteMessage(tx, shopId, { quoteId, revision, authorUserId: ctx.user.id, side: "shop", kind: "revision-note", body: draft.note.trim() });
      }
      const mail = { shopId, quoteRevisionId: revisionId, quoteNumber: number, revision, toEmail: found.customerEmail };
      if (revision === 1) await enqueueQuoteReady(tx, mail);
      else await enqueueQuoteUpdated(tx, mail);
      await recordShopEvent(tx, shopId, "quote.issued", { number, revision, total: { amount: sheet.total, currency: sheet.currency }, validUntil });
      const money = (a: string) => formatMoney(a, sheet.currency);
      await recordAudit(tx, shopId, {
        actorUserId: ctx.user.id,
        action: "quote.issue",
        subjectType: "quote",
        subjectId: number,
        summary: `Issued ${number} revision ${revision}, ${money(sheet.total)}${previousTotal ? ` (was ${money(previousTotal)})` : ""}`,
        changes: {
          total: { from: previousTotal, to: sheet.total },
          design: { from: null, to: bank.design.source === "custom" ? "custom bank" : "engine option" },
          ...("notes" in bank.design && bank.design.notes.length > 0 ? { overrides: { from: null, to: bank.design.notes } } : {}),
          ...(sheet.discount ? { discount: { from: null, to: sheet.discount } } : {}),
        },
      });
      await deleteQuoteDraft(tx, shopId, request.id);
      return { ok: true, data: { number, revision } };
    });
  } catch (error) {
    // two estimators issuing the first revision of one request at once: the other one won
    if (!isUniqueViolation(error)) throw error;
    made = conflict("Another revision was issued for this request at the same moment: reload the workbench (your draft is kept).");
  }
  if (made.ok) await dispatchAfterCommit(`${made.data.number} revision ${made.data.revision}`);
  return made;
}
