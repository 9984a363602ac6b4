/**
 * A NUL byte anywhere a client can put one (path, query, JSON string or key, form field, an
 * action's arguments) is a 400 or a field error, never a server error: PostgreSQL refuses 0x00
 * in text, so it is refused at the boundary. And our server actions answer malformed input with
 * a result, never by throwing.
 */
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { openShop } from "@/app/(auth)/open-shop/actions";
import { GET as downloadAttachmentRoute } from "@/app/api/v1/shops/[shop]/attachments/[id]/route";
import { POST as arrangementsRoute } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { GET as membersRoute } from "@/app/api/v1/shops/[shop]/members/route";
import { GET as quotePdfRoute } from "@/app/api/v1/shops/[shop]/quotes/[number]/pdf/route";
import { GET as quotesRoute } from "@/app/api/v1/shops/[shop]/quotes/route";
import { POST as evaluateRoute } from "@/app/api/v1/networks/evaluate/route";
import { changeMemberRole } from "@/app/desk/[shop]/team/actions";
import { chooseArrangement, exploreArrangements } from "@/app/s/[shop]/actions";
import { joinShop } from "@/app/s/[shop]/join/actions";
import { demoPeople } from "@/db/seed/people";
import { env } from "@/lib/env";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { proxy } from "@/proxy";
import { actAs, memberOf, request, sessionCookie } from "./helpers";

const K = "kestrel-bank-works";
const NUL = "\u0000";
const kManager = demoPeople[K].manager.email;
const kCustomer = demoPeople[K].customers[0].email;
const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });

describe("NUL in the URL is refused before any route runs", () => {
  it.each([
    "/s/%00",
    "/s/kestrel%00works",
    `/desk/${K}/quotes?q=%00`,
    `/desk/${K}/team?q=a%00b`,
    `/sign-in?next=%00`,
    "/api/v1/shops/%00/members",
    `/api/v1/shops/${K}/members?q=%00`,
    `/api/v1/shops/${K}/quotes/Q-%00/pdf`,
    `/api/auth/get-session?x=%00`,
  ])("%s → 400", async (path) => {
    const res = await proxy(new NextRequest(`http://127.0.0.1:3000${path}`));
    expect(res.status).toBe(400);
    if (path.startsWith("/api/")) expect(await res.json()).toMatchObject({ error: expect.any(String) });
  });

  it("lets an ordinary address through", async () => {
    expect((await proxy(new NextRequest(`http://127.0.0.1:3000/s/${K}?q=%25a`))).status).toBe(200);
  });
});

describe("server-action requests Next.js could not decode are refused before it tries", () => {
  const action = (body: string, headers: Record<string, string> = {}) =>
    proxy(
      new NextRequest(`${env.APP_URL}/s/${K}/join`, {
        method: "POST",
        body,
        headers: { "next-action": "a".repeat(42), "content-type": "text/plain;charset=UTF-8", origin: new URL(env.APP_URL).origin, ...headers },
      }),
    );

  it.each([
    ["a body that is not JSON", "not json {"],
    ["an empty body", ""],
    ["arguments nested 50 000 deep", `[${"[".repeat(50_000)}${"]".repeat(50_000)}]`],
  ])("%s → 400", async (_label, body) => {
    expect((await action(body)).status).toBe(400);
  });

  it("a call from another site → 403; our own arguments pass on", async () => {
    expect((await action(JSON.stringify([K, {}]), { origin: "https://evil.example" })).status).toBe(403);
    expect((await action(JSON.stringify([K, { name: "Ada" }]))).status).toBe(200);
  });
});

describe("route handlers, behind the proxy as well", () => {
  it("query strings and path segments with NUL are 400 or 404, never a server error", async () => {
    const cookie = await sessionCookie(kManager);
    expect((await membersRoute(request(`/api/v1/shops/${K}/members?q=a%00b`, { cookie }), params({ shop: K }))).status).toBe(400);
    expect((await membersRoute(request(`/api/v1/shops/x/members`, { cookie }), params({ shop: NUL }))).status).toBe(404);
    expect((await quotesRoute(request(`/api/v1/shops/${K}/quotes?q=a%00b`, { cookie }), params({ shop: K }))).status).toBeLessThan(500);
    expect((await downloadAttachmentRoute(request(`/api/v1/shops/${K}/attachments/x`, { cookie }), params({ shop: K, id: NUL }))).status).toBe(404);
    expect((await quotePdfRoute(request(`/api/v1/shops/${K}/quotes/x/pdf`, { cookie }), params({ shop: K, number: `Q-${NUL}` }))).status).toBe(404);
  });

  it.each([
    ["a string value", { maxVoltage: 48, energy: 20_000, technology: `edlc${NUL}` }, "technology"],
    ["an object key", { maxVoltage: 48, energy: 20_000, [`x${NUL}`]: 1 }, `x${NUL}`],
    ["a nested value", { maxVoltage: 48, energy: 20_000, backup: { power: 1, seconds: 1, note: [`a${NUL}`] } }, "backup.note.0"],
  ])("a JSON body with NUL in %s is a 400 naming the field", async (_label, body, field) => {
    const res = await arrangementsRoute(
      request(`/api/v1/shops/${K}/arrangements`, { method: "POST", body: JSON.stringify(body), headers: { "content-type": "application/json" } }),
      params({ shop: K }),
    );
    expect(res.status).toBe(400);
    expect(((await res.json()) as { issues: { path: string }[] }).issues[0]?.path).toBe(field);
  });

  it("the public endpoints answer a NUL shop or cell id with 404 / 400", async () => {
    const body = JSON.stringify({ maxVoltage: 48, energy: 20_000 });
    expect((await arrangementsRoute(request(`/api/v1/shops/x/arrangements`, { method: "POST", body }), params({ shop: NUL }))).status).toBe(404);
    const network = JSON.stringify({ network: { kind: "cell", id: `c${NUL}`, capacitance: 1, ratedVoltage: 2.7 } });
    expect((await evaluateRoute(request(`/api/v1/networks/evaluate`, { method: "POST", body: network }))).status).toBe(400);
  });

  it("a JSON body nested a hundred thousand deep is a 400, not a crash", async () => {
    const deep = `${"[".repeat(100_000)}${"]".repeat(100_000)}`;
    const res = await arrangementsRoute(request(`/api/v1/shops/${K}/arrangements`, { method: "POST", body: deep }), params({ shop: K }));
    expect(res.status).toBe(400);
  });
});

describe("server actions", () => {
  const newAccount = () => ({ name: "Tobin Searle", email: `tobin.${Date.now()}@harl-quarry.example`, password: "quarry-crane-password" });

  it("a NUL in a form field comes back as that field's error", async () => {
    await actAs(null);
    expect(await joinShop(K, { ...newAccount(), name: `Tobin${NUL}` })).toMatchObject({
      ok: false,
      code: "invalid",
      fieldErrors: { name: [expect.stringContaining("NUL")] },
    });
    expect(await openShop({ ...newAccount(), shopName: `North${NUL}Coast`, slug: `north-${Date.now()}`, currency: "EUR" })).toMatchObject({
      ok: false,
      code: "invalid",
      fieldErrors: { shopName: [expect.any(String)] },
    });
    await actAs(kManager);
    expect(await changeMemberRole(K, { memberId: `x${NUL}`, role: "estimator" })).toMatchObject({ ok: false, code: "invalid" });
    await actAs(kCustomer);
    const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };
    const r = await chooseArrangement(K, { idempotencyKey: crypto.randomUUID(), requirement, notes: `see drawing${NUL}` });
    expect(r).toMatchObject({ ok: false, code: "invalid", fieldErrors: { notes: [expect.any(String)] } });
  });

  it("a NUL or junk shop slug is simply not found", async () => {
    await actAs(null);
    for (const slug of [NUL, `${K}${NUL}`, "../../etc", "x".repeat(10_000)]) {
      expect(await exploreArrangements(slug, EMPTY_REQUEST_FORM), slug.slice(0, 20)).toMatchObject({ ok: false, code: "not-found" });
      expect(await joinShop(slug, newAccount())).toMatchObject({ ok: false, code: "not-found" });
    }
  });

  const junk: [string, unknown][] = [
    ["null", null],
    ["undefined", undefined],
    ["a number", 42],
    ["a string", "name=x&email=y"],
    ["an array", [1, 2, 3]],
    ["an empty object", {}],
    ["objects where strings go", { name: { a: 1 }, email: ["x"], password: 12, memberId: {}, role: [], idempotencyKey: { toString: 1 } }],
    ["a deep nest", JSON.parse(`${'{"a":'.repeat(5_000)}1${"}".repeat(5_000)}`)],
    ["a very long field", { name: "x".repeat(200_000), email: `${"y".repeat(200_000)}@x.example`, password: "z".repeat(200_000), notes: "n".repeat(200_000) }],
    ["a prototype key", JSON.parse('{"__proto__":{"admin":true},"constructor":{"prototype":{"x":1}}}')],
  ];

  it.each(junk)("answers %s with a result, never by throwing", async (_label, input) => {
    const manager = await memberOf(K, kManager);
    const calls: [string, () => Promise<{ ok: boolean }>][] = [
      ["openShop", async () => (await actAs(null), openShop(input))],
      ["joinShop", async () => (await actAs(null), joinShop(K, input))],
      ["exploreArrangements", async () => (await actAs(null), exploreArrangements(K, input))],
      ["chooseArrangement", async () => (await actAs(kCustomer), chooseArrangement(K, input))],
      ["changeMemberRole", async () => (await actAs(kManager), changeMemberRole(K, input))],
    ];
    for (const [name, call] of calls) {
      const r = await call();
      expect(r.ok, name).toBe(false);
    }
    expect((await memberOf(K, kManager)).role).toBe(manager.role);
    expect(({} as Record<string, unknown>).admin).toBeUndefined();
  });
});
