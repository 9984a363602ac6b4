import "server-only";
import { render } from "@react-email/render";
import { createElement } from "react";
import { getMessageMailFacts, getReviewMailFacts, getRevisionMailFacts } from "@/db/queries/quote-life";
import { insertOutboxMessage } from "@/db/queries/outbox";
import type { EmailOutboxRow } from "@/db/schema";
import type { Tx } from "@/db/tx";
import { QuoteMessageEmail } from "@/emails/quote-message";
import { QuoteUpdatedEmail } from "@/emails/quote-updated";
import { ReviewNeededEmail } from "@/emails/review-needed";
import { formatMoney } from "@/lib/pricing";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";
import { diffRevisions, frozenRevisionOf, revisionFacts, summarizeDiff } from "@/lib/quoting/revision-diff";
import { describeRequirement, type QuoteMessageKind } from "@/lib/vocabulary";
import { mailSettings } from "./config";
import { formatValidity, outboxMessageId, quotePageUrl } from "./format";
import type { OutgoingMessage } from "./transport";

/**
 * The e-mails of a quote's life, each written to the outbox in the transaction of its cause and
 * built from the records when it is sent: "quote updated" to the customer (a new revision), a
 * thread message to the other side, and "needs review" to the shop's staff. One outbox row per
 * recipient and event (the dedupe key), so each goes out once.
 */
export const QUOTE_UPDATED_KIND = "quote-updated";
export const QUOTE_MESSAGE_KIND = "quote-message";
export const REVIEW_NEEDED_KIND = "review-needed";
const KINDS = new Set([QUOTE_UPDATED_KIND, QUOTE_MESSAGE_KIND, REVIEW_NEEDED_KIND]);

export interface Recipient {
  userId: string;
  email: string;
}

/** "Your quote Q-… has been updated" for a revision after the first (the first is "quote ready"). */
export async function enqueueQuoteUpdated(
  tx: Tx,
  m: { shopId: string; quoteRevisionId: string; quoteNumber: string; revision: number; toEmail: string; dedupeKey?: string },
) {
  await insertOutboxMessage(tx, m.shopId, {
    kind: QUOTE_UPDATED_KIND,
    dedupeKey: m.dedupeKey ?? `${QUOTE_UPDATED_KIND}:${m.quoteRevisionId}`,
    toEmail: m.toEmail,
    subject: `Your quote ${m.quoteNumber} has been updated (revision ${m.revision})`,
    quoteRevisionId: m.quoteRevisionId,
  });
}

const SUBJECT_WHAT: Record<QuoteMessageKind, string> = {
  message: "New message",
  "change-request": "Change asked for",
  decline: "Quote declined",
  "revision-note": "Note from the shop",
  withdrawal: "Quote withdrawn",
};

/** A thread message to each recipient on the other side, once per recipient. */
export async function enqueueThreadMessage(
  tx: Tx,
  m: { shopId: string; messageId: string; kind: QuoteMessageKind; quoteNumber: string; recipients: readonly Recipient[] },
) {
  for (const r of m.recipients) {
    await insertOutboxMessage(tx, m.shopId, {
      kind: QUOTE_MESSAGE_KIND,
      dedupeKey: `${QUOTE_MESSAGE_KIND}:${m.messageId}:${r.userId}`,
      toEmail: r.email,
      subject: `${SUBJECT_WHAT[m.kind]}: quote ${m.quoteNumber}`,
      quoteRevisionId: null,
      quoteMessageId: m.messageId,
    });
  }
}

/** "A request needs review" to each of the shop's staff, once per request and person. */
export async function enqueueReviewNeeded(tx: Tx, m: { shopId: string; requestId: string; customerName: string; recipients: readonly Recipient[] }) {
  for (const r of m.recipients) {
    await insertOutboxMessage(tx, m.shopId, {
      kind: REVIEW_NEEDED_KIND,
      dedupeKey: `${REVIEW_NEEDED_KIND}:${m.requestId}:${r.userId}`,
      toEmail: r.email,
      subject: `Request from ${m.customerName} needs review`,
      quoteRevisionId: null,
      requestId: m.requestId,
    });
  }
}

export function isQuoteLifeKind(kind: string): boolean {
  return KINDS.has(kind);
}

const base = (appUrl: string) => appUrl.replace(/\/+$/, "");
const deskQuoteUrl = (appUrl: string, slug: string, number: string) => `${base(appUrl)}/desk/${encodeURIComponent(slug)}/quotes/${encodeURIComponent(number)}`;
const workbenchUrl = (appUrl: string, slug: string, requestId: string) =>
  `${base(appUrl)}/desk/${encodeURIComponent(slug)}/requests/${encodeURIComponent(requestId)}`;

/** "asks for a change", "declined the quote", "wrote": how the heading says what the message is. */
const WHAT: Record<QuoteMessageKind, string> = {
  message: "wrote",
  "change-request": "asks for a change",
  decline: "declined the quote",
  "revision-note": "wrote with a new revision",
  withdrawal: "withdrew the quote",
};

async function renderBoth(element: React.ReactElement) {
  const [html, text] = await Promise.all([render(element), render(element, { plainText: true })]);
  return { html, text };
}

/** Builds the message an outbox row of a quote's life stands for, from the records it points at. */
export async function buildQuoteLifeMessage(row: EmailOutboxRow): Promise<OutgoingMessage> {
  const settings = mailSettings();
  const messageId = outboxMessageId(row.id, settings.from);
  if (row.kind === QUOTE_UPDATED_KIND) {
    const facts = row.quoteRevisionId ? await getRevisionMailFacts(row.shopId, row.quoteRevisionId) : null;
    if (!facts || !row.quoteRevisionId) throw new Error("the quote revision of this message no longer exists");
    const r = facts.revision;
    const money = (a: string) => formatMoney(a, r.currency);
    const changes = facts.previous ? summarizeDiff(diffRevisions(revisionFacts(frozenRevisionOf(facts.previous)), revisionFacts(frozenRevisionOf(r)))) : [];
    const { html, text } = await renderBoth(
      createElement(QuoteUpdatedEmail, {
        shopName: facts.shopName,
        quoteNumber: facts.quoteNumber,
        revision: r.revision,
        total: money(r.total),
        previousTotal: facts.previous ? money(facts.previous.total) : null,
        quantity: r.quantity,
        validUntil: formatValidity(r.validUntil),
        note: r.note,
        changes,
        quoteUrl: quotePageUrl(settings.appUrl, facts.shopSlug, facts.quoteNumber),
      }),
    );
    const pdf = await loadQuotePdf(row.shopId, row.quoteRevisionId);
    return {
      to: row.toEmail,
      subject: row.subject,
      html,
      text,
      messageId,
      attachments: [{ filename: pdf.fileName, content: pdf.buffer, contentType: "application/pdf" }],
    };
  }
  if (row.kind === QUOTE_MESSAGE_KIND) {
    const facts = row.quoteMessageId ? await getMessageMailFacts(row.shopId, row.quoteMessageId) : null;
    if (!facts) throw new Error("the thread message of this e-mail no longer exists");
    const to = facts.message.side === "customer" ? "shop" : "customer";
    const { html, text } = await renderBoth(
      createElement(QuoteMessageEmail, {
        shopName: facts.shopName,
        quoteNumber: facts.quoteNumber,
        to,
        authorName: facts.authorName ?? (to === "shop" ? "The customer" : facts.shopName),
        what: WHAT[facts.message.kind],
        body: facts.message.body,
        quoteUrl:
          to === "shop" ? deskQuoteUrl(settings.appUrl, facts.shopSlug, facts.quoteNumber) : quotePageUrl(settings.appUrl, facts.shopSlug, facts.quoteNumber),
      }),
    );
    return { to: row.toEmail, subject: row.subject, html, text, messageId };
  }
  if (row.kind === REVIEW_NEEDED_KIND) {
    const facts = row.requestId ? await getReviewMailFacts(row.shopId, row.requestId) : null;
    if (!facts || !row.requestId) throw new Error("the request of this message no longer exists");
    const { html, text } = await renderBoth(
      createElement(ReviewNeededEmail, {
        shopName: facts.shopName,
        customerName: facts.customerName,
        requirement: describeRequirement(facts.requirement),
        reasons: facts.reviewReasons,
        notes: facts.notes.length > 600 ? `${facts.notes.slice(0, 600)}…` : facts.notes,
        attachments: facts.attachments,
        workbenchUrl: workbenchUrl(settings.appUrl, facts.shopSlug, row.requestId),
      }),
    );
    return { to: row.toEmail, subject: row.subject, html, text, messageId };
  }
  throw new Error(`no message template for outbox kind "${row.kind}"`);
}
