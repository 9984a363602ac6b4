/**
 * The life of a quote revision as a state machine, in one place. Pure: no database, no framework.
 *
 *   draft ──issue──▶ sent ──accept──▶ accepted
 *                     │ ──decline─▶ declined
 *                     │ ──expire──▶ expired      (its validity passed; the scheduled job or a late accept)
 *                     │ ──supersede▶ superseded  (the shop issued the next revision)
 *                     └ ──withdraw─▶ withdrawn   (the shop took it back)
 *
 * Where the state lives: a revision's frozen figures never change (quote_revisions is immutable);
 * every move is a row in an append-only history (quote_moves), and a revision's state is the `to`
 * of its latest move. The quote row keeps its latest revision's state beside it (lists, and the row
 * lock that puts concurrent moves of one quote in a line). Only the latest revision can be sent,
 * so at most one revision of a quote is ever open.
 */
import type { QuoteStatus } from "@/lib/vocabulary";

/** Who makes a move: the quote's customer, the shop's staff, or the system (the expiry job, the issue path). */
export type QuoteActor = "customer" | "staff" | "system";

export const QUOTE_MOVES = ["issue", "accept", "decline", "expire", "supersede", "withdraw"] as const;
export type QuoteMove = (typeof QUOTE_MOVES)[number];

interface MoveRule {
  from: readonly QuoteStatus[];
  to: QuoteStatus;
  by: readonly QuoteActor[];
}

const RULES: Record<QuoteMove, MoveRule> = {
  issue: { from: ["draft"], to: "sent", by: ["staff", "system"] },
  accept: { from: ["sent"], to: "accepted", by: ["customer"] },
  decline: { from: ["sent"], to: "declined", by: ["customer"] },
  expire: { from: ["sent"], to: "expired", by: ["system"] },
  supersede: { from: ["sent"], to: "superseded", by: ["system"] },
  withdraw: { from: ["sent"], to: "withdrawn", by: ["staff"] },
};

/** Why a revision in this state takes no more moves of the customer's, in the customer's words. */
const CLOSED: Record<QuoteStatus, string> = {
  draft: "This revision has not been sent yet.",
  sent: "This revision is open.",
  accepted: "This revision has already been accepted.",
  declined: "This revision was declined.",
  expired: "This revision has expired; ask the shop for a new one.",
  superseded: "A newer revision replaced this one; see the latest revision.",
  withdrawn: "The shop withdrew this revision.",
};

export type MoveResult = { ok: true; to: QuoteStatus } | { ok: false; reason: string };

/** The state a move leads to from `state` when `actor` makes it, or why it is refused. */
export function nextState(state: QuoteStatus, move: QuoteMove, actor: QuoteActor): MoveResult {
  const rule = RULES[move];
  if (!rule.by.includes(actor)) return { ok: false, reason: `Only ${rule.by.join(" or ")} may ${move} a revision.` };
  if (!rule.from.includes(state)) return { ok: false, reason: CLOSED[state] };
  return { ok: true, to: rule.to };
}

/** The moves `actor` may make from `state` (what the quote page offers). */
export function movesFrom(state: QuoteStatus, actor: QuoteActor): QuoteMove[] {
  return QUOTE_MOVES.filter((m) => nextState(state, m, actor).ok);
}

/** Whether the state is final for its revision (no move leads out of it). */
export function isFinal(state: QuoteStatus): boolean {
  return QUOTE_MOVES.every((m) => !RULES[m].from.includes(state));
}

/**
 * Whether the shop may issue a new revision of a quote whose latest revision is in `state`: any
 * time before the customer accepted (the open revision is then superseded). An accepted quote goes
 * on to payment and an order; changing it takes a new quote.
 */
export function mayRevise(state: QuoteStatus): boolean {
  return state !== "accepted" && state !== "draft";
}

/** Each revision's state from a quote's moves in the order they happened: the latest move of each revision. */
export function revisionStates(moves: readonly { revision: number; toStatus: QuoteStatus }[]): Map<number, QuoteStatus> {
  const out = new Map<number, QuoteStatus>();
  for (const m of moves) out.set(m.revision, m.toStatus);
  return out;
}
