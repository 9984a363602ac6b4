import { listQuotes } from "@/db/queries/quotes";
import { withShopApi } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { limits, requestClient, tooManyRequests } from "@/lib/http/limits";
import { readJsonAs } from "@/lib/http/read-json";
import { createQuoteForApi } from "@/lib/quoting/quote-api";
import { quoteList } from "@/lib/validation/lists";
import { createQuoteRequestSchema, type quoteCreatedResponseSchema } from "@/lib/validation/quote-api";
import type { z } from "zod";
import { createQuote } from "@/lib/api/contracts/quotes";
import { listQuotes as contract } from "@/lib/api/contracts/shops";

/**
 * GET /api/v1/shops/{shop}/quotes — { rows, total, page, size }: a customer's own quotes, or all of
 * the shop's for staff. Takes the same query as the lists (q, status, sort, dir, page, size); a value
 * the list does not take is a 400 naming it.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const { query, issues } = quoteList.parse(new URL(request.url).searchParams);
    if (issues.length > 0) return jsonError(400, "Invalid query.", issues);
    return contract.answer(await listQuotes(ctx.shop.id, ownerScope(ctx, "quote"), query));
  });
}

/**
 * POST /api/v1/shops/{shop}/quotes — `{ requirement, choice: { sku, topology, seriesCount,
 * parallelCount }, idempotencyKey, customerEmail?, notes? }` (lib/validation/quote-api.ts): a
 * signed-in customer for themselves, or staff for a customer they name. 201 `{ number, revision,
 * total }` when quoted at once, 202 `{ requestId, status: "needs-review" }` when it waits for the
 * estimators; the same key and body again answers the same (with `Idempotent-Replayed: true`),
 * another body with that key 409. Rate-limited per client.
 */
export async function POST(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, ["request:create", "quote:issue"], async (ctx) => {
    const gate = await limits.quoteApi.hit(requestClient(request.headers));
    if (!gate.allowed) return tooManyRequests(gate);
    const parsed = await readJsonAs(request, createQuoteRequestSchema);
    if (!parsed.ok) return parsed.response;
    const answer = await createQuoteForApi(ctx, parsed.value);
    const headers = answer.replayed ? { "idempotent-replayed": "true" } : undefined;
    if (answer.status === 201) return createQuote.answer(answer.body as z.input<typeof quoteCreatedResponseSchema>, { headers });
    return Response.json(answer.body, { status: answer.status, headers });
  });
}
