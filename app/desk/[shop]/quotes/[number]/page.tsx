import { QuotePageBody, quoteTitle, type QuoteSearch } from "@/components/quotes/quote-page";
import { requireShopPage } from "@/lib/auth/guards";
import { replyToQuote, resendQuote, withdrawQuoteRevision } from "./actions";

export const generateMetadata = quoteTitle;

/** One of the shop's quotes as the staff read it on the desk, with their moves; its customer reads the same on the storefront. */
export default async function DeskQuotePage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string; number: string }>;
  searchParams?: Promise<QuoteSearch>;
}) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, "quote:read-all", `/desk/${shop}/quotes/${number}`);
  return (
    <QuotePageBody
      shop={ctx.shop}
      number={number}
      back={{ href: `/desk/${shop}/quotes`, label: "Quotes" }}
      maySee={() => true}
      search={(await searchParams) ?? {}}
      showCosts
      actions={{ side: "shop", resend: resendQuote, withdraw: withdrawQuoteRevision, write: replyToQuote }}
    />
  );
}
