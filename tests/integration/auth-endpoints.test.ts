/**
 * Every endpoint better-auth and its organization plugin mount under /api/auth/*, with the answer
 * each role gets over HTTP (through our route handler, as a browser reaches it), and the rules
 * the plugin obeys when our own server code calls it directly. A better-auth upgrade that adds an
 * endpoint fails the first test until the endpoint is placed in the table below.
 */
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as authGet, POST as authPost } from "@/app/api/auth/[...all]/route";
import { openShop } from "@/app/(auth)/open-shop/actions";
import { joinShop } from "@/app/s/[shop]/join/actions";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import { withShop } from "@/db/tx";
import { ownerDb as db } from "./owner-db";
import { members, shopSettings, shops, users } from "@/db/schema";
import { DEMO_PASSWORD, demoPeople } from "@/db/seed/people";
import { auth, randomId } from "@/lib/auth/server";
import { env } from "@/lib/env";
import { actAs, memberOf, sessionCookie, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const M = "marlow-pulse";
const people = {
  customer: demoPeople[K].customers[0].email,
  estimator: demoPeople[K].estimator.email,
  manager: demoPeople[K].manager.email,
  otherManager: demoPeople[M].manager.email,
};
type Role = "visitor" | keyof typeof people;
const ROLES: Role[] = ["visitor", "customer", "estimator", "manager", "otherManager"];

/** The endpoints the browser may call, with each role's answer. */
const OPEN: { path: string; method: "GET" | "POST"; answers: Record<Role, number> }[] = [
  // each role signs in as itself; the visitor has no account
  { path: "/sign-in/email", method: "POST", answers: { visitor: 401, customer: 200, estimator: 200, manager: 200, otherManager: 200 } },
  { path: "/get-session", method: "GET", answers: { visitor: 200, customer: 200, estimator: 200, manager: 200, otherManager: 200 } },
  { path: "/sign-out", method: "POST", answers: { visitor: 200, customer: 200, estimator: 200, manager: 200, otherManager: 200 } },
];

/** Everything else better-auth mounts: 404 to every role. */
const CLOSED: { path: string; method: "GET" | "POST" }[] = [
  { path: "/sign-in/social", method: "POST" },
  { path: "/callback/:id", method: "GET" },
  { path: "/sign-up/email", method: "POST" },
  { path: "/reset-password", method: "POST" },
  { path: "/verify-password", method: "POST" },
  { path: "/verify-email", method: "GET" },
  { path: "/send-verification-email", method: "POST" },
  { path: "/change-email", method: "POST" },
  { path: "/change-password", method: "POST" },
  { path: "/update-session", method: "POST" },
  { path: "/update-user", method: "POST" },
  { path: "/delete-user", method: "POST" },
  { path: "/request-password-reset", method: "POST" },
  { path: "/reset-password/:token", method: "GET" },
  { path: "/list-sessions", method: "GET" },
  { path: "/revoke-session", method: "POST" },
  { path: "/revoke-sessions", method: "POST" },
  { path: "/revoke-other-sessions", method: "POST" },
  { path: "/link-social", method: "POST" },
  { path: "/list-accounts", method: "GET" },
  { path: "/delete-user/callback", method: "GET" },
  { path: "/unlink-account", method: "POST" },
  { path: "/refresh-token", method: "POST" },
  { path: "/get-access-token", method: "POST" },
  { path: "/account-info", method: "GET" },
  { path: "/organization/create", method: "POST" },
  { path: "/organization/update", method: "POST" },
  { path: "/organization/delete", method: "POST" },
  { path: "/organization/set-active", method: "POST" },
  { path: "/organization/get-organization", method: "GET" },
  { path: "/organization/get-full-organization", method: "GET" },
  { path: "/organization/list", method: "GET" },
  { path: "/organization/invite-member", method: "POST" },
  { path: "/organization/cancel-invitation", method: "POST" },
  { path: "/organization/accept-invitation", method: "POST" },
  { path: "/organization/get-invitation", method: "GET" },
  { path: "/organization/reject-invitation", method: "POST" },
  { path: "/organization/list-invitations", method: "GET" },
  { path: "/organization/get-active-member", method: "GET" },
  { path: "/organization/check-slug", method: "POST" },
  { path: "/organization/remove-member", method: "POST" },
  { path: "/organization/update-member-role", method: "POST" },
  { path: "/organization/leave", method: "POST" },
  { path: "/organization/list-user-invitations", method: "GET" },
  { path: "/organization/list-members", method: "GET" },
  { path: "/organization/get-active-member-role", method: "GET" },
  { path: "/organization/has-permission", method: "POST" },
  { path: "/ok", method: "GET" },
  { path: "/error", method: "GET" },
];

const BASE = env.BETTER_AUTH_URL;

/** A request as the browser sends it to /api/auth/*, through our route handler. */
async function call(method: "GET" | "POST", path: string, cookie: string, body?: unknown, query = "") {
  const url = `${BASE}/api/auth${path.replace(/:(\w+)/g, "x")}${query}`;
  const headers = new Headers({ origin: BASE, "content-type": "application/json" });
  if (cookie) headers.set("cookie", cookie);
  const request = new Request(url, { method, headers, body: method === "POST" ? JSON.stringify(body ?? {}) : undefined });
  return method === "GET" ? authGet(request) : authPost(request);
}

describe("better-auth endpoints over HTTP", () => {
  const cookies: Record<Role, string> = { visitor: "", customer: "", estimator: "", manager: "", otherManager: "" };
  let kShopId = "";
  beforeAll(async () => {
    for (const role of Object.keys(people) as (keyof typeof people)[]) cookies[role] = await sessionCookie(people[role]);
    kShopId = (await shopBySlug(K)).id;
  });

  it("the table names every endpoint better-auth mounts with our configuration, once", () => {
    const mounted = Object.values(auth.api as Record<string, { path?: string }>)
      .map((e) => e.path)
      .filter((p): p is string => typeof p === "string")
      .sort();
    const listed = [...OPEN, ...CLOSED].map((e) => e.path).sort();
    expect(listed).toEqual(mounted);
  });

  describe.each(CLOSED)("$method $path", ({ method, path }) => {
    it("answers 404 to every role", async () => {
      for (const role of ROLES) {
        const query = `?organizationId=${kShopId}`;
        const res = await call(
          method,
          path,
          cookies[role],
          { organizationId: kShopId, slug: "desk", name: "Probe", email: people.customer, password: "long-enough-password", role: "manager", memberId: "x" },
          query,
        );
        expect(res.status, `${role}`).toBe(404);
      }
    });
  });

  it("sign-in answers each role as the table says, and a wrong password 401", async () => {
    for (const role of ROLES) {
      const email = role === "visitor" ? "nobody@nowhere.example" : people[role];
      const res = await call("POST", "/sign-in/email", "", { email, password: DEMO_PASSWORD });
      expect(res.status, role).toBe(OPEN[0]?.answers[role]);
    }
    expect((await call("POST", "/sign-in/email", "", { email: people.manager, password: "not-the-password" })).status).toBe(401);
  });

  it("get-session tells each signed-in role who they are, and a visitor nothing", async () => {
    for (const role of ROLES) {
      const res = await call("GET", "/get-session", cookies[role]);
      expect(res.status, role).toBe(200);
      const body = (await res.json()) as { user?: { email: string } } | null;
      expect(body?.user?.email ?? null, role).toBe(role === "visitor" ? null : people[role as keyof typeof people]);
    }
  });

  it("sign-out ends the session it is sent with", async () => {
    for (const role of ROLES) {
      const cookie = role === "visitor" ? "" : await sessionCookie(people[role as keyof typeof people]);
      const res = await call("POST", "/sign-out", cookie);
      expect(res.status, role).toBe(200);
      const after = (await (await call("GET", "/get-session", cookie)).json()) as { user?: unknown } | null;
      expect(after?.user ?? null, role).toBeNull();
    }
  });

  it("a write from another site is refused before anything else", async () => {
    const request = new Request(`${BASE}/api/auth/sign-out`, {
      method: "POST",
      headers: { origin: "https://evil.example", cookie: cookies.customer, "content-type": "application/json" },
      body: "{}",
    });
    expect((await authPost(request)).status).toBe(403);
  });
});

describe("the plugin called by our own server code obeys our rules", () => {
  // Our server code calls the plugin inside the shop's row-level security scope (db/tx.ts): a new
  // shop in withShop(its new id), everything else in withShop(the shop's id). Its hooks must hold there.
  const inNewShop = <T>(fn: () => Promise<T>) => withShop(randomId(), fn);
  const inShop = <T>(fn: () => Promise<T>) => withShop(kShopId, fn);
  let kShopId = "";
  let founderId = "";
  beforeAll(async () => {
    kShopId = (await shopBySlug(K)).id;
    founderId = (await memberOf(K, people.manager)).userId;
  });
  const headersOf = async (email: string) => new Headers({ cookie: await sessionCookie(email) });

  it.each(["desk", "sign-in", "api", "ab", "X..Y", "a/../x", "north--coast", "-edge"])("refuses to create a shop with the slug %j", async (slug) => {
    await expect(inNewShop(() => auth.api.createOrganization({ body: { name: "Probe Works", slug, userId: founderId } }))).rejects.toMatchObject({
      statusCode: 400,
    });
    expect(await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, slug))).toEqual([]);
  });

  it("never leaves a shop without its settings row", async () => {
    const slug = `settings-check-${Date.now().toString(36)}`;
    const shop = await inNewShop(() => auth.api.createOrganization({ body: { name: "Settings Check", slug, userId: founderId } }));
    const [settings] = await db.select({ currency: shopSettings.currency }).from(shopSettings).where(eq(shopSettings.shopId, shop!.id));
    expect(settings?.currency).toBe("EUR");
  });

  it("refuses a slug change to a reserved or malformed address", async () => {
    for (const slug of ["api", "a/../x", "Desk"]) {
      await expect(
        inShop(async () => auth.api.updateOrganization({ body: { organizationId: kShopId, data: { slug } }, headers: await headersOf(people.manager) })),
      ).rejects.toMatchObject({ statusCode: 400 });
    }
    expect((await shopBySlug(K)).slug).toBe(K);
  });

  it("moves roles only between estimator and customer: no promotion to manager, no demotion of the founder", async () => {
    const customer = await memberOf(K, demoPeople[K].customers[1].email);
    const founder = await memberOf(K, people.manager);
    const h = await headersOf(people.manager);
    await expect(
      inShop(() => auth.api.updateMemberRole({ body: { organizationId: kShopId, memberId: customer.id, role: "manager" }, headers: h })),
    ).rejects.toMatchObject({ statusCode: 403 });
    expect((await memberOf(K, demoPeople[K].customers[1].email)).role).toBe("customer");
    // a shop with a second manager (the data allows one): the co-manager cannot demote the founder
    const coManagerEmail = demoPeople[K].customers[0].email;
    const coManager = await memberOf(K, coManagerEmail);
    await db.update(members).set({ role: "manager" }).where(eq(members.id, coManager.id));
    try {
      await expect(
        inShop(async () =>
          auth.api.updateMemberRole({ body: { organizationId: kShopId, memberId: founder.id, role: "customer" }, headers: await headersOf(coManagerEmail) }),
        ),
      ).rejects.toMatchObject({ statusCode: 403 });
      await expect(
        inShop(async () =>
          auth.api.removeMember({ body: { organizationId: kShopId, memberIdOrEmail: people.manager }, headers: await headersOf(coManagerEmail) }),
        ),
      ).rejects.toMatchObject({ statusCode: 403 });
    } finally {
      await db.update(members).set({ role: "customer" }).where(eq(members.id, coManager.id));
    }
    expect((await memberOf(K, people.manager)).role).toBe("manager");
    // the one move the team page makes, also through the plugin
    await inShop(() => auth.api.updateMemberRole({ body: { organizationId: kShopId, memberId: customer.id, role: "estimator" }, headers: h }));
    expect((await memberOf(K, demoPeople[K].customers[1].email)).role).toBe("estimator");
    await inShop(() => auth.api.updateMemberRole({ body: { organizationId: kShopId, memberId: customer.id, role: "customer" }, headers: h }));
  });

  it("adds nobody as manager to a shop that has one, and invites nobody", async () => {
    const [outsider] = await db.select({ id: users.id }).from(users).where(eq(users.email, demoPeople[M].customers[1].email));
    await expect(inShop(() => auth.api.addMember({ body: { userId: outsider!.id, organizationId: kShopId, role: "manager" } }))).rejects.toMatchObject({
      statusCode: 403,
    });
    expect(
      await db
        .select({ id: members.id })
        .from(members)
        .where(and(eq(members.shopId, kShopId), eq(members.userId, outsider!.id))),
    ).toEqual([]);
    await expect(
      inShop(async () =>
        auth.api.createInvitation({
          body: { organizationId: kShopId, email: "probe@nowhere.example", role: "estimator" },
          headers: await headersOf(people.manager),
        }),
      ),
    ).rejects.toMatchObject({ statusCode: 403 });
  });

  it("lists a shop's members to its manager only: not to a customer, an estimator or another shop's manager", async () => {
    for (const email of [people.customer, people.estimator, people.otherManager]) {
      const h = await headersOf(email);
      await expect(
        inShop(() => auth.api.listMembers({ query: { organizationId: kShopId }, headers: h })),
        email,
      ).rejects.toMatchObject({ statusCode: 403 });
      await expect(
        inShop(() => auth.api.getFullOrganization({ query: { organizationId: kShopId }, headers: h })),
        email,
      ).rejects.toMatchObject({
        statusCode: 403,
      });
    }
    const h = await headersOf(people.manager);
    const list = await inShop(() => auth.api.listMembers({ query: { organizationId: kShopId }, headers: h }));
    expect(list.members.length).toBeGreaterThan(2);
  });

  it("outside any shop's scope the plugin cannot touch members at all: the database refuses", async () => {
    const [outsider] = await db.select({ id: users.id }).from(users).where(eq(users.email, demoPeople[M].customers[1].email));
    await expect(auth.api.addMember({ body: { userId: outsider!.id, organizationId: kShopId, role: "customer" } })).rejects.toMatchObject({
      cause: { code: "42501", message: expect.stringMatching(/outside withShop/) },
    });
    expect(
      await db
        .select({ id: members.id })
        .from(members)
        .where(and(eq(members.shopId, kShopId), eq(members.userId, outsider!.id))),
    ).toEqual([]);
  });

  it("the app's own uses keep working: open a shop, join it, change a role", async () => {
    const id = Date.now().toString(36);
    await actAs(null);
    const opened = await openShop({
      name: "Ada Quill",
      email: `ada.${id}@north-coast.example`,
      password: "a-long-enough-password",
      shopName: "North Coast Banks",
      slug: `north-coast-${id}`,
      currency: "GBP",
    });
    expect(opened).toEqual({ ok: true, data: { slug: `north-coast-${id}` } });
    const shop = await shopBySlug(`north-coast-${id}`);
    const [settings] = await db
      .select({ currency: shopSettings.currency, pricing: shopSettings.pricingRules })
      .from(shopSettings)
      .where(eq(shopSettings.shopId, shop.id));
    expect(settings?.currency).toBe("GBP");
    expect(settings?.pricing.currency).toBe("GBP");
    expect((await memberOf(`north-coast-${id}`, `ada.${id}@north-coast.example`)).role).toBe("manager");

    expect(await joinShop(`north-coast-${id}`, { name: "Bram Tollis", email: `bram.${id}@tollis-cranes.example`, password: "another-long-password" })).toEqual({
      ok: true,
      data: { slug: `north-coast-${id}` },
    });
    const bram = await memberOf(`north-coast-${id}`, `bram.${id}@tollis-cranes.example`);
    expect(bram.role).toBe("customer");

    (globalThis as { __requestHeaders?: Headers }).__requestHeaders = new Headers({
      cookie: await sessionCookie(`ada.${id}@north-coast.example`, "a-long-enough-password"),
    });
    expect(await changeMemberRole(`north-coast-${id}`, { memberId: bram.id, role: "estimator" })).toMatchObject({ ok: true });
    expect((await memberOf(`north-coast-${id}`, `bram.${id}@tollis-cranes.example`)).role).toBe("estimator");
  });
});
