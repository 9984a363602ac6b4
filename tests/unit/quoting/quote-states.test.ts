import { describe, expect, it } from "vitest";
import { isFinal, mayRevise, movesFrom, nextState, QUOTE_MOVES, type QuoteActor, type QuoteMove } from "@/lib/quoting/quote-states";
import { QUOTE_STATUSES, type QuoteStatus } from "@/lib/vocabulary";

const ACTORS: QuoteActor[] = ["customer", "staff", "system"];

/**
 * Every move the product allows, written out by hand from the life of a quote: a draft is
 * issued by the shop (or the auto-quote path); a sent revision is accepted or declined by its
 * customer, expires by the job, is superseded when the shop issues the next one, or is withdrawn by
 * the shop. Nothing leaves accepted, declined, expired, superseded or withdrawn.
 */
const ALLOWED: [QuoteStatus, QuoteMove, QuoteActor, QuoteStatus][] = [
  ["draft", "issue", "staff", "sent"],
  ["draft", "issue", "system", "sent"],
  ["sent", "accept", "customer", "accepted"],
  ["sent", "decline", "customer", "declined"],
  ["sent", "expire", "system", "expired"],
  ["sent", "supersede", "system", "superseded"],
  ["sent", "withdraw", "staff", "withdrawn"],
];

const key = (s: string, m: string, a: string) => `${s}|${m}|${a}`;
const allowed = new Map(ALLOWED.map(([s, m, a, to]) => [key(s, m, a), to]));
const every = QUOTE_STATUSES.flatMap((s) => QUOTE_MOVES.flatMap((m) => ACTORS.map((a) => [s, m, a] as const)));

describe("the quote state machine", () => {
  it.each(ALLOWED)("%s —%s by %s→ %s", (state, move, actor, to) => {
    expect(nextState(state, move, actor)).toEqual({ ok: true, to });
  });

  it.each(every.filter(([s, m, a]) => !allowed.has(key(s, m, a))))("refuses %s —%s by %s, with a reason", (state, move, actor) => {
    const r = nextState(state, move, actor);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason.length).toBeGreaterThan(10);
  });

  it("tells a customer why a closed revision cannot be accepted", () => {
    expect(nextState("superseded", "accept", "customer")).toMatchObject({ ok: false, reason: expect.stringMatching(/newer revision/) });
    expect(nextState("expired", "accept", "customer")).toMatchObject({ ok: false, reason: expect.stringMatching(/expired/) });
    expect(nextState("accepted", "accept", "customer")).toMatchObject({ ok: false, reason: expect.stringMatching(/already been accepted/) });
    // a staff member cannot accept on the customer's behalf, even an open revision
    expect(nextState("sent", "accept", "staff")).toMatchObject({ ok: false, reason: expect.stringMatching(/customer/) });
  });

  it("offers each actor exactly the allowed moves from each state", () => {
    for (const state of QUOTE_STATUSES) {
      for (const actor of ACTORS) {
        const expected = ALLOWED.filter(([s, , a]) => s === state && a === actor).map(([, m]) => m);
        expect(movesFrom(state, actor), `${state} by ${actor}`).toEqual(expected);
      }
    }
  });

  it("names the final states and when a new revision may be issued", () => {
    expect(QUOTE_STATUSES.filter(isFinal)).toEqual(["accepted", "declined", "expired", "superseded", "withdrawn"]);
    expect(QUOTE_STATUSES.filter(mayRevise)).toEqual(["sent", "declined", "expired", "superseded", "withdrawn"]);
  });
});
