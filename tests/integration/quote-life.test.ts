/**
 * The life of a quote against PostgreSQL: the estimator issues revisions from the workbench (an
 * engine option with overrides, or a custom bank of mixed cells), revision 1 stays exactly as it
 * was, the customer accepts, declines or asks for a change, the thread's messages are e-mailed
 * once each, quotes past validity expire, and concurrent moves of one quote end in one state.
 * Every test makes its own shop.
 */
import { and, count, eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as downloadRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as uploadRoute } from "@/app/api/v1/shops/[shop]/attachments/route";
import { ownerDb as db } from "./owner-db";
import { loadShopCatalog } from "@/db/queries/catalog";
import { getQuoteDraft, getQuoteLife, listRetiredCells, saveQuoteDraft } from "@/db/queries/quote-life";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { getRequest } from "@/db/queries/requests";
import { auditEvents, emailOutbox, quoteMoves, quoteRevisions, quotes, shopEvents, shopSettings } from "@/db/schema";
import type { Requirement } from "@/lib/bank";
import { configureMail } from "@/lib/mail/config";
import { getBoss, stopBoss } from "@/lib/mail/queue";
import { QUOTE_EXPIRY_CRON, QUOTE_EXPIRY_QUEUE, startQuoteExpiry } from "@/lib/quoting/expiry-job";
import { deliverOutboxRow } from "@/lib/mail/deliver";
import { createQuoteFromChoice } from "@/lib/quoting/create-quote";
import { issueQuoteRevision } from "@/lib/quoting/issue-revision";
import { acceptQuoteRevision, declineQuoteRevision, expireDueQuotes, postQuoteMessage, resendQuoteEmail, withdrawQuote } from "@/lib/quoting/lifecycle";
import { NO_OVERRIDES, searchWithOverrides } from "@/lib/quoting/review-search";
import type { CustomNode } from "@/lib/quoting/types";
import { issueRevisionSchema, type IssuableDraft } from "@/lib/validation/workbench";
import { cheapestOption, choiceOf, contextOf, createQuote, createShop, KESTREL_REQUIREMENT, MARLOW_REQUIREMENT, type TestShop } from "./fixtures";
import { request, sessionCookie } from "./helpers";
import { createMailStandin, type MailStandin } from "./mail-support";

const staff = (shop: TestShop) => contextOf(shop, shop.estimator, "estimator");
const customer = (shop: TestShop, i: 0 | 1 = 0) => contextOf(shop, shop.customers[i], "customer");

/** A request of the shop's first customer that waits for review (the shop quotes nothing above 40 V automatically). */
async function reviewRequest(shop: TestShop, requirement: Requirement = KESTREL_REQUIREMENT, notes = ""): Promise<string> {
  await db
    .update(shopSettings)
    .set({ autoQuoteLimits: { maxVoltage: 40, maxStoredEnergy: 2_000_000, maxCellCount: 400 } })
    .where(eq(shopSettings.shopId, shop.id));
  const option = await cheapestOption(shop.id, requirement);
  const r = await createQuoteFromChoice(customer(shop), { ...choiceOf(requirement, option), notes });
  if (!r.ok || r.data.kind !== "review") throw new Error(`expected a review, got ${JSON.stringify(r)}`);
  return r.data.requestId;
}

/** The workbench's draft for the shop's cheapest engine option, with the estimator's additions. */
async function engineDraft(shop: TestShop, extra: Partial<IssuableDraft> = {}): Promise<IssuableDraft> {
  const o = await cheapestOption(shop.id, KESTREL_REQUIREMENT);
  return {
    bank: {
      kind: "engine",
      choice: { sku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount },
      overrides: NO_OVERRIDES,
    },
    bankPrice: null,
    lines: [],
    discount: null,
    validityDays: 30,
    note: "",
    ...extra,
  };
}

async function issue(shop: TestShop, requestId: string, draft: IssuableDraft, basedOnRevision: number, now?: Date) {
  return issueQuoteRevision(staff(shop), issueRevisionSchema.parse({ requestId, draft, basedOnRevision }), now);
}

async function requestOf(shop: TestShop, number: string): Promise<string> {
  const q = await getQuoteByNumber(shop.id, number);
  if (!q) throw new Error(`no quote ${number}`);
  return q.requestId;
}

/** A revision's row and lines exactly as PostgreSQL holds them (JSON text of every column). */
async function rawRevision(shopId: string, number: string, revision: number): Promise<string> {
  const r = await db.execute<{ j: string }>(sql`
    select row_to_json(r)::text || coalesce((select json_agg(l order by l.position)::text from quote_lines l where l.shop_id = r.shop_id and l.revision_id = r.id), '') as j
    from quote_revisions r join quotes q on q.shop_id = r.shop_id and q.id = r.quote_id
    where r.shop_id = ${shopId} and q.number = ${number} and r.revision = ${revision}`);
  const j = r.rows[0]?.j;
  if (!j) throw new Error(`no revision ${revision} of ${number}`);
  return j;
}

/** Each revision's state as the history reads it (its latest move). */
async function states(shopId: string, number: string): Promise<Record<number, string>> {
  const q = await getQuoteByNumber(shopId, number);
  const life = await getQuoteLife(shopId, q!.id);
  const out: Record<number, string> = {};
  for (const m of life.moves) out[m.revision] = m.toStatus;
  return out;
}

let maildev: MailStandin;

beforeAll(async () => {
  maildev = await createMailStandin();
  await maildev.start();
  configureMail({ smtpHost: "127.0.0.1", smtpPort: maildev.smtpPort, smtpTimeoutSeconds: 5 });
});

afterAll(async () => {
  await stopBoss();
  await maildev.remove();
});

describe("revisions from the workbench", () => {
  it("issuing revision 2 leaves revision 1 byte-for-byte as it was, supersedes it, and the database refuses to change it", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const before = await rawRevision(shop.id, number, 1);
    const draft = await engineDraft(shop, {
      lines: [{ kind: "freight", description: "Pallet freight", quantity: "1", unit: "lot", unitPrice: "85.00" }],
      discount: { kind: "percent", value: "5", reason: "Repeat order" },
      note: "Freight added and a repeat-order discount.",
    });
    const r = await issue(shop, await requestOf(shop, number), draft, 1);
    expect(r).toEqual({ ok: true, data: { number, revision: 2 } });
    expect(await rawRevision(shop.id, number, 1)).toBe(before);
    expect(await states(shop.id, number)).toEqual({ 1: "superseded", 2: "sent" });
    const quote = await getQuoteByNumber(shop.id, number);
    expect([quote?.status, quote?.currentRevision]).toEqual(["sent", 2]);
    // the new revision's totals are its sheet's: the bank, freight and the discount with its reason
    const [rev2] = await db
      .select()
      .from(quoteRevisions)
      .where(and(eq(quoteRevisions.shopId, shop.id), eq(quoteRevisions.quoteId, quote!.id), eq(quoteRevisions.revision, 2)));
    expect(rev2?.sheet?.lines.map((l) => l.code)).toEqual(["bank", "freight"]);
    expect(rev2?.sheet?.discount).toMatchObject({ kind: "percent", value: "5", reason: "Repeat order" });
    expect(rev2?.total).toBe(Number(rev2?.sheet?.total).toFixed(4));
    // frozen: PostgreSQL itself refuses an update of a revision
    const refused = await db
      .update(quoteRevisions)
      .set({ total: "1.0000" })
      .where(eq(quoteRevisions.id, rev2!.id))
      .then(
        () => null,
        (error: unknown) => error as { cause?: { message?: string } },
      );
    expect(refused?.cause?.message).toMatch(/rows of quote_revisions are frozen/);
    // the customer is told (quote updated), the shop's systems hear of it, and the audit log says who
    const mails = await db.select().from(emailOutbox).where(eq(emailOutbox.shopId, shop.id));
    expect(mails.map((m) => m.kind).sort()).toEqual(["quote-ready", "quote-updated"]);
    const events = await db.select().from(shopEvents).where(eq(shopEvents.shopId, shop.id));
    expect(events.map((e) => [e.type, e.payload.revision])).toEqual([
      ["quote.issued", 1],
      ["quote.issued", 2],
    ]);
    const audit = await db.select().from(auditEvents).where(eq(auditEvents.shopId, shop.id));
    expect(audit.map((a) => [a.action, a.actorUserId])).toEqual([["quote.issue", shop.estimator.id]]);
  });

  it("a needs-review request with the estimator's overrides becomes revision 1, and the overrides are recorded on it", async () => {
    const shop = await createShop("kestrel");
    const requestId = await reviewRequest(shop, KESTREL_REQUIREMENT, "Fits a 19-inch rack; see drawing.");
    // the staff were told it waits (one e-mail each)
    const notices = await db
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, shop.id), eq(emailOutbox.kind, "review-needed")));
    expect(notices.map((n) => n.toEmail).sort()).toEqual([shop.estimator.email, shop.manager.email].sort());
    const overrides = { factors: { voltageDerating: 0.9 }, includeRetiredCells: true, longerStrings: 2 };
    const draft = await engineDraft(shop);
    // the engine's options under the overrides are different: find the cheapest again under them
    const found = searchWithOverrides(await loadShopCatalog(shop.id), await listRetiredCells(shop.id), KESTREL_REQUIREMENT, overrides);
    const pick = found.options[0]!;
    expect(pick.seriesCount).toBeGreaterThanOrEqual(Math.ceil(48 / (0.9 * pick.cell.ratedVoltage)));
    const r = await issue(
      shop,
      requestId,
      {
        ...draft,
        bank: {
          kind: "engine",
          choice: { sku: pick.cell.sku, topology: pick.topology, seriesCount: pick.seriesCount, parallelCount: pick.parallelCount },
          overrides,
        },
      },
      0,
    );
    if (!r.ok) throw new Error(JSON.stringify(r));
    expect(r.data.revision).toBe(1);
    const [rev] = await db.select().from(quoteRevisions).where(eq(quoteRevisions.shopId, shop.id));
    expect(rev?.design).toMatchObject({ source: "engine", overrides, notes: expect.arrayContaining([{ label: "Voltage derating", from: "1", to: "0.9" }]) });
    expect((await getRequest(shop.id, requestId))?.status).toBe("quoted");
  });

  it("a custom bank of mixed cells from the network editor is evaluated, priced per part and frozen with its tree", async () => {
    const shop = await createShop("kestrel");
    const requestId = await reviewRequest(shop);
    // 20 groups in series, each a 650 F and a 1200 F cell in parallel: C = 1850/20 = 92.5 F
    // (series/parallel combination, OpenStax University Physics Vol. 2 §8.2)
    const group: CustomNode = {
      kind: "parallel",
      children: [
        { kind: "cell", sku: "QFS-0650R27" },
        { kind: "cell", sku: "QFS-1200R27" },
      ],
    };
    const network: CustomNode = { kind: "series", children: Array.from({ length: 20 }, () => group) };
    const draft = await engineDraft(shop, {
      bank: { kind: "custom", network, overrides: NO_OVERRIDES },
      lines: [{ kind: "enclosure", description: "Rack enclosure, 19 inch", quantity: "1", unit: "pc", unitPrice: "310.00" }],
    });
    const r = await issue(shop, requestId, draft, 0);
    if (!r.ok) throw new Error(JSON.stringify(r));
    const [rev] = await db.select().from(quoteRevisions).where(eq(quoteRevisions.shopId, shop.id));
    expect(rev?.design?.source).toBe("custom");
    if (rev?.design?.source !== "custom") throw new Error("expected a custom design");
    expect(rev.design.network).toEqual(network);
    expect(rev.design.figures.capacitance).toBeCloseTo(92.5, 9);
    expect(rev.design.figures.cellCount).toBe(40);
    expect(rev.design.cells.map((c) => c.sku).sort()).toEqual(["QFS-0650R27", "QFS-1200R27"]);
    // the cost build-up prices each part on its own line
    expect(rev.pricing.lines.filter((l) => l.code === "cells").map((l) => [l.description.split(" ")[0], l.quantity])).toEqual([
      ["QFS-0650R27", 20],
      ["QFS-1200R27", 20],
    ]);
    expect(rev.sheet?.lines.map((l) => l.code)).toEqual(["bank", "enclosure"]);
  });

  it("works for a shop of film and electrolytic banks in pounds: an engine option, then a custom bank of two film parts", async () => {
    const shop = await createShop("marlow");
    const number = await createQuote(shop, shop.customers[0], MARLOW_REQUIREMENT);
    const requestId = await requestOf(shop, number);
    const o = await cheapestOption(shop.id, MARLOW_REQUIREMENT);
    const draft: IssuableDraft = {
      bank: {
        kind: "engine",
        choice: { sku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount },
        overrides: NO_OVERRIDES,
      },
      bankPrice: { unitPrice: "99.00", reason: "Match last year's price" },
      lines: [{ kind: "engineering", description: "Test report", quantity: "1.5", unit: "h", unitPrice: "80.00" }],
      discount: null,
      validityDays: 21,
      note: "",
    };
    expect(await issue(shop, requestId, draft, 1)).toMatchObject({ ok: true, data: { revision: 2 } });
    // 800 V across two 1100 V film capacitors in series, each a 1 µF and a 10 µF part in parallel
    const group: CustomNode = {
      kind: "parallel",
      children: [
        { kind: "cell", sku: "TD-PB-105K-1200" },
        { kind: "cell", sku: "TD-PB-106K-1100" },
      ],
    };
    const custom: CustomNode = { kind: "series", children: [group, group] };
    expect(await issue(shop, requestId, { ...draft, bank: { kind: "custom", network: custom, overrides: NO_OVERRIDES }, bankPrice: null }, 2)).toMatchObject({
      ok: true,
      data: { revision: 3 },
    });
    const [rev] = await db
      .select()
      .from(quoteRevisions)
      .where(and(eq(quoteRevisions.shopId, shop.id), eq(quoteRevisions.revision, 3)));
    expect(rev?.currency).toBe("GBP");
    expect(rev?.design?.source).toBe("custom");
  });

  it("refuses a custom bank with a cell past its surge voltage, and a draft based on a revision someone else replaced", async () => {
    const shop = await createShop("kestrel");
    const requestId = await reviewRequest(shop);
    // 48 V across 10 cells of 2.7 V: 4.8 V each, far past the surge voltage
    const tooShort: CustomNode = { kind: "series", children: Array.from({ length: 10 }, () => ({ kind: "cell" as const, sku: "QFS-3000R27" })) };
    const refused = await issue(shop, requestId, await engineDraft(shop, { bank: { kind: "custom", network: tooShort, overrides: NO_OVERRIDES } }), 0);
    expect(refused).toMatchObject({ ok: false, code: "invalid", fieldErrors: { bank: [expect.stringMatching(/surge voltage/)] } });
    expect((await db.select({ n: count() }).from(quotes).where(eq(quotes.shopId, shop.id)))[0]?.n).toBe(0);
    const draft = await engineDraft(shop);
    expect((await issue(shop, requestId, draft, 0)).ok).toBe(true);
    // a second estimator still looking at "no quote yet"
    expect(await issue(shop, requestId, draft, 0)).toMatchObject({ ok: false, code: "conflict" });
    expect((await issue(shop, requestId, draft, 1)).ok).toBe(true);
  });

  it("keeps a draft between visits, and refuses a save based on a version someone else replaced", async () => {
    const shop = await createShop("kestrel");
    const requestId = await reviewRequest(shop);
    const draft = { ...(await engineDraft(shop)), discount: { kind: "amount" as const, value: "12", reason: "" } };
    expect(await saveQuoteDraft(shop.id, requestId, draft, 0, shop.estimator.id)).toBe(1);
    expect(await saveQuoteDraft(shop.id, requestId, draft, 0, shop.manager.id)).toBeNull();
    expect(await saveQuoteDraft(shop.id, requestId, { ...draft, note: "v2" }, 1, shop.estimator.id)).toBe(2);
    expect(await saveQuoteDraft(shop.id, requestId, { ...draft, note: "stale" }, 1, shop.manager.id)).toBeNull();
    expect((await getQuoteDraft(shop.id, requestId))?.body.note).toBe("v2");
    // issuing removes it
    expect((await issue(shop, requestId, await engineDraft(shop), 0)).ok).toBe(true);
    expect(await getQuoteDraft(shop.id, requestId)).toBeNull();
  });
});

describe("accepting", () => {
  it("only the latest sent revision can be accepted, once; a superseded one cannot", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    expect((await issue(shop, await requestOf(shop, number), await engineDraft(shop), 1)).ok).toBe(true);
    expect(await acceptQuoteRevision(customer(shop), { number, revision: 1 })).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/replaced by revision 2/),
    });
    // another customer of the shop, and staff, cannot
    expect(await acceptQuoteRevision(customer(shop, 1), { number, revision: 2 })).toMatchObject({ ok: false, code: "not-found" });
    expect(await acceptQuoteRevision(staff(shop), { number, revision: 2 })).toMatchObject({ ok: false, code: "forbidden" });
    const first = await acceptQuoteRevision(customer(shop), { number, revision: 2 });
    expect(first).toMatchObject({ ok: true, data: { number, revision: 2, alreadyAccepted: false } });
    const again = await acceptQuoteRevision(customer(shop), { number, revision: 2 });
    expect(again).toMatchObject({ ok: true, data: { number, revision: 2, alreadyAccepted: true } });
    if (first.ok && again.ok)
      expect([again.data.revisionId, again.data.total, again.data.acceptedAt]).toEqual([first.data.revisionId, first.data.total, first.data.acceptedAt]);
    expect(await states(shop.id, number)).toEqual({ 1: "superseded", 2: "accepted" });
    const accepted = await db
      .select()
      .from(shopEvents)
      .where(and(eq(shopEvents.shopId, shop.id), eq(shopEvents.type, "quote.accepted")));
    expect(accepted.map((e) => e.payload.revision)).toEqual([2]);
    // an accepted quote is not revised
    expect(await issue(shop, await requestOf(shop, number), await engineDraft(shop), 2)).toMatchObject({ ok: false, code: "conflict" });
  });

  it("an expired revision cannot be accepted, and the expiry job expires quotes past their validity only", async () => {
    const shop = await createShop("kestrel");
    const old = await createQuote(shop, shop.customers[0], KESTREL_REQUIREMENT, new Date("2024-01-10T09:00:00Z"));
    const current = await createQuote(shop, shop.customers[0]);
    // valid until 2024-02-09 (30 days): accepted on the 9th it would hold; on the 10th it has expired
    expect(await acceptQuoteRevision(customer(shop), { number: old, revision: 1 }, new Date("2024-02-10T00:00:01Z"))).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/expired on 2024-02-09/),
    });
    expect(await states(shop.id, old)).toEqual({ 1: "expired" });
    const older = await createQuote(shop, shop.customers[1], KESTREL_REQUIREMENT, new Date("2024-03-01T09:00:00Z"));
    expect(await expireDueQuotes()).toBeGreaterThanOrEqual(1);
    expect(await states(shop.id, older)).toEqual({ 1: "expired" });
    expect(await states(shop.id, current)).toEqual({ 1: "sent" });
    expect(await acceptQuoteRevision(customer(shop, 1), { number: older, revision: 1 })).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/expired/),
    });
    // an expired quote may be issued again as a new revision
    expect((await issue(shop, await requestOf(shop, old), await engineDraft(shop), 1)).ok).toBe(true);
    expect(await states(shop.id, old)).toEqual({ 1: "expired", 2: "sent" });
  });

  it("the job worker schedules the expiry job", async () => {
    const boss = await getBoss();
    await startQuoteExpiry(boss);
    const schedules = await boss.getSchedules();
    expect(schedules.filter((x) => x.name === QUOTE_EXPIRY_QUEUE).map((x) => x.cron)).toEqual([QUOTE_EXPIRY_CRON]);
  });

  it("concurrent accept and supersede resolve to one state", async () => {
    const shop = await createShop("kestrel");
    const draft = await engineDraft(shop);
    for (let round = 0; round < 6; round++) {
      const number = await createQuote(shop, shop.customers[0]);
      const requestId = await requestOf(shop, number);
      const [accepted, issued] = await Promise.all([acceptQuoteRevision(customer(shop), { number, revision: 1 }), issue(shop, requestId, draft, 1)]);
      // exactly one of the two moves happened
      expect([accepted.ok, issued.ok].filter(Boolean)).toHaveLength(1);
      const quote = await getQuoteByNumber(shop.id, number);
      if (accepted.ok) {
        expect(issued).toMatchObject({ ok: false, code: "conflict" });
        expect([quote?.status, quote?.currentRevision]).toEqual(["accepted", 1]);
        expect(await states(shop.id, number)).toEqual({ 1: "accepted" });
      } else {
        expect(accepted).toMatchObject({ ok: false, code: "conflict" });
        expect([quote?.status, quote?.currentRevision]).toEqual(["sent", 2]);
        expect(await states(shop.id, number)).toEqual({ 1: "superseded", 2: "sent" });
      }
    }
    // never two acceptances of one quote
    const twice = await db.execute<{ n: number }>(
      sql`select count(*)::int as n from ${quoteMoves} where shop_id = ${shop.id} and to_status = 'accepted' group by quote_id having count(*) > 1`,
    );
    expect(twice.rows).toEqual([]);
  });

  it("two accepts from two tabs record one acceptance", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const results = await Promise.all([1, 2, 3].map(() => acceptQuoteRevision(customer(shop), { number, revision: 1 })));
    expect(results.every((r) => r.ok)).toBe(true);
    expect(results.filter((r) => r.ok && !r.data.alreadyAccepted)).toHaveLength(1);
    const events = await db
      .select()
      .from(shopEvents)
      .where(and(eq(shopEvents.shopId, shop.id), eq(shopEvents.type, "quote.accepted")));
    expect(events).toHaveLength(1);
  });
});

describe("declining, asking for a change and the thread", () => {
  it("each message is e-mailed to the other side exactly once", { timeout: 60_000 }, async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const asked = await postQuoteMessage(customer(shop), { number, kind: "change-request", body: "Could the bank fit in 30 L instead?" });
    expect(asked.ok).toBe(true);
    const quote = await getQuoteByNumber(shop.id, number);
    expect((await getRequest(shop.id, quote!.requestId))?.status).toBe("needs-review");
    const reply = await postQuoteMessage(staff(shop), { number, kind: "message", body: "Yes, with the 3000 F cells; revision 2 follows." });
    expect(reply.ok).toBe(true);
    // staff do not ask for changes; another customer cannot write in this thread
    expect(await postQuoteMessage(staff(shop), { number, kind: "change-request", body: "x" })).toMatchObject({ ok: false, code: "forbidden" });
    expect(await postQuoteMessage(customer(shop, 1), { number, kind: "message", body: "x" })).toMatchObject({ ok: false, code: "not-found" });

    const rows = await db
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, shop.id), eq(emailOutbox.kind, "quote-message")));
    // the customer's message to the two staff, the staff's reply to the customer
    expect(rows.map((r) => r.toEmail).sort()).toEqual([shop.customers[0].email, shop.estimator.email, shop.manager.email].sort());
    // every delivery twice, concurrently: each message goes out once
    const outcomes = await Promise.all(rows.flatMap((r) => [deliverOutboxRow(shop.id, r.id), deliverOutboxRow(shop.id, r.id)]));
    expect(outcomes.filter((o) => o === "sent")).toHaveLength(3);
    const inbox = (await maildev.inbox()).filter((m) => m.subject.includes(number));
    expect(inbox.map((m) => [m.to[0]?.address, m.subject]).sort()).toEqual(
      [
        [shop.estimator.email, `Change asked for: quote ${number}`],
        [shop.manager.email, `Change asked for: quote ${number}`],
        [shop.customers[0].email, `New message: quote ${number}`],
      ].sort(),
    );
    const toCustomer = inbox.find((m) => m.to[0]?.address === shop.customers[0].email);
    expect(toCustomer?.text).toContain("Yes, with the 3000 F cells");
    // the next revision answers the change request
    expect((await issue(shop, quote!.requestId, await engineDraft(shop), 1)).ok).toBe(true);
    expect(
      (await getQuoteByNumber(shop.id, number)) && (await db.select({ at: quotes.changeRequestedAt }).from(quotes).where(eq(quotes.id, quote!.id)))[0]?.at,
    ).toBeNull();
  });

  it("a decline records the reason in the thread for the shop; a declined quote can be revised", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    expect(await declineQuoteRevision(customer(shop), { number, revision: 1, reason: "Over our budget." })).toMatchObject({ ok: true });
    expect(await declineQuoteRevision(customer(shop), { number, revision: 1, reason: "again" })).toMatchObject({ ok: false, code: "conflict" });
    expect(await acceptQuoteRevision(customer(shop), { number, revision: 1 })).toMatchObject({
      ok: false,
      code: "conflict",
      message: expect.stringMatching(/declined/),
    });
    const quote = await getQuoteByNumber(shop.id, number);
    const life = await getQuoteLife(shop.id, quote!.id);
    expect(life.messages.map((m) => [m.side, m.kind, m.body])).toEqual([["customer", "decline", "Over our budget."]]);
    expect(life.moves.at(-1)).toMatchObject({ toStatus: "declined", reason: "Over our budget." });
    expect((await issue(shop, quote!.requestId, await engineDraft(shop, { discount: { kind: "percent", value: "8", reason: "Budget" } }), 1)).ok).toBe(true);
    expect(await states(shop.id, number)).toEqual({ 1: "declined", 2: "sent" });
  });

  it("staff withdraw a sent quote with a reason and re-send a quote's e-mail once per minute", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const at = new Date("2026-05-04T10:15:00Z");
    expect(await resendQuoteEmail(staff(shop), { number }, at)).toMatchObject({ ok: true, data: { revision: 1, to: shop.customers[0].email } });
    expect(await resendQuoteEmail(staff(shop), { number }, new Date(at.getTime() + 20_000))).toMatchObject({ ok: true });
    const copies = await db
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, shop.id), eq(emailOutbox.kind, "quote-ready")));
    expect(copies).toHaveLength(2); // the first e-mail and one copy
    expect(await withdrawQuote(staff(shop), { number, reason: "The cell is discontinued." })).toMatchObject({ ok: true });
    expect(await resendQuoteEmail(staff(shop), { number })).toMatchObject({ ok: false, code: "conflict" });
    expect(await acceptQuoteRevision(customer(shop), { number, revision: 1 })).toMatchObject({ ok: false, message: expect.stringMatching(/withdrew/) });
    const audit = await db.select().from(auditEvents).where(eq(auditEvents.shopId, shop.id));
    expect(audit.map((a) => a.action).sort()).toEqual(["quote.resend", "quote.resend", "quote.withdraw"]);
  });
});

describe("drawings in the workbench", () => {
  it("PDF, PNG and JPEG files are shown in the browser when asked; a DXF drawing is always downloaded", async () => {
    const shop = await createShop("kestrel");
    // smallest files of each kind: PDF header (ISO 32000-1 §7.5.2), PNG signature and IHDR (ISO/IEC 15948 §5.2), ASCII DXF "0 / SECTION" (from memory)
    const files = {
      "plan.pdf": Buffer.from("%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n", "latin1"),
      "plan.png": Buffer.concat([
        Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
        Buffer.from("IHDR"),
        Buffer.from([0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0, 0x90, 0x77, 0x53, 0xde]),
      ]),
      "plan.dxf": Buffer.from("  0\r\nSECTION\r\n  2\r\nENTITIES\r\n  0\r\nENDSEC\r\n  0\r\nEOF\r\n", "latin1"),
    };
    const customerCookie = await sessionCookie(shop.customers[0].email);
    const staffCookie = await sessionCookie(shop.estimator.email);
    const shown: Record<string, string> = {};
    for (const [name, bytes] of Object.entries(files)) {
      const form = new FormData();
      form.set("file", new File([new Uint8Array(bytes)], name));
      const up = await uploadRoute(request(`/api/v1/shops/${shop.slug}/attachments`, { method: "POST", body: form, cookie: customerCookie }), {
        params: Promise.resolve({ shop: shop.slug }),
      });
      const { id } = (await up.json()) as { id: string };
      const res = await downloadRoute(request(`/api/v1/shops/${shop.slug}/attachments/${id}?view=inline`, { cookie: staffCookie }), {
        params: Promise.resolve({ shop: shop.slug, id }),
      });
      expect(res.status).toBe(200);
      expect(res.headers.get("x-content-type-options")).toBe("nosniff");
      shown[name] = (res.headers.get("content-disposition") ?? "").split(";")[0] ?? "";
    }
    expect(shown).toEqual({ "plan.pdf": "inline", "plan.png": "inline", "plan.dxf": "attachment" });
  });
});
