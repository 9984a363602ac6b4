import "server-only";
import { render } from "@react-email/render";
import { createElement } from "react";
import { getQuoteReadyFacts } from "@/db/queries/outbox";
import type { EmailOutboxRow } from "@/db/schema";
import { QuoteReadyEmail } from "@/emails/quote-ready";
import { getRevision } from "@/db/queries/quotes";
import { toQuoteDocument } from "@/lib/quoting/quote-document";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";
import { buildOrderMessage, isOrderMessage } from "@/lib/orders/messages";
import { ACCOUNT_EXISTS_KIND, buildAccountExistsMessage } from "./account-notice";
import { buildWebhookStoppedMessage, WEBHOOK_STOPPED_KIND } from "@/lib/webhooks/stopped-notice";
import { formatMoney } from "@/lib/pricing";
import { mailSettings } from "./config";
import { buildQuoteLifeMessage, isQuoteLifeKind } from "./quote-notices";
import { formatValidity, outboxMessageId, quotePageUrl } from "./format";
import type { OutgoingMessage } from "./transport";

/** Builds the message an outbox row announces, from the records it points at. */
export async function buildOutboxMessage(row: EmailOutboxRow): Promise<OutgoingMessage> {
  if (row.kind === ACCOUNT_EXISTS_KIND) return buildAccountExistsMessage(row);
  if (isQuoteLifeKind(row.kind)) return buildQuoteLifeMessage(row);
  if (isOrderMessage(row.kind)) return buildOrderMessage(row);
  if (row.kind === WEBHOOK_STOPPED_KIND) return buildWebhookStoppedMessage(row);
  if (row.kind !== "quote-ready") throw new Error(`no message template for outbox kind "${row.kind}"`);
  if (!row.quoteRevisionId) throw new Error("the quote revision of this message no longer exists");
  const facts = await getQuoteReadyFacts(row.shopId, row.quoteRevisionId);
  if (!facts) throw new Error("the quote revision of this message no longer exists");
  const settings = mailSettings();
  const quoteUrl = quotePageUrl(settings.appUrl, facts.shopSlug, facts.quoteNumber);
  const rev = await getRevision(row.shopId, row.quoteRevisionId);
  // the same sell lines as the quote page and the PDF; the total is the document's last row
  const doc = rev ? toQuoteDocument(rev) : null;
  const email = createElement(QuoteReadyEmail, {
    shopName: facts.shopName,
    quoteNumber: facts.quoteNumber,
    revision: facts.revision,
    total: formatMoney(facts.total, facts.currency),
    quantity: facts.quantity,
    validUntil: formatValidity(facts.validUntil),
    quoteUrl,
    lines: doc?.lines ?? [],
    totals: doc?.totals.slice(0, -1) ?? [],
  });
  const [html, text, pdf] = await Promise.all([render(email), render(email, { plainText: true }), loadQuotePdf(row.shopId, row.quoteRevisionId)]);
  return {
    to: row.toEmail,
    subject: row.subject,
    html,
    text,
    messageId: outboxMessageId(row.id, settings.from),
    attachments: [{ filename: pdf.fileName, content: pdf.buffer, contentType: "application/pdf" }],
  };
}
