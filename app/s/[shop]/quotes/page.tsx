import type { Metadata } from "next";
import { Suspense } from "react";
import { QueryProvider } from "@/components/providers/query-provider";
import { QuoteTable } from "@/components/quotes/quote-table";
import { listQuotes } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { ownerScope, reads } from "@/lib/auth/ownership";
import { quoteListQuerySchema } from "@/lib/validation/quote";

export const metadata: Metadata = { title: "My quotes" };

export default async function MyQuotesPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes`);
  const scope = ownerScope(ctx, "quote");
  const q = quoteListQuerySchema.parse(await searchParams);
  const first = await listQuotes(ctx.shop.id, scope, q);
  const initial = { total: first.total, rows: first.rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })) };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">{scope.all ? "Quotes" : "My quotes"}</h1>
        <p className="mt-1 text-sm text-ink-600">
          {scope.all ? `Every quote ${ctx.shop.name} has issued.` : `Every quote ${ctx.shop.name} has sent you, with its PDF. Signed in as ${ctx.user.email}.`}
        </p>
      </div>
      <QueryProvider>
        <Suspense>
          <QuoteTable shop={shop} initial={initial} initialQuery={q} showCustomer={scope.all} />
        </Suspense>
      </QueryProvider>
    </div>
  );
}
