"use server";
import { headers } from "next/headers";
import { loadShopCatalog } from "@/db/queries/catalog";
import { listDatasheetSkus } from "@/db/queries/catalog-edit";
import { getShopBySlug } from "@/db/queries/shops";
import { invalidResult, refusedResult, shopAction, type ActionResult } from "@/lib/auth/guards";
import type { DesignFactors, Requirement } from "@/lib/bank";
import { limits, requestClient } from "@/lib/http/limits";
import { memoizedSearch } from "@/lib/quoting/search-memo";
import type { PricedOption } from "@/lib/quoting/types";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { arrangementRequestSchema } from "@/lib/validation/bank";
import { chooseArrangementSchema } from "@/lib/validation/quote";
import { requestFormSchema } from "@/lib/validation/request-form-schema";

export interface ExploreResult {
  /** the requirement in SI units, as the server read the form */
  requirement: Requirement & { quantity: number };
  notes: string;
  currency: string;
  designFactors: DesignFactors;
  options: PricedOption[];
  /** when no option fits: what ruled each family out */
  reasons: string[];
  /** SKUs of the shown options' cells that have a datasheet to download */
  datasheets: string[];
  /** how long a quote issued from this search stays valid (the shop's pricing rules) */
  quoteValidityDays: number;
}

/**
 * Open to visitors (no sign-in): the request form's values, read with the form's own schema,
 * searched against the shop's active catalog and priced by its rules.
 */
export async function exploreArrangements(shopSlug: string, input: unknown): Promise<ActionResult<ExploreResult>> {
  // the same budget per client as the public arrangements endpoint: a search is not free
  const gate = await limits.storefrontSearch.hit(requestClient(await headers()));
  if (!gate.allowed) return { ok: false, code: "rate-limited", message: `Too many searches; try again in ${gate.retryAfterSeconds} s.` };
  const shop = await getShopBySlug(String(shopSlug));
  if (!shop) return refusedResult("no-shop");
  const parsed = requestFormSchema.safeParse(input);
  if (!parsed.success) return invalidResult(parsed.error);
  // the engine's request schema is the last word on what a requirement may be
  const checked = arrangementRequestSchema.safeParse(parsed.data.requirement);
  if (!checked.success) return invalidResult(checked.error);
  const requirement = { ...parsed.data.requirement, quantity: checked.data.quantity };
  const [catalog, datasheetSkus] = await Promise.all([loadShopCatalog(shop.id, shop.catalogVersion), listDatasheetSkus(shop.id)]);
  const result = memoizedSearch(shop.id, shop.catalogVersion, catalog, requirement);
  const shownSkus = new Set(result.options.map((o) => o.cell.sku));
  return {
    ok: true,
    data: {
      requirement,
      notes: parsed.data.notes,
      currency: result.currency,
      designFactors: result.designFactors,
      options: result.options,
      reasons: result.options.length === 0 ? result.reasons : [],
      datasheets: datasheetSkus.filter((sku) => shownSkus.has(sku)),
      quoteValidityDays: catalog.rules.quoteValidityDays,
    },
  };
}

/**
 * A signed-in customer chooses an arrangement: the server re-runs the search and either issues a
 * quote or sends the request to the shop's estimators (no option, or beyond the auto-quote limits).
 */
export async function chooseArrangement(shopSlug: string, input: unknown) {
  return choose(shopSlug, input);
}

const choose = shopAction(chooseArrangementSchema, "request:create", (ctx, input) => createQuoteFromChoice(ctx, input));
