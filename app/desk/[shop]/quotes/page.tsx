import type { Metadata } from "next";
import { QuoteList } from "@/components/quotes/quote-list";
import { PageHeader } from "@/components/ui/page-header";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope } from "@/lib/auth/ownership";
import { quoteList } from "@/lib/validation/lists";

export const metadata: Metadata = { title: "Quotes" };

/** Every quote of the shop: staff read quotes here, on the desk (the storefront's list is the customer's). */
export default async function DeskQuotesPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "quote:read-all", `/desk/${shop}/quotes`);
  const { query: q } = quoteList.parse(await searchParams);
  const page = await listQuotes(ctx.shop.id, ownerScope(ctx, "quote"), q);
  return (
    <div className="space-y-6">
      <PageHeader title="Quotes">Every quote {ctx.shop.name} has issued, with its current revision, total and validity.</PageHeader>
      <QuoteList shop={shop} side="desk" q={q} page={page} state={quoteList.state(`/desk/${shop}/quotes`, q, page)} />
    </div>
  );
}
