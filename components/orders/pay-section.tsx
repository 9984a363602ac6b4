import Link from "next/link";
import { getQuotePaymentState } from "@/db/queries/payments";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { getShopSettings } from "@/db/queries/shops";
import { FormMessage } from "@/components/ui/field";
import { amountFor, payableKinds } from "@/lib/payments/amounts";
import { formatMoney } from "@/lib/pricing";
import { isExpired } from "@/lib/quoting/validity";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { PAYMENT_KIND_LABELS } from "@/lib/vocabulary";
import { OrderStatusBadge } from "./order-status";
import { PayPanel, type PayChoice } from "./pay-panel";

/**
 * The storefront quote page's payment section, for the quote's customer: "Accept and pay" (the
 * whole amount or the shop's deposit), the order once paid, the balance after a deposit, or why the
 * quote cannot be paid. The quote's own status and actions belong to the quote's life; this is the
 * pay button and the order link only.
 */
export async function PaySection({
  shop,
  number,
  cancelled,
  onlyBalance = false,
}: {
  shop: { id: string; slug: string };
  number: string;
  cancelled: boolean;
  /** on the order page: say nothing unless a balance is due */
  onlyBalance?: boolean;
}) {
  const quote = isQuoteNumber(number) ? await getQuoteByNumber(shop.id, number) : null;
  const rev = quote ? await getRevision(shop.id, quote.revisionId) : null;
  if (!quote || !rev) return null;
  const [state, settings] = await Promise.all([getQuotePaymentState(shop.id, quote.id), getShopSettings(shop.id)]);
  const r = rev.revision;
  const money = { depositPercent: settings?.pricingRules.depositPercent ?? 0, paid: state.paid, total: r.total, currency: r.currency };
  const kinds = payableKinds(money);
  const m = (a: string) => formatMoney(a, r.currency);
  const choices: PayChoice[] = kinds.map((kind) => ({
    kind,
    label: kind === "deposit" ? `Deposit (${money.depositPercent} %)` : kind === "balance" ? "The balance" : "The whole amount",
    amount: m(amountFor(kind, money)),
    hint: kind === "deposit" ? "The balance is due before the order ships." : undefined,
  }));

  if (onlyBalance) {
    if (!kinds.includes("balance")) return null;
    return (
      <section className="rounded-lg bg-white p-4 ring-1 ring-copper-300" aria-labelledby="balance-title" data-testid="pay-section">
        <h2 id="balance-title" className="text-base font-semibold">
          Balance due
        </h2>
        <div className="mt-3">
          <PayPanel shop={shop.slug} number={number} revision={r.revision} choices={choices} action="Pay the balance," />
        </div>
      </section>
    );
  }

  let body: React.ReactNode;
  if (state.order) {
    const closed = ["cancelled", "refunded"].includes(state.order.status);
    body = (
      <div className="space-y-3">
        <p className="flex flex-wrap items-center gap-2 text-sm">
          Order
          <Link href={`/s/${shop.slug}/orders/${state.order.number}`} className="font-semibold text-copper-700 hover:underline" data-testid="quote-order-link">
            {state.order.number}
          </Link>
          <OrderStatusBadge status={state.order.status} />
          <span>
            · paid {m(state.paid)} of {m(r.total)}
          </span>
        </p>
        {!closed && kinds.includes("balance") ? (
          <PayPanel shop={shop.slug} number={number} revision={r.revision} choices={choices} action="Pay the balance," />
        ) : null}
      </div>
    );
  } else if ((quote.status !== "sent" && quote.status !== "accepted") || isExpired(r.validUntil, new Date())) {
    // declined, expired, withdrawn (a latest revision is never superseded; drafts are not quotes yet)
    body = (
      <p className="text-sm text-ink-700" data-testid="pay-closed">
        {quote.status === "declined" ? "You declined this quote, so it cannot be paid." : "This quote can no longer be paid."} Ask the shop for a new revision.
      </p>
    );
  } else {
    body = (
      <div className="space-y-3">
        {state.open ? (
          <p className="text-sm text-ink-600">
            A payment page is already open for the {PAYMENT_KIND_LABELS[state.open.kind].toLowerCase()} ({m(state.open.amount)}); paying again here takes you
            back to it.
          </p>
        ) : null}
        <PayPanel shop={shop.slug} number={number} revision={r.revision} choices={choices} action={quote.status === "accepted" ? "Pay" : "Accept and pay"} />
        <p className="text-xs text-ink-500">
          You pay on the payment service's secure page; the shop never sees your card. Your order starts as soon as the payment is confirmed.
        </p>
      </div>
    );
  }
  return (
    <section className="rounded-lg bg-white p-4 ring-1 ring-copper-300" aria-labelledby="pay-title" data-testid="pay-section">
      <h2 id="pay-title" className="text-base font-semibold">
        {state.order ? "Your order" : `Revision ${r.revision}: accept and pay`}
      </h2>
      <div className="mt-3 space-y-3">
        {cancelled && !state.order ? <FormMessage tone="info">Payment cancelled: nothing was charged. You can pay whenever you are ready.</FormMessage> : null}
        {body}
      </div>
    </section>
  );
}
