/**
 * Rate limits: keyed on the connection's address (which scripts/serve.mjs appends to
 * X-Forwarded-For, as a reverse proxy does), never on what the client writes in the header;
 * counted in PostgreSQL so every app server shares them; and a per-account limit on failed
 * sign-ins that no number of addresses gets round. This file lowers the limits on purpose.
 */
import { randomInt } from "node:crypto";
import { eq, inArray, sql } from "drizzle-orm";
import { afterAll, describe, expect, it, vi } from "vitest";

vi.hoisted(() => {
  vi.stubEnv("API_RATE_LIMIT_PER_MINUTE", "3");
  vi.stubEnv("AUTH_SIGN_IN_LIMIT", "3");
  vi.stubEnv("AUTH_ACCOUNT_FAILURE_LIMIT", "5");
  // as under scripts/serve.mjs: the right-most X-Forwarded-For entry is the connection
  vi.stubEnv("PEER_ADDRESS_APPENDED", "true");
});

import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { POST as arrangementsRoute } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { ownerDb as db } from "./owner-db";
import { createDb } from "@/db/client";
import { rateLimits, signInFailures } from "@/db/schema";
import { DEMO_PASSWORD, demoPeople } from "@/db/seed/people";
import { accountKey } from "@/db/queries/sign-in-failures";
import { env } from "@/lib/env";
import { createPostgresRateLimitStore, leaseSize, sweepRateLimits } from "@/db/queries/rate-limits";

const K = "kestrel-bank-works";
afterAll(() => vi.unstubAllEnvs());

/** A connection address of its own for each use (RFC 1918 space), so tests do not share buckets. */
const peer = () => `10.${randomInt(256)}.${randomInt(256)}.${randomInt(1, 255)}`;
/** What a forging client sends, with the connection appended as the production server does. */
const forwarded = (forged: string, connection: string) => `${forged}, ${connection}`;

function search(xff: string) {
  return arrangementsRoute(
    new Request(`${env.APP_URL}/api/v1/shops/${K}/arrangements`, {
      method: "POST",
      headers: { "content-type": "application/json", "x-forwarded-for": xff, "x-real-ip": xff.split(",")[0] ?? "" },
      body: JSON.stringify({ maxVoltage: 48, minVoltage: 24, energy: 20_000 }),
    }),
    { params: Promise.resolve({ shop: K }) },
  );
}

function signIn(email: string, password: string, xff: string) {
  return authPost(
    new Request(`${env.BETTER_AUTH_URL}/api/auth/sign-in/email`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: env.BETTER_AUTH_URL, "x-forwarded-for": xff },
      body: JSON.stringify({ email, password }),
    }),
  );
}

describe("limits per client address", () => {
  it("the public API counts forged X-Forwarded-For / X-Real-IP values against the connection", async () => {
    const connection = peer();
    const statuses = [];
    for (let i = 1; i <= 5; i += 1) statuses.push((await search(forwarded(`198.51.100.${i}`, connection))).status);
    expect(statuses).toEqual([200, 200, 200, 429, 429]);
    const refused = await search(forwarded("198.51.100.99", connection));
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(0);
    // another connection has its own budget
    expect((await search(peer())).status).toBe(200);
  });

  it("sign-in: a new forged header per try buys no extra tries, and one address's tries lock out no other", async () => {
    const connection = peer();
    const statuses = [];
    for (let i = 1; i <= 5; i += 1)
      statuses.push((await signIn(`nobody-${i}.${connection}@nowhere.example`, "wrong-password", forwarded(`198.51.100.${i}`, connection))).status);
    expect(statuses).toEqual([401, 401, 401, 429, 429]);
    expect((await signIn(demoPeople[K].estimator.email, DEMO_PASSWORD, peer())).status).toBe(200);
  });
});

describe("failed sign-ins per account", () => {
  async function lockSequence(email: string) {
    const statuses = [];
    // five wrong passwords, each from an address of its own: no per-address limit is reached
    for (let i = 0; i < 5; i += 1) statuses.push((await signIn(email, `wrong-${i}`, peer())).status);
    const sixth = await signIn(email, DEMO_PASSWORD, peer());
    return { statuses, sixth };
  }
  const unlock = (email: string) =>
    db
      .update(signInFailures)
      .set({ lockedUntil: sql`now() - interval '1 second'` })
      .where(eq(signInFailures.accountKey, accountKey(email)));

  it("after five failures from five addresses the account waits, even for the right password, and the wait doubles", async () => {
    const email = demoPeople[K].customers[1].email;
    await db.delete(signInFailures).where(eq(signInFailures.accountKey, accountKey(email)));
    const { statuses, sixth } = await lockSequence(email);
    expect(statuses).toEqual([401, 401, 401, 401, 401]);
    expect(sixth.status).toBe(429);
    const first = Number(sixth.headers.get("retry-after"));
    expect(first).toBeGreaterThan(0);
    expect(first).toBeLessThanOrEqual(30);
    // the wait ends; one more failure waits twice as long
    await unlock(email);
    expect((await signIn(email, "wrong-again", peer())).status).toBe(401);
    const second = Number((await signIn(email, DEMO_PASSWORD, peer())).headers.get("retry-after"));
    expect(second).toBeGreaterThan(30);
    expect(second).toBeLessThanOrEqual(60);
    // after the wait the right password works and the count starts again
    await unlock(email);
    expect((await signIn(email, DEMO_PASSWORD, peer())).status).toBe(200);
    expect(
      await db
        .select()
        .from(signInFailures)
        .where(eq(signInFailures.accountKey, accountKey(email))),
    ).toEqual([]);
  });

  it("an e-mail no account has is answered exactly alike, so the lock tells nothing", async () => {
    const email = `nobody.${Date.now()}@nowhere.example`;
    const { statuses, sixth } = await lockSequence(email);
    expect(statuses).toEqual([401, 401, 401, 401, 401]);
    expect(sixth.status).toBe(429);
    expect(await sixth.json()).toMatchObject({ code: "ACCOUNT_WAIT" });
  });

  it("stores no e-mail address, only a digest of it", async () => {
    const rows = await db.select({ key: signInFailures.accountKey }).from(signInFailures);
    for (const r of rows) expect(r.key).toMatch(/^[0-9a-f]{64}$/);
  });
});

describe("the PostgreSQL store", () => {
  const rule = { limit: 10, windowSeconds: 60 };

  it("is shared by two app servers: forty concurrent requests on two connections pass exactly ten", async () => {
    const a = createDb(env.DATABASE_URL, 5);
    const b = createDb(env.DATABASE_URL, 5);
    try {
      const storeA = createPostgresRateLimitStore(a.db);
      const storeB = createPostgresRateLimitStore(b.db);
      const key = `test:shared:${peer()}`;
      const decisions = await Promise.all(Array.from({ length: 40 }, (_, i) => (i % 2 ? storeA : storeB).consume(key, rule)));
      expect(decisions.filter((d) => d.allowed)).toHaveLength(10);
      const [row] = await db.select({ count: rateLimits.count }).from(rateLimits).where(eq(rateLimits.key, key));
      expect(row?.count).toBe(40);
    } finally {
      await a.pool.end();
      await b.pool.end();
    }
  });

  it("a generous limit is taken a hundredth at a time: far fewer writes, never more than the limit across two servers", async () => {
    const a = createDb(env.DATABASE_URL, 5);
    const b = createDb(env.DATABASE_URL, 5);
    try {
      const generous = { limit: 1000, windowSeconds: 60 };
      expect(leaseSize(generous.limit)).toBe(10);
      const stores = [createPostgresRateLimitStore(a.db), createPostgresRateLimitStore(b.db)];
      const key = `test:lease:${peer()}`;
      let allowed = 0;
      for (let i = 0; i < 1000; i++) if ((await stores[i % 2]!.consume(key, generous)).allowed) allowed += 1;
      // the count moved ten at a time: about a hundred writes for a thousand requests, not a thousand
      const [row] = await db.select({ count: rateLimits.count }).from(rateLimits).where(eq(rateLimits.key, key));
      expect(row!.count % 10).toBe(0);
      expect(row!.count).toBeLessThanOrEqual(1020);
      for (let i = 0; i < 100; i++) if ((await stores[i % 2]!.consume(key, generous)).allowed) allowed += 1;
      // granted against the shared count: never above the limit; tokens one server took and did not
      // use are lost, at most (servers − 1) · (lease − 1) of them
      expect(allowed).toBeLessThanOrEqual(1000);
      expect(allowed).toBeGreaterThanOrEqual(1000 - 9);
      // a small limit stays exact
      expect(leaseSize(120)).toBe(1);
    } finally {
      await a.pool.end();
      await b.pool.end();
    }
  });

  it("starts a new window once the old one has ended, and sweeps ended windows", async () => {
    const store = createPostgresRateLimitStore(db);
    const key = `test:window:${peer()}`;
    await store.consume(key, { limit: 1, windowSeconds: 60 });
    expect(await store.consume(key, { limit: 1, windowSeconds: 60 })).toMatchObject({ allowed: false });
    await db
      .update(rateLimits)
      .set({ windowEndsAt: sql`now() - interval '1 second'` })
      .where(eq(rateLimits.key, key));
    expect(await store.consume(key, { limit: 1, windowSeconds: 60 })).toEqual({ allowed: true, remaining: 0 });

    const old = [`test:old:${peer()}`, `test:old:${peer()}`];
    await db.insert(rateLimits).values(old.map((k) => ({ key: k, count: 1, windowEndsAt: sql`now() - interval '2 minutes'` })));
    expect(await sweepRateLimits()).toBeGreaterThanOrEqual(2);
    expect(await db.select().from(rateLimits).where(inArray(rateLimits.key, old))).toEqual([]);
    expect(await db.select().from(rateLimits).where(eq(rateLimits.key, key))).toHaveLength(1);
  });
});
