"use server";
import { revalidatePath } from "next/cache";
import { loadShopCatalog } from "@/db/queries/catalog";
import { getRequestForReview, listRetiredCells, saveQuoteDraft } from "@/db/queries/quote-life";
import { shopAction, type ActionResult } from "@/lib/auth/guards";
import type { BankPrice } from "@/lib/pricing";
import { issueQuoteRevision } from "@/lib/quoting/issue-revision";
import { searchWithOverrides } from "@/lib/quoting/review-search";
import type { PricedOption } from "@/lib/quoting/types";
import { exploreOptionsSchema, issueRevisionSchema, saveDraftSchema } from "@/lib/validation/workbench";

/** The estimator's workbench: the engine's options under their overrides, saving the draft, issuing it as a revision. */

export interface ReviewOptions {
  options: PricedOption[];
  /** the shop's cost build-up behind each option (staff only), null where the rules cannot price it */
  costs: (BankPrice | null)[];
  reasons: string[];
}

const explore = shopAction(exploreOptionsSchema, "request:review", async (ctx, input): Promise<ActionResult<ReviewOptions>> => {
  const request = await getRequestForReview(ctx.shop.id, input.requestId);
  if (!request) return { ok: false, code: "not-found", message: "No such request." };
  const [catalog, retired] = await Promise.all([loadShopCatalog(ctx.shop.id), listRetiredCells(ctx.shop.id)]);
  const found = searchWithOverrides(catalog, retired, request.request.requirement, input.overrides);
  return { ok: true, data: { options: found.options, costs: found.records.map((r) => r.price), reasons: found.options.length === 0 ? found.reasons : [] } };
});

export async function exploreReviewOptions(shopSlug: string, input: unknown) {
  return explore(shopSlug, input);
}

const save = shopAction(saveDraftSchema, "request:review", async (ctx, input): Promise<ActionResult<{ version: number }>> => {
  if (!(await getRequestForReview(ctx.shop.id, input.requestId))) return { ok: false, code: "not-found", message: "No such request." };
  const version = await saveQuoteDraft(ctx.shop.id, input.requestId, input.draft, input.version, ctx.user.id);
  if (version === null)
    return { ok: false, code: "conflict", message: "Someone else saved this draft meanwhile: reload to see theirs (copy anything of yours first)." };
  return { ok: true, data: { version } };
});

export async function saveReviewDraft(shopSlug: string, input: unknown) {
  return save(shopSlug, input);
}

const issue = shopAction(issueRevisionSchema, "request:review", async (ctx, input) => {
  const r = await issueQuoteRevision(ctx, input);
  if (r.ok) {
    revalidatePath(`/desk/${ctx.shop.slug}/requests`);
    revalidatePath(`/desk/${ctx.shop.slug}/quotes/${r.data.number}`);
  }
  return r;
});

export async function issueRevision(shopSlug: string, input: unknown) {
  return issue(shopSlug, input);
}
