import type { Metadata } from "next";
import Link from "next/link";
import { notFound, redirect } from "next/navigation";
import { CheckoutProgress } from "@/components/orders/checkout-progress";
import { QueryProvider } from "@/components/providers/query-provider";
import { PageHeader } from "@/components/ui/page-header";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { maySee, ownerScope, reads } from "@/lib/auth/ownership";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { checkoutStateQuerySchema } from "@/lib/validation/orders";

export const metadata: Metadata = { title: "Payment" };

/** Where the payment page sends the customer after paying: it waits for the confirmation and then shows the order. */
export default async function PaidPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string; number: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes/${number}`);
  if (ownerScope(ctx, "quote").all) redirect(`/desk/${shop}/quotes/${encodeURIComponent(number)}`);
  const quote = isQuoteNumber(number) ? await getQuoteByNumber(ctx.shop.id, number) : null;
  if (!quote || !maySee(ctx, "quote", quote.customerUserId)) notFound();
  const session = checkoutStateQuerySchema.safeParse({ session: (await searchParams).session });
  if (!session.success) redirect(`/s/${shop}/quotes/${encodeURIComponent(number)}`);
  return (
    <div className="max-w-2xl space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/s/${shop}/quotes`} className="hover:underline">
          My quotes
        </Link>{" "}
        /{" "}
        <Link href={`/s/${shop}/quotes/${number}`} className="hover:underline">
          {number}
        </Link>{" "}
        / payment
      </nav>
      <PageHeader title={`Paying quote ${number}`} />
      <section className="rounded-lg bg-white p-6 ring-1 ring-ink-100">
        <QueryProvider>
          <CheckoutProgress shop={shop} number={number} sessionId={session.data.session} />
        </QueryProvider>
      </section>
    </div>
  );
}
