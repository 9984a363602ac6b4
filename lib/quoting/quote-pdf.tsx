import "server-only";
import { getRevision } from "@/db/queries/quotes";
import { toQuoteDocument } from "./quote-document";
import { quotePdfFileName, renderQuoteDocument } from "./quote-pdf-document";

export class QuoteRevisionNotFoundError extends Error {
  constructor(revisionId: string) {
    super(`no quote revision ${revisionId} in this shop`);
  }
}

/** The PDF of one frozen quote revision of a shop; throws when the revision is not the shop's. */
export async function renderQuotePdf(shopId: string, quoteRevisionId: string): Promise<{ buffer: Buffer; fileName: string }> {
  const rev = await getRevision(shopId, quoteRevisionId);
  if (!rev) throw new QuoteRevisionNotFoundError(quoteRevisionId);
  const buffer = await renderQuoteDocument(toQuoteDocument(rev));
  return { buffer, fileName: quotePdfFileName(rev.quoteNumber, rev.revision.revision) };
}
