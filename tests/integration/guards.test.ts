/**
 * Pages, server actions and route handlers answer the same situation the same way: one mapping
 * from "no such shop / signed out / not a member / role not allowed" to each kind's answer
 * (lib/auth/guards.ts). Here the team page, the change-role action and the members route — three
 * guards over the same shop — meet each situation.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { GET as membersRoute } from "@/app/api/v1/shops/[shop]/members/route";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import TeamPage from "@/app/desk/[shop]/team/page";
import { createShop, type TestShop } from "./fixtures";
import { actAs, pageAnswer, request, sessionCookie } from "./helpers";

let shop: TestShop;
let other: TestShop;

beforeAll(async () => {
  [shop, other] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
});

/** The three answers for a person (or nobody) asking about a shop slug. */
async function answers(slug: string, email: string | null) {
  await actAs(email);
  const page = await pageAnswer(() => TeamPage({ params: Promise.resolve({ shop: slug }), searchParams: Promise.resolve({}) }));
  // an empty input: past the guard it is refused at its fields, which changes nothing
  const action = await changeMemberRole(slug, {});
  const route = await membersRoute(request(`/api/v1/shops/${slug}/members`, { cookie: email ? await sessionCookie(email) : "" }), {
    params: Promise.resolve({ shop: slug }),
  });
  return { page, action: action.ok ? "ok" : action.code, route: route.status };
}

describe("one guard family", () => {
  it("no such shop: the not-found page, not-found, 404", async () => {
    expect(await answers("no-such-shop", shop.manager.email)).toEqual({ page: "404", action: "not-found", route: 404 });
  });

  it("signed out: to sign in and back to the page, unauthenticated, 401", async () => {
    const r = await answers(shop.slug, null);
    expect(r).toMatchObject({ action: "unauthenticated", route: 401 });
    const target = new URL(r.page.replace(/^redirect /, ""), "http://x");
    expect(target.pathname).toBe("/sign-in");
    expect(target.searchParams.get("shop")).toBe(shop.slug);
    expect(target.searchParams.get("next")).toBe(`/desk/${shop.slug}/team`);
  });

  it("a member of another shop: the not-allowed page, forbidden, 403", async () => {
    expect(await answers(shop.slug, other.manager.email)).toEqual({ page: "403", action: "forbidden", route: 403 });
  });

  it("a member whose role may not: the not-allowed page, forbidden, 403", async () => {
    expect(await answers(shop.slug, shop.estimator.email)).toEqual({ page: "403", action: "forbidden", route: 403 });
    expect(await answers(shop.slug, shop.customers[0].email)).toEqual({ page: "403", action: "forbidden", route: 403 });
  });

  it("a member whose role may: the page, the action's own answer, 200", async () => {
    expect(await answers(shop.slug, shop.manager.email)).toEqual({ page: "ok", action: "invalid", route: 200 });
  });
});
