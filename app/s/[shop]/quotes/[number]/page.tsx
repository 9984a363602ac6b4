import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { QuoteView } from "@/components/quotes/quote-view";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { requireShopPage } from "@/lib/auth/guards";
import { maySee, reads } from "@/lib/auth/ownership";
import { toQuoteDocument } from "@/lib/quoting/quote-document";
import { isQuoteNumber } from "@/lib/quoting/quote-number";

export async function generateMetadata({ params }: { params: Promise<{ number: string }> }): Promise<Metadata> {
  const { number } = await params;
  return { title: `Quote ${number}` };
}

/** One quote: its owner or the shop's staff see it; anyone else gets "not found". */
export default async function QuotePage({ params }: { params: Promise<{ shop: string; number: string }> }) {
  const { shop, number } = await params;
  const ctx = await requireShopPage(shop, reads("quote"), `/s/${shop}/quotes/${number}`);
  const quote = isQuoteNumber(number) ? await getQuoteByNumber(ctx.shop.id, number) : null;
  if (!quote || !maySee(ctx, "quote", quote.customerUserId)) notFound();
  const rev = await getRevision(ctx.shop.id, quote.revisionId);
  if (!rev) notFound();
  const doc = toQuoteDocument(rev);
  return (
    <div className="space-y-4">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/s/${shop}/quotes`} className="hover:underline">
          My quotes
        </Link>{" "}
        / {doc.number}
      </nav>
      <QuoteView doc={doc} pdfHref={`/api/v1/shops/${shop}/quotes/${doc.number}/pdf`} />
    </div>
  );
}
