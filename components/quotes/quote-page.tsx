import Link from "next/link";
import { notFound } from "next/navigation";
import { getQuoteLife } from "@/db/queries/quote-life";
import { getDatasheetBySku } from "@/db/queries/catalog-edit";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { toCostBuildUp } from "@/lib/quoting/cost-build-up";
import { toQuoteDocument } from "@/lib/quoting/quote-document";
import { CostBuildUpPanel } from "./cost-build-up";
import { isQuoteNumber } from "@/lib/quoting/quote-number";
import { revisionStates } from "@/lib/quoting/quote-states";
import { compareParams } from "@/lib/validation/quote-life";
import { QUOTE_STATUS_LABELS } from "@/lib/vocabulary";
import { QuoteLifeDetails, QuoteStanding, type QuoteLifeActions } from "./quote-life";
import { QuoteView } from "./quote-view";

export type QuoteSearch = Record<string, string | string[] | undefined>;

/**
 * A quote page's body, for the desk and the storefront alike: the breadcrumb back to the list the
 * reader came from, the revision asked for (the latest unless `?revision=n`), then the quote's life
 * (where it stands and the reader's moves, every revision with a comparison, the thread). A quote
 * the reader may not see is "not found".
 */
export async function QuotePageBody({
  shop,
  number,
  back,
  maySee,
  search,
  actions,
  aside,
  showCosts = false,
}: {
  shop: { id: string; slug: string; name: string };
  number: string;
  back: { href: string; label: string };
  maySee: (ownerUserId: string) => boolean;
  search: QuoteSearch;
  actions: QuoteLifeActions;
  /** a section shown above the quote (the storefront's pay panel) */
  aside?: React.ReactNode;
  /** the shop's cost build-up and margin under the customer's view: the desk only */
  showCosts?: boolean;
}) {
  const quote = isQuoteNumber(number) ? await getQuoteByNumber(shop.id, number) : null;
  if (!quote || !maySee(quote.customerUserId)) notFound();
  const life = await getQuoteLife(shop.id, quote.id);
  const { view, from, to } = compareParams(search, quote.currentRevision);
  const viewed = life.revisions.find((r) => r.revision.revision === view)?.revision;
  const rev = viewed ? await getRevision(shop.id, viewed.id) : null;
  if (!rev) notFound();
  const doc = toQuoteDocument(rev);
  const state = revisionStates(life.moves).get(view);
  const pagePath = `${back.href}/${doc.number}`;
  const now = new Date();
  const lifeQuote = {
    number: quote.number,
    status: quote.status,
    currentRevision: quote.currentRevision,
    requestId: quote.requestId,
    changeRequestedAt: quote.changeRequestedAt,
  };
  const datasheet = await getDatasheetBySku(shop.id, doc.option.cell.sku);
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={back.href} className="hover:underline">
          {back.label}
        </Link>{" "}
        / {doc.number}
      </nav>
      {view !== quote.currentRevision ? (
        <p role="status" className="rounded-md bg-hazard-100 px-4 py-3 text-sm text-hazard-700" data-testid="older-revision">
          You are reading revision {view}
          {state ? ` (${QUOTE_STATUS_LABELS[state].toLowerCase()})` : ""}. The latest is{" "}
          <Link href={pagePath} className="font-medium underline">
            revision {quote.currentRevision}
          </Link>
          .
        </p>
      ) : null}
      <QuoteStanding shop={shop} quote={lifeQuote} life={life} now={now} actions={actions} />
      {aside}
      <QuoteView
        doc={doc}
        pdfHref={`/api/v1/shops/${shop.slug}/quotes/${doc.number}/pdf${view !== quote.currentRevision ? `?revision=${view}` : ""}`}
        datasheetHref={datasheet ? `/api/v1/shops/${shop.slug}/cells/${encodeURIComponent(doc.option.cell.sku)}/datasheet` : null}
        staffOnly={showCosts ? <CostBuildUpPanel build={toCostBuildUp(rev.revision.pricing)} /> : null}
      />
      <QuoteLifeDetails
        shop={shop}
        quote={lifeQuote}
        life={life}
        viewing={view}
        compare={{ from, to }}
        askForChange={search.ask === "change"}
        now={now}
        actions={actions}
      />
    </div>
  );
}

export async function quoteTitle({ params }: { params: Promise<{ number: string }> }) {
  const { number } = await params;
  return { title: `Quote ${number}` };
}
