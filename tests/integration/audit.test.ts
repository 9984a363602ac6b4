/**
 * The audit log: staff changes are recorded with who, what and when in the transaction that makes
 * them; the manager's page lists them with the list idiom (filter by change, person and record,
 * sort, page) and only the shop's own; the database keeps the log append-only.
 */
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import AuditPage from "@/app/desk/[shop]/audit/page";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import { db } from "@/db";
import { listAudit, recordAudit } from "@/db/queries/audit";
import { auditEvents, members, users } from "@/db/schema";
import { withShop } from "@/db/tx";
import { auditList } from "@/lib/validation/lists";
import { createShop, type TestShop } from "./fixtures";
import { actAs, pageAnswer } from "./helpers";
import { ownerDb } from "./owner-db";

const memberIdOf = async (shop: TestShop, userId: string) =>
  (await ownerDb.select({ id: members.id }).from(members).where(eq(members.userId, userId))).find(Boolean)!.id;

const list = (shop: TestShop, query: Record<string, string> = {}) => listAudit(shop.id, auditList.parse(query).query);

const databaseError = async (p: Promise<unknown>) =>
  p.then(
    () => "allowed",
    (e: unknown) => String((e as { cause?: { message?: string } }).cause?.message ?? (e as Error).message),
  );

describe("a member's role change", () => {
  it("is recorded with the manager, the member, and the role before and after", async () => {
    const shop = await createShop("kestrel");
    const memberId = await memberIdOf(shop, shop.customers[0].id);
    await actAs(shop.manager.email);
    expect(await changeMemberRole(shop.slug, { memberId, role: "estimator" })).toMatchObject({ ok: true });
    const { rows } = await list(shop);
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      action: "member.role",
      subjectType: "member",
      subjectId: memberId,
      actorUserId: shop.manager.id,
      actorName: shop.manager.name,
      changes: { role: { from: "customer", to: "estimator" } },
    });
    expect(rows[0]?.summary).toContain(shop.customers[0].email);
  });

  it("that is refused, or changes nothing, records nothing", async () => {
    const shop = await createShop("kestrel");
    await actAs(shop.manager.email);
    expect(await changeMemberRole(shop.slug, { memberId: await memberIdOf(shop, shop.manager.id), role: "customer" })).toMatchObject({ ok: false });
    expect(await changeMemberRole(shop.slug, { memberId: await memberIdOf(shop, shop.customers[1].id), role: "customer" })).toMatchObject({ ok: true });
    expect((await list(shop)).total).toBe(0);
  });
});

describe("the audit list", () => {
  async function shopWithLog() {
    const shop = await createShop("kestrel");
    const entry = (actor: string | null, action: string, subjectType: string, subjectId: string, summary: string) =>
      withShop(shop.id, (tx) => recordAudit(tx, shop.id, { actorUserId: actor, action, subjectType, subjectId, summary }));
    await entry(shop.manager.id, "member.role", "member", "m-1", "Role of Ada from customer to estimator");
    await entry(shop.estimator.id, "catalog-cell.update", "catalog-cell", "KBW-3000", "Unit cost of KBW-3000 from 41.20 to 39.80");
    await entry(shop.estimator.id, "catalog-cell.create", "catalog-cell", "KBW-0100", "Added KBW-0100");
    await entry(null, "quote.expire", "quote", "Q-2026-0001", "Expired after its validity");
    return shop;
  }
  const actions = (rows: { action: string }[]) => rows.map((r) => r.action);

  it("filters by a change or its family, by the person and by the record, and searches the summary", async () => {
    const shop = await shopWithLog();
    expect(actions((await list(shop, { action: "catalog-cell" })).rows).sort()).toEqual(["catalog-cell.create", "catalog-cell.update"]);
    expect(actions((await list(shop, { action: "catalog-cell.update" })).rows)).toEqual(["catalog-cell.update"]);
    // a family is matched at a dot, not as a prefix of a word
    expect((await list(shop, { action: "catalog" })).total).toBe(0);
    expect((await list(shop, { actor: shop.estimator.id })).total).toBe(2);
    expect(actions((await list(shop, { subject: "quote" })).rows)).toEqual(["quote.expire"]);
    expect(actions((await list(shop, { q: "41.20" })).rows)).toEqual(["catalog-cell.update"]);
    expect(actions((await list(shop, { q: "KBW-0100" })).rows)).toEqual(["catalog-cell.create"]);
  });

  it("sorts newest first, by change A to Z, by person (the system last), and pages", async () => {
    const shop = await shopWithLog();
    expect(actions((await list(shop)).rows)).toEqual(["quote.expire", "catalog-cell.create", "catalog-cell.update", "member.role"]);
    expect(actions((await list(shop, { sort: "action" })).rows)).toEqual(["catalog-cell.create", "catalog-cell.update", "member.role", "quote.expire"]);
    const byActor = (await list(shop, { sort: "actor" })).rows;
    expect(byActor.at(-1)?.actorUserId).toBeNull();
    const page2 = await list(shop, { size: "3", page: "2" });
    expect(page2).toMatchObject({ total: 4, page: 2 });
    expect(actions(page2.rows)).toEqual(["member.role"]);
  });

  it("refuses hostile filter values and falls back to the whole log", async () => {
    const parsed = auditList.parse({ action: "x' or 1=1 --", actor: "a b", subject: "../etc" });
    expect(parsed.query).toMatchObject({ action: "", actor: "", subject: "" });
    expect(parsed.issues.map((i) => i.path).sort()).toEqual(["action", "actor", "subject"]);
  });

  it("shows one shop none of another's entries, and only the manager opens the page", async () => {
    const a = await shopWithLog();
    const b = await shopWithLog();
    expect((await list(a)).rows.every((r) => r.actorUserId === null || [a.manager.id, a.estimator.id].includes(r.actorUserId))).toBe(true);
    expect((await list(a, { actor: b.estimator.id })).total).toBe(0);
    const render = () => AuditPage({ params: Promise.resolve({ shop: a.slug }), searchParams: Promise.resolve({ sort: "actor" }) });
    for (const [email, answer] of [
      [a.manager.email, "ok"],
      [a.estimator.email, "403"],
      [a.customers[0].email, "403"],
      [b.manager.email, "403"],
    ] as const) {
      await actAs(email);
      expect(await pageAnswer(render), email).toBe(answer);
    }
  });
});

describe("the log is append-only in the database", () => {
  it("the app's role may add entries but not change or remove one; not even the owner may", async () => {
    const shop = await createShop("marlow");
    await withShop(shop.id, (tx) =>
      recordAudit(tx, shop.id, { actorUserId: shop.manager.id, action: "member.role", subjectType: "member", subjectId: "m", summary: "original" }),
    );
    expect(await databaseError(withShop(shop.id, (tx) => tx.update(auditEvents).set({ summary: "rewritten" })))).toMatch(/permission denied/);
    expect(await databaseError(withShop(shop.id, (tx) => tx.delete(auditEvents)))).toMatch(/permission denied/);
    expect(await databaseError(db.execute(sql`truncate audit_events`))).toMatch(/permission denied/);
    expect(await databaseError(ownerDb.update(auditEvents).set({ summary: "rewritten" }).where(eq(auditEvents.shopId, shop.id)))).toMatch(
      /never changed or removed/,
    );
    expect(await databaseError(ownerDb.delete(auditEvents).where(eq(auditEvents.shopId, shop.id)))).toMatch(/never changed or removed/);
    expect((await list(shop)).rows.map((r) => r.summary)).toEqual(["original"]);
  });

  it("keeps an entry when the person who made it is removed: only their id goes", async () => {
    const shop = await createShop("marlow");
    await withShop(shop.id, (tx) =>
      recordAudit(tx, shop.id, { actorUserId: shop.customers[1].id, action: "member.role", subjectType: "member", subjectId: "m", summary: "kept" }),
    );
    await ownerDb.delete(users).where(eq(users.id, shop.customers[1].id));
    expect((await list(shop)).rows.map((r) => [r.summary, r.actorUserId])).toEqual([["kept", null]]);
  });
});
