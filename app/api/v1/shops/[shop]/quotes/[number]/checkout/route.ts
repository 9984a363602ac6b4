import { getQuoteByNumber } from "@/db/queries/quotes";
import { getCheckoutState } from "@/db/queries/payments";
import { withShopApi } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { jsonError } from "@/lib/http/json-error";
import { readJsonAs } from "@/lib/http/read-json";
import { openCheckout } from "@/lib/payments/checkout";
import { moneyString } from "@/lib/pricing";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { checkoutState, startCheckout } from "@/lib/api/contracts/orders";
import { checkoutRequestSchema, checkoutStateQuerySchema } from "@/lib/validation/orders";

type Params = { params: Promise<{ shop: string; number: string }> };

const STATUS = { "not-found": 404, conflict: 409, invalid: 400, forbidden: 403, unauthenticated: 401, "rate-limited": 429 } as const;

/**
 * POST /api/v1/shops/{shop}/quotes/{number}/checkout — body `{ revision, kind }` (kind: full,
 * deposit or balance): the quote's own customer gets `{ url, sessionId }` of a Checkout Session for
 * the accepted revision (the same open one again while it lasts). Another customer's quote is 404;
 * a superseded, expired, unaccepted or paid quote 409 with the reason.
 */
export async function POST(request: Request, { params }: Params) {
  const { shop, number } = await params;
  return withShopApi(request, shop, "quote:accept", async (ctx) => {
    const parsed = await readJsonAs(request, checkoutRequestSchema, 16 * 1024);
    if (!parsed.ok) return parsed.response;
    const r = await openCheckout(ctx, { ...parsed.value, number });
    if (!r.ok)
      return jsonError(
        STATUS[r.code],
        r.message ?? "Refused.",
        r.fieldErrors ? Object.entries(r.fieldErrors).map(([path, [message = ""] = []]) => ({ path, message })) : undefined,
      );
    return startCheckout.answer(r.data);
  });
}

/**
 * GET /api/v1/shops/{shop}/quotes/{number}/checkout?session=cs_… — where one checkout of the quote
 * stands (open, paid, expired) and its order's number once the payment is confirmed: what the
 * success page polls until the webhook lands. The quote's customer and the shop's staff; others 404.
 */
export async function GET(request: Request, { params }: Params) {
  const { shop, number } = await params;
  return withShopApi(request, shop, reads("quote"), async (ctx) => {
    const query = checkoutStateQuerySchema.safeParse({ session: new URL(request.url).searchParams.get("session") ?? "" });
    if (!query.success)
      return jsonError(
        400,
        "Invalid query.",
        query.error.issues.map((i) => ({ path: i.path.join("."), message: i.message })),
      );
    const quote = isQuoteNumber(number) ? await getQuoteByNumber(ctx.shop.id, number) : null;
    if (!quote || !maySee(ctx, "quote", quote.customerUserId)) return jsonError(404, "No such quote.");
    const state = await getCheckoutState(ctx.shop.id, quote.id, query.data.session);
    if (!state) return jsonError(404, "No such checkout for this quote.");
    return checkoutState.answer(
      {
        sessionId: query.data.session,
        status: state.status,
        kind: state.kind,
        amount: { amount: moneyString(state.amount, state.currency), currency: state.currency },
        orderNumber: state.status === "paid" ? state.orderNumber : null,
      },
      { headers: { "cache-control": "no-store" } },
    );
  });
}
