import { redirect } from "next/navigation";
import { PaySection } from "@/components/orders/pay-section";
import { QuotePageBody, quoteTitle, type QuoteSearch } from "@/components/quotes/quote-page";
import { requireShopPage } from "@/lib/auth/guards";
import { maySee, ownerScope, reads } from "@/lib/auth/ownership";
import { acceptQuote, declineQuote, writeQuoteMessage } from "./actions";

export const generateMetadata = quoteTitle;

/** One quote as its customer reads it, with what they may do. Staff read quotes on the desk; anyone else gets "not found". */
export default async function QuotePage({ params, searchParams }: { params: Promise<{ shop: string; number: string }>; searchParams?: Promise<QuoteSearch> }) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes/${number}`);
  if (ownerScope(ctx, "quote").all) redirect(`/desk/${shop}/quotes/${encodeURIComponent(number)}`);
  const cancelled = (await searchParams)?.checkout === "cancelled";
  return (
    <QuotePageBody
      shop={ctx.shop}
      number={number}
      back={{ href: `/s/${shop}/quotes`, label: "My quotes" }}
      maySee={(owner) => maySee(ctx, "quote", owner)}
      search={(await searchParams) ?? {}}
      actions={{ side: "customer", accept: acceptQuote, decline: declineQuote, write: writeQuoteMessage }}
      aside={<PaySection shop={ctx.shop} number={number} cancelled={cancelled} />}
    />
  );
}
