/**
 * Two production servers (scripts/serve.mjs) behind haproxy on loopback, sharing one PostgreSQL
 * (started by scripts/test.mjs; scripts/cluster.mjs): quote numbers stay unique and gap-free when
 * both servers number at once, every e-mail goes out once although both run the job worker, a rate
 * limit counts requests to either server together, and a session made on one server works on the
 * other. Runs against the test database with the demo shops (after the browser tests).
 */
import { randomUUID } from "node:crypto";
import path from "node:path";
import { and, eq, like } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { createDb } from "@/db/client";
import { emailOutbox, quotes, shops } from "@/db/schema";
import { DEMO_PASSWORD, demoPeople } from "@/db/seed/people";
import { arrangements, chooseCheapest, gapFree, send, serverActionIds, signIn } from "../../scripts/http-client.mjs";

const LB = process.env.CLUSTER_URL ?? "";
const SERVERS = (process.env.CLUSTER_SERVERS ?? "").split(",").filter(Boolean);
const K = "kestrel-bank-works";
const REQUIREMENT = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 1 };
const owner = createDb(process.env.MIGRATION_DATABASE_URL ?? "", 2);
afterAll(() => owner.pool.end());

/** A loopback source address of this run's own, so per-address limits here start from zero. */
const block = 1 + Math.floor(Math.random() * 200);
let n = 0;
const source = () => `127.${block}.${Math.floor(++n / 250)}.${1 + (n % 250)}`;

const servedBy = (headers: Record<string, string | string[] | undefined>) => String(headers["x-served-by"] ?? "");

async function shopId(): Promise<string> {
  const [row] = await owner.db.select({ id: shops.id }).from(shops).where(eq(shops.slug, K));
  return row!.id;
}

async function waitFor<T>(what: string, read: () => Promise<T>, check: (v: T) => boolean, limitMs = 60_000): Promise<T> {
  const until = Date.now() + limitMs;
  for (;;) {
    const v = await read();
    if (check(v)) return v;
    if (Date.now() > until) throw new Error(`gave up waiting for ${what}: ${JSON.stringify(v).slice(0, 300)}`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

describe.skipIf(!LB)("two app servers behind haproxy", () => {
  it("both servers answer through the load balancer", async () => {
    expect(SERVERS).toHaveLength(2);
    const seen = new Set<string>();
    for (let i = 0; i < 6; i++) seen.add(servedBy((await send(LB, "GET", "/api/health", { from: source() })).headers));
    expect([...seen].sort()).toEqual(["app1", "app2"]);
  });

  it("50 quotes made at once through both servers get unique, gap-free numbers, and each e-mail goes out once", async () => {
    const actionId = serverActionIds(path.resolve(process.env.NEXT_DIST_DIR ?? ".next")).chooseArrangement!;
    const customer = demoPeople[K].customers[1];
    const cookie = await signIn(LB, customer.email, DEMO_PASSWORD, source());
    const { body } = await arrangements(LB, K, REQUIREMENT, source());
    const option = body!.options[0]!;
    const results = await Promise.all(
      Array.from({ length: 50 }, () => chooseCheapest(LB, { shop: K, actionId, cookie, requirement: REQUIREMENT, option, from: source() })),
    );
    const numbers = results.map((r) => (r.ok && r.data.kind === "quote" ? (r.data.quoteNumber ?? "") : ""));
    expect(
      numbers.every((q) => /^Q-\d{4}-\d{4}$/.test(q)),
      JSON.stringify(results.find((r) => !r.ok)),
    ).toBe(true);
    expect(new Set(numbers).size).toBe(50);
    expect(gapFree(numbers)).toBe(true);
    // and the shop's whole year has no gap, whichever server made which
    const year = numbers[0]!.slice(2, 6);
    const all = await owner.db
      .select({ number: quotes.number })
      .from(quotes)
      .where(and(eq(quotes.shopId, await shopId()), like(quotes.number, `Q-${year}-%`)));
    expect(gapFree(all.map((q) => q.number))).toBe(true);
    expect(
      Number(
        all
          .map((q) => q.number)
          .sort()
          .at(0)!
          .slice(-4),
      ),
    ).toBe(1);

    // both servers run the e-mail worker: every message is sent once
    const mine = await waitFor(
      "the 50 messages to be sent",
      () =>
        owner.db
          .select({ status: emailOutbox.status, attempts: emailOutbox.attempts, subject: emailOutbox.subject, messageId: emailOutbox.messageId })
          .from(emailOutbox),
      (rows) => numbers.every((q) => rows.some((r) => r.subject.includes(`${q} `) && r.status === "sent")),
    );
    for (const q of numbers) expect(mine.filter((r) => r.subject.includes(`${q} `)).map((r) => r.attempts)).toEqual([1]);
    // by each row's own Message-ID (a copy sent twice would carry the same one); the inbox also
    // keeps mail of earlier runs, whose quotes may have had the same numbers
    const inbox = (await (await fetch(`${process.env.MAIL_INBOX_URL}/api/email`)).json()) as { headers: Record<string, string> }[];
    for (const q of numbers) {
      const messageId = mine.find((r) => r.subject.includes(`${q} `))!.messageId;
      expect(messageId, q).toBeTruthy();
      expect(
        inbox.filter((m) => m.headers["message-id"] === messageId),
        q,
      ).toHaveLength(1);
    }
  });

  it("a rate limit counts a client's requests to either server together, and forged forwarding headers change nothing", async () => {
    const client = source();
    const answers = [];
    for (let i = 0; i < 30; i++) {
      const res = await send(LB, "POST", `/api/v1/shops/${K}/arrangements`, {
        headers: { "content-type": "application/json", "x-forwarded-for": `203.0.113.${i}` },
        body: JSON.stringify(REQUIREMENT),
        from: client,
      });
      answers.push({ status: res.status, by: servedBy(res.headers) });
    }
    expect(answers.every((a) => a.status === 200)).toBe(true);
    expect(new Set(answers.map((a) => a.by))).toEqual(new Set(["app1", "app2"]));
    // the 31st and 32nd, whichever server takes them, are over the shared limit of 30 a minute
    for (let i = 0; i < 2; i++) {
      const res = await send(LB, "POST", `/api/v1/shops/${K}/arrangements`, {
        headers: { "content-type": "application/json", "x-forwarded-for": randomUUID().slice(0, 8) },
        body: JSON.stringify(REQUIREMENT),
        from: client,
      });
      expect(res.status).toBe(429);
    }
    // another client still gets through
    expect((await arrangements(LB, K, REQUIREMENT, source())).status).toBe(200);
  });

  it("a drawing uploaded through one server downloads from either (UPLOAD_DIR is shared storage)", async () => {
    const customer = demoPeople[K].customers[0];
    const cookie = await signIn(LB, customer.email, DEMO_PASSWORD, source());
    // the smallest PDF: header and end marker (ISO 32000-1 §7.5.2)
    const pdf = "%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n";
    const boundary = `----faradsmith${randomUUID()}`;
    const body = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="spec.pdf"\r\nContent-Type: application/pdf\r\n\r\n${pdf}\r\n--${boundary}--\r\n`;
    const up = await send(LB, "POST", `/api/v1/shops/${K}/attachments`, {
      headers: { "content-type": `multipart/form-data; boundary=${boundary}`, cookie, origin: LB },
      body,
      from: source(),
    });
    expect(up.status, up.text).toBe(201);
    const { id } = JSON.parse(up.text) as { id: string };
    for (const server of SERVERS) {
      const down = await send(server, "GET", `/api/v1/shops/${K}/attachments/${id}`, { headers: { cookie } });
      expect(down.status, server).toBe(200);
      expect(down.text, server).toBe(pdf);
    }
  });

  it("a session made on one server works on the other", async () => {
    const manager = demoPeople[K].manager;
    // signed in through the load balancer (the address browsers use), on whichever server took it
    const cookie = await signIn(LB, manager.email, DEMO_PASSWORD, source());
    for (const server of [...SERVERS, LB, LB]) {
      const res = await send(server, "GET", "/api/auth/get-session", { headers: { cookie } });
      expect(res.status, server).toBe(200);
      expect(JSON.parse(res.text)?.user?.email, server).toBe(manager.email);
      const desk = await send(server, "GET", `/desk/${K}/team`, { headers: { cookie } });
      expect(desk.status, server).toBe(200);
      expect(desk.text, server).toContain(demoPeople[K].estimator.email);
    }
  });
});
