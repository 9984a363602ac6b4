import { QuotePageBody, quoteTitle } from "@/components/quotes/quote-page";
import { requireShopPage } from "@/lib/auth/guards";

export const generateMetadata = quoteTitle;

/** One of the shop's quotes as the staff read it on the desk; its customer reads the same on the storefront. */
export default async function DeskQuotePage({ params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, "quote:read-all", `/desk/${shop}/quotes/${number}`);
  return <QuotePageBody shop={ctx.shop} number={number} back={{ href: `/desk/${shop}/quotes`, label: "Quotes" }} maySee={() => true} showCosts />;
}
