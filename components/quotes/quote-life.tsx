import type { QuoteLife } from "@/db/queries/quote-life";
import type { ActionResult } from "@/lib/auth/guards";
import { formatMoney } from "@/lib/pricing";
import { mayRevise, revisionStates } from "@/lib/quoting/quote-states";
import { diffRevisions, frozenRevisionOf, revisionFacts } from "@/lib/quoting/revision-diff";
import { isExpired } from "@/lib/quoting/validity";
import type { QuoteStatus } from "@/lib/vocabulary";
import { CustomerQuoteActions } from "./customer-quote-actions";
import { QuoteMessageForm } from "./quote-message-form";
import { QuoteStatusBadge } from "./quote-status";
import { QuoteThread } from "./quote-thread";
import { RevisionHistory, type RevisionRow } from "./revision-history";
import { StaffQuoteActions } from "./staff-quote-actions";

type Move = (shopSlug: string, input: unknown) => Promise<ActionResult<unknown>>;
type Send = (shopSlug: string, input: unknown) => Promise<ActionResult<{ id: string }>>;

export type QuoteLifeActions = { side: "customer"; accept: Move; decline: Move; write: Send } | { side: "shop"; resend: Move; withdraw: Move; write: Send };

export interface QuoteLifeQuote {
  number: string;
  status: QuoteStatus;
  currentRevision: number;
  requestId: string;
  changeRequestedAt: Date | null;
}

const BASIS = { "customer-choice": "the customer's choice", engine: "engine option, set by the shop", custom: "custom bank" } as const;

/** What the state means for the reader, in one sentence. */
function standing(status: QuoteStatus, side: "customer" | "shop", revision: number, validUntil: string, changeAsked: boolean): string {
  if (changeAsked && status !== "accepted")
    return side === "customer"
      ? "You asked for a change; the shop is revising the quote."
      : "The customer asked for a change: revise the quote in the workbench.";
  switch (status) {
    case "sent":
      return side === "customer"
        ? `Revision ${revision} is open until ${validUntil}: accept it, ask for a change or decline it.`
        : `Revision ${revision} is with the customer until ${validUntil}.`;
    case "accepted":
      return side === "customer" ? `You accepted revision ${revision}.` : `The customer accepted revision ${revision}.`;
    case "declined":
      return side === "customer"
        ? `You declined revision ${revision}; the shop may offer a new one.`
        : `The customer declined revision ${revision}; a new revision may follow.`;
    case "expired":
      return side === "customer"
        ? `Revision ${revision} expired on ${validUntil}; ask the shop for a new one.`
        : `Revision ${revision} expired on ${validUntil}.`;
    case "withdrawn":
      return side === "customer" ? `The shop withdrew revision ${revision}.` : `Revision ${revision} was withdrawn.`;
    default:
      return "";
  }
}

interface LifeProps {
  shop: { slug: string; name: string };
  quote: QuoteLifeQuote;
  life: QuoteLife;
  viewing: number;
  compare: { from: number; to: number };
  /** the reader came to ask for a change: the thread's form starts so */
  askForChange: boolean;
  now: Date;
  actions: QuoteLifeActions;
}

/** The latest revision and the state the reader sees (a revision past its last day reads as expired before the job has run). */
function latestOf({ quote, life, now }: Pick<LifeProps, "quote" | "life" | "now">) {
  const latest = life.revisions.find((r) => r.revision.revision === quote.currentRevision)?.revision;
  const status: QuoteStatus = quote.status === "sent" && latest && isExpired(latest.validUntil, now) ? "expired" : quote.status;
  return { latest, status };
}

const pagePathOf = (side: "customer" | "shop", slug: string, number: string) =>
  side === "customer" ? `/s/${slug}/quotes/${number}` : `/desk/${slug}/quotes/${number}`;

/**
 * Where the quote stands and what the reader may do: the customer accepts, asks for a change or
 * declines the latest sent revision; the staff revise it in the workbench, send its e-mail again
 * or withdraw it. At the top of the quote page.
 */
export function QuoteStanding({ shop, quote, life, now, actions }: Pick<LifeProps, "shop" | "quote" | "life" | "now" | "actions">) {
  const side = actions.side;
  const { latest, status } = latestOf({ quote, life, now });
  const changeAsked = quote.changeRequestedAt !== null;
  return (
    <section aria-labelledby="standing-title" className="rounded-lg bg-white p-4 ring-1 ring-ink-100" data-testid="quote-standing">
      <div className="flex flex-wrap items-center gap-2">
        <h2 id="standing-title" className="text-sm font-semibold text-ink-800">
          Where this quote stands
        </h2>
        <QuoteStatusBadge status={status} />
        {changeAsked && status !== "accepted" ? (
          <span className="rounded-full bg-hazard-100 px-2 py-0.5 text-xs font-medium text-hazard-700">Change asked for</span>
        ) : null}
      </div>
      <p className="mt-1 text-sm text-ink-700">{standing(status, side, quote.currentRevision, latest?.validUntil ?? "", changeAsked)}</p>
      <div className="mt-3">
        {actions.side === "customer" ? (
          status === "sent" && latest ? (
            <CustomerQuoteActions
              shop={shop.slug}
              number={quote.number}
              revision={quote.currentRevision}
              total={formatMoney(latest.total, latest.currency)}
              validUntil={latest.validUntil}
              accept={actions.accept}
              decline={actions.decline}
              askHref={`${pagePathOf(side, shop.slug, quote.number)}?ask=change#thread-title`}
            />
          ) : null
        ) : (
          <StaffQuoteActions
            shop={shop.slug}
            number={quote.number}
            workbenchHref={mayRevise(status) ? `/desk/${shop.slug}/requests/${quote.requestId}` : null}
            canResend={status === "sent" || status === "accepted"}
            canWithdraw={status === "sent"}
            resend={actions.resend}
            withdraw={actions.withdraw}
          />
        )}
      </div>
    </section>
  );
}

/**
 * The rest of a quote's life, below the revision itself: every revision with a comparison of any
 * two, and the thread with the reader's writing box. Pure rendering of what the page loaded.
 */
export function QuoteLifeDetails({ shop, quote, life, viewing, compare, askForChange, now, actions }: LifeProps) {
  const side = actions.side;
  const states = revisionStates(life.moves);
  const { status } = latestOf({ quote, life, now });
  const rows: RevisionRow[] = life.revisions.map(({ revision: r, createdByName }) => ({
    revision: r.revision,
    state: states.get(r.revision) ?? "sent",
    issuedOn: r.createdAt.toISOString().slice(0, 10),
    issuedBy: createdByName,
    total: r.total,
    currency: r.currency,
    validUntil: r.validUntil,
    note: r.note,
    basis: BASIS[r.design?.source ?? "customer-choice"],
  }));
  const a = life.revisions.find((r) => r.revision.revision === compare.from)?.revision;
  const b = life.revisions.find((r) => r.revision.revision === compare.to)?.revision;
  const diff = a && b ? diffRevisions(revisionFacts(frozenRevisionOf(a)), revisionFacts(frozenRevisionOf(b))) : null;
  return (
    <div className="space-y-6">
      <RevisionHistory
        base={pagePathOf(side, shop.slug, quote.number)}
        rows={rows}
        viewing={viewing}
        compare={compare}
        diff={diff}
        showIssuer={side === "shop"}
      />
      <QuoteThread
        messages={life.messages}
        reader={side}
        shopName={shop.name}
        form={
          <QuoteMessageForm
            key={askForChange ? "ask-for-change" : "message"}
            shop={shop.slug}
            number={quote.number}
            send={actions.write}
            canAskForChange={side === "customer" && status !== "accepted"}
            startAsChange={askForChange}
          />
        }
      />
    </div>
  );
}
