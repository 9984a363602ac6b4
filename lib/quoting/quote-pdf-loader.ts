import "server-only";
import { getRevision } from "@/db/queries/quotes";
import { toQuoteDocument } from "./quote-document";
import { quotePdfFileName, renderQuotePdfLayout } from "./quote-pdf-layout";

export class QuoteRevisionNotFoundError extends Error {
  constructor(revisionId: string) {
    super(`no quote revision ${revisionId} in this shop`);
  }
}

/**
 * The PDF loader: reads one frozen quote revision of a shop from the database and renders it with
 * the PDF layout (quote-pdf-layout.tsx); throws when the revision is not the shop's.
 */
export async function loadQuotePdf(shopId: string, quoteRevisionId: string): Promise<{ buffer: Buffer; fileName: string }> {
  const rev = await getRevision(shopId, quoteRevisionId);
  if (!rev) throw new QuoteRevisionNotFoundError(quoteRevisionId);
  const buffer = await renderQuotePdfLayout(toQuoteDocument(rev));
  return { buffer, fileName: quotePdfFileName(rev.quoteNumber, rev.revision.revision) };
}
