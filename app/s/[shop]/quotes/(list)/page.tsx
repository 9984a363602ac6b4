import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { QuoteList } from "@/components/quotes/quote-list";
import { PageHeader } from "@/components/ui/page-header";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { quoteList } from "@/lib/validation/lists";

export const metadata: Metadata = { title: "My quotes" };

/** A customer's own quotes, each with its PDF. Staff read the shop's quotes on the desk. */
export default async function MyQuotesPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes`);
  const scope = ownerScope(ctx, "quote");
  if (scope.all) redirect(`/desk/${shop}/quotes`);
  const { query: q } = quoteList.parse(await searchParams);
  const page = await listQuotes(ctx.shop.id, scope, q);
  return (
    <div className="space-y-6">
      <PageHeader title="My quotes">
        Every quote {ctx.shop.name} has sent you, with its PDF. Signed in as {ctx.user.email}.
      </PageHeader>
      <QuoteList shop={shop} side="storefront" q={q} page={page} state={quoteList.state(`/s/${shop}/quotes`, q, page)} />
    </div>
  );
}
