import Link from "next/link";
import { notFound } from "next/navigation";
import { getDatasheetBySku } from "@/db/queries/catalog-edit";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { toCostBuildUp } from "@/lib/quoting/cost-build-up";
import { toQuoteDocument } from "@/lib/quoting/quote-document";
import { CostBuildUpPanel } from "./cost-build-up";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { QuoteView } from "./quote-view";

/**
 * A quote page's body, for the desk and the storefront alike: the breadcrumb back to the list the
 * reader came from, then the frozen revision. A quote the reader may not see is "not found".
 */
export async function QuotePageBody({
  shop,
  number,
  back,
  maySee,
  aside,
  showCosts = false,
}: {
  shop: { id: string; slug: string };
  number: string;
  back: { href: string; label: string };
  maySee: (ownerUserId: string) => boolean;
  /** a section shown above the quote (the storefront's pay panel) */
  aside?: React.ReactNode;
  /** the shop's cost build-up and margin under the customer's view: the desk only */
  showCosts?: boolean;
}) {
  const quote = isQuoteNumber(number) ? await getQuoteByNumber(shop.id, number) : null;
  const rev = quote && maySee(quote.customerUserId) ? await getRevision(shop.id, quote.revisionId) : null;
  if (!rev) notFound();
  const doc = toQuoteDocument(rev);
  const datasheet = await getDatasheetBySku(shop.id, doc.option.cell.sku);
  return (
    <div className="space-y-4">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={back.href} className="hover:underline">
          {back.label}
        </Link>{" "}
        / {doc.number}
      </nav>
      {aside}
      <QuoteView
        doc={doc}
        pdfHref={`/api/v1/shops/${shop.slug}/quotes/${doc.number}/pdf`}
        datasheetHref={datasheet ? `/api/v1/shops/${shop.slug}/cells/${encodeURIComponent(doc.option.cell.sku)}/datasheet` : null}
        staffOnly={showCosts ? <CostBuildUpPanel build={toCostBuildUp(rev.revision.pricing)} /> : null}
      />
    </div>
  );
}

export async function quoteTitle({ params }: { params: Promise<{ number: string }> }) {
  const { number } = await params;
  return { title: `Quote ${number}` };
}
