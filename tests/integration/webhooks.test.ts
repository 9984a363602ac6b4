/**
 * Outbound webhooks end to end: endpoints registered through the desk's actions, events recorded
 * with their cause, deliveries sent by the real worker (pg-boss) to a receiver on loopback that
 * checks every signature with the very snippet the reference page publishes; retries after a 500,
 * nothing after the endpoint is deleted, replays, an endpoint stopped after failing for days with
 * its managers told, and the address rules as production applies them (no loopback, no private or
 * link-local ranges) at registration and at delivery.
 */
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { and, eq } from "drizzle-orm";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import {
  createWebhookEndpoint,
  deleteWebhookEndpoint,
  replayWebhookDelivery,
  rollWebhookSecret,
  setWebhookEndpointState,
  updateWebhookEndpoint,
} from "@/app/desk/[shop]/webhooks/actions";
import { ownerDb as db } from "./owner-db";
import { recordShopEvent } from "@/db/queries/shop-events";
import { auditEvents, emailOutbox, webhookDeliveries, webhookEndpoints } from "@/db/schema";
import { withShop } from "@/db/tx";
import { buildOutboxMessage } from "@/lib/mail/messages";
import { stopBoss } from "@/lib/mail/queue";
import type { ShopEventType } from "@/lib/vocabulary";
import { configureWebhooks, webhookSettings, type WebhookSettings } from "@/lib/webhooks/config";
import { attemptDelivery } from "@/lib/webhooks/deliver";
import { VERIFY_SNIPPET, WEBHOOK_HEADERS } from "@/lib/webhooks/signature";
import { dispatchWebhooks, startWebhookWorker, stopWebhookWorker } from "@/lib/webhooks/worker";
import { createShop, type TestShop } from "./fixtures";
import { actAs, waitFor } from "./helpers";

interface Received {
  headers: http.IncomingHttpHeaders;
  body: string;
  verified: boolean;
}

let shop: TestShop;
let verify: (rawBody: string, headers: http.IncomingHttpHeaders, secret: string) => boolean;
let server: http.Server;
let port = 0;
/** what each path of the receiver answers, in turn (the last one repeats) */
const script = new Map<string, number[]>();
const received = new Map<string, Received[]>();
/** each path's signing secret, to verify what arrives there */
const secrets = new Map<string, string>();

const quick: Partial<WebhookSettings> = { retryBaseMs: 200, retryMaxMs: 400, pollIntervalMs: 200, maxAttempts: 4, allowLoopback: true, timeoutMs: 5000 };
const original = webhookSettings();

const hits = (p: string) => received.get(p) ?? [];

async function addEndpoint(p: string, events: ShopEventType[], statuses: number[] = [200]) {
  script.set(p, statuses);
  await actAs(shop.manager.email);
  const r = await createWebhookEndpoint(shop.slug, { url: `http://127.0.0.1:${port}${p}`, description: `test ${p}`, events });
  if (!r.ok) throw new Error(JSON.stringify(r));
  secrets.set(p, r.data.secret);
  return r.data.id;
}

const record = (type: ShopEventType, payload: Record<string, unknown>) => withShop(shop.id, (tx) => recordShopEvent(tx, shop.id, type, payload));

const deliveriesOf = (endpointId: string) => db.select().from(webhookDeliveries).where(eq(webhookDeliveries.endpointId, endpointId));

beforeAll(async () => {
  shop = await createShop();
  // the receiver checks signatures with the text the reference page prints, not with our own code
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-verify-")), "verify.mjs");
  fs.writeFileSync(file, VERIFY_SNIPPET);
  verify = (await import(pathToFileURL(file).href)).verifyFaradsmithWebhook;
  server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      const p = req.url ?? "/";
      const body = Buffer.concat(chunks).toString("utf8");
      const list = received.get(p) ?? [];
      list.push({ headers: req.headers, body, verified: verify(body, req.headers, secrets.get(p) ?? "") });
      received.set(p, list);
      const plan = script.get(p) ?? [200];
      const status = plan.length > 1 ? (plan.shift() as number) : (plan[0] ?? 200);
      res.writeHead(status, { "content-type": "text/plain" }).end(status < 300 ? "ok" : "not now");
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  port = (server.address() as { port: number }).port;
  configureWebhooks(quick);
  await startWebhookWorker();
});

afterEach(() => configureWebhooks(quick));

afterAll(async () => {
  await stopWebhookWorker();
  await stopBoss();
  configureWebhooks(original);
  await new Promise((resolve) => server.close(resolve));
});

describe("deliveries", () => {
  it("a receiver on loopback gets each event once per delivery, signed, and only the events it takes", async () => {
    const endpoint = await addEndpoint("/orders", ["quote.accepted", "order.status_changed"]);
    const accepted = await record("quote.accepted", { quoteNumber: "Q-2026-0042", revision: 2 });
    const moved = await record("order.status_changed", { orderNumber: "O-2026-0007", from: "kitting", to: "assembling" });
    await record("catalog.imported", { created: 3 }); // not taken by this endpoint

    const got = await waitFor(
      "two deliveries",
      () => hits("/orders"),
      (l) => l.length >= 2,
    );
    const byId = new Map(got.map((r) => [r.headers[WEBHOOK_HEADERS.eventId], r]));
    expect([...byId.keys()].sort()).toEqual([accepted, moved].sort());
    for (const r of got) {
      expect(r.verified, "signature checked with the published snippet").toBe(true);
      expect(r.headers["content-type"]).toBe("application/json");
      const body = JSON.parse(r.body) as { id: string; type: string; shop: string; data: Record<string, unknown> };
      expect(body.id).toBe(r.headers[WEBHOOK_HEADERS.eventId]);
      expect(body.type).toBe(r.headers[WEBHOOK_HEADERS.eventType]);
      expect(body.shop).toBe(shop.slug);
    }
    expect(JSON.parse(byId.get(accepted)?.body ?? "{}").data).toEqual({ quoteNumber: "Q-2026-0042", revision: 2 });
    // a tampered body or a foreign secret does not verify
    const one = got[0] as Received;
    expect(verify(`${one.body} `, one.headers, secrets.get("/orders") ?? "")).toBe(false);
    expect(verify(one.body, one.headers, "fsw_not-the-secret")).toBe(false);

    // nothing is due any more, so nothing is sent again
    const endpointRows = await waitFor(
      "the deliveries to be logged",
      () => deliveriesOf(endpoint),
      (rows) => rows.length === 2 && rows.every((r) => r.state === "delivered"),
    );
    const mine = endpointRows.filter((r) => r.eventId === accepted || r.eventId === moved);
    expect(mine.map((r) => [r.state, r.attempts, r.lastStatusCode])).toEqual([
      ["delivered", 1, 200],
      ["delivered", 1, 200],
    ]);
    expect(mine.every((r) => r.lastDurationMs !== null && r.nextAttemptAt === null)).toBe(true);
    expect(await dispatchWebhooks()).toBe(0);
    expect(hits("/orders")).toHaveLength(2);
  });

  it("a receiver that answers 500 gets the same event again, with a fresh signature, until it answers 2xx", async () => {
    const id = await addEndpoint("/flaky", ["quote.issued"], [500, 500, 204]);
    const event = await record("quote.issued", { quoteNumber: "Q-2026-0050", revision: 1 });
    const got = await waitFor(
      "three attempts",
      () => hits("/flaky"),
      (l) => l.length >= 3,
    );
    expect(got.map((r) => r.headers[WEBHOOK_HEADERS.eventId])).toEqual([event, event, event]);
    expect(new Set(got.map((r) => r.headers[WEBHOOK_HEADERS.deliveryId])).size).toBe(1);
    expect(got.every((r) => r.verified)).toBe(true);
    const [row] = await waitFor(
      "the delivery to be delivered",
      () => deliveriesOf(id),
      (rows) => rows[0]?.state === "delivered",
    );
    expect(row).toMatchObject({ state: "delivered", attempts: 3, lastStatusCode: 204, lastError: null });
    const endpoint = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id));
    expect(endpoint[0]?.failingSince).toBeNull();
  });

  it("gives up after the last attempt and logs why", async () => {
    const id = await addEndpoint("/down", ["payment.refunded"], [503]);
    await record("payment.refunded", { orderNumber: "O-2026-0009", amount: "120.00" });
    const [row] = await waitFor(
      "the delivery to fail",
      () => deliveriesOf(id),
      (rows) => rows[0]?.state === "failed",
    );
    expect(row).toMatchObject({
      attempts: webhookSettings().maxAttempts,
      lastStatusCode: 503,
      lastError: "Answered 503.",
      nextAttemptAt: null,
      lastResponse: "not now",
    });
    expect(hits("/down")).toHaveLength(webhookSettings().maxAttempts);
  });

  it("sends nothing more after the endpoint is deleted", async () => {
    const id = await addEndpoint("/gone", ["quote.accepted"], [500]);
    await record("quote.accepted", { quoteNumber: "Q-2026-0060", revision: 1 });
    await waitFor(
      "a first failed attempt",
      () => deliveriesOf(id),
      (rows) => rows[0]?.state === "retrying",
    );
    await actAs(shop.manager.email);
    expect(await deleteWebhookEndpoint(shop.slug, { id })).toMatchObject({ ok: true });
    const seen = hits("/gone").length;
    await record("quote.accepted", { quoteNumber: "Q-2026-0061", revision: 1 });
    expect(await deliveriesOf(id)).toEqual([]);
    // the retry that was due is gone with the endpoint: nothing is due for it, nothing arrives
    expect((await db.select().from(webhookDeliveries).where(eq(webhookDeliveries.endpointId, id))).length).toBe(0);
    await dispatchWebhooks();
    expect(hits("/gone")).toHaveLength(seen);
    const audit = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.shopId, shop.id), eq(auditEvents.subjectId, id)));
    expect(audit.map((a) => a.action).sort()).toEqual(["webhook-endpoint.create", "webhook-endpoint.delete"]);
  });

  it("a replay sends the same event id again as a delivery of its own; a stopped endpoint gets nothing", async () => {
    const id = await addEndpoint("/replay", ["catalog.imported"]);
    const event = await record("catalog.imported", { created: 12, updated: 3 });
    await waitFor(
      "the first delivery",
      () => hits("/replay"),
      (l) => l.length >= 1,
    );
    const [first] = await waitFor(
      "it to be logged",
      () => deliveriesOf(id),
      (rows) => rows[0]?.state === "delivered",
    );
    await actAs(shop.manager.email);
    expect(await replayWebhookDelivery(shop.slug, { deliveryId: first?.id ?? "" })).toMatchObject({ ok: true });
    const got = await waitFor(
      "the replay",
      () => hits("/replay"),
      (l) => l.length >= 2,
    );
    expect(got.map((r) => r.headers[WEBHOOK_HEADERS.eventId])).toEqual([event, event]);
    expect(got[1]?.headers[WEBHOOK_HEADERS.deliveryId]).not.toBe(got[0]?.headers[WEBHOOK_HEADERS.deliveryId]);
    expect((await deliveriesOf(id)).filter((d) => d.isReplay)).toHaveLength(1);

    expect(await setWebhookEndpointState(shop.slug, { id, state: "disabled" })).toMatchObject({ ok: true, data: { state: "disabled" } });
    await record("catalog.imported", { created: 1 });
    expect(await replayWebhookDelivery(shop.slug, { deliveryId: first?.id ?? "" })).toMatchObject({ ok: false, code: "conflict" });
    expect(await dispatchWebhooks()).toBe(0);
    expect(hits("/replay")).toHaveLength(2);
  });

  it("a new secret signs from then on; the endpoint's settings change and are audited", async () => {
    const id = await addEndpoint("/rolled", ["quote.issued"]);
    await actAs(shop.manager.email);
    const rolled = await rollWebhookSecret(shop.slug, { id });
    if (!rolled.ok) throw new Error(JSON.stringify(rolled));
    const old = secrets.get("/rolled") ?? "";
    secrets.set("/rolled", rolled.data.secret);
    expect(rolled.data.secret).not.toBe(old);
    const stored = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id));
    expect(stored[0]?.secretCiphertext).not.toContain(rolled.data.secret);
    expect(stored[0]?.secretHint).toBe(`…${rolled.data.secret.slice(-4)}`);
    await record("quote.issued", { quoteNumber: "Q-2026-0070", revision: 1 });
    const [got] = await waitFor(
      "the delivery",
      () => hits("/rolled"),
      (l) => l.length >= 1,
    );
    expect(got?.verified).toBe(true);
    expect(verify(got?.body ?? "", got?.headers ?? {}, old)).toBe(false);

    const changed = await updateWebhookEndpoint(shop.slug, {
      id,
      url: `http://127.0.0.1:${port}/rolled`,
      description: "stock system",
      events: ["quote.issued", "quote.accepted"],
    });
    expect(changed).toMatchObject({ ok: true });
    const audit = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.shopId, shop.id), eq(auditEvents.subjectId, id)));
    const update = audit.find((a) => a.action === "webhook-endpoint.update");
    expect(Object.keys(update?.changes ?? {}).sort()).toEqual(["description", "events"]);
    expect(audit.map((a) => a.action)).toContain("webhook-endpoint.roll-secret");
  });

  it("stops an endpoint that has failed for days, cancels what was waiting and e-mails the shop's managers", async () => {
    const id = await addEndpoint("/dead", ["order.status_changed"], [502]);
    // it has been failing for four days (more than the three the settings allow)
    await db
      .update(webhookEndpoints)
      .set({ failingSince: new Date(Date.now() - 4 * 86_400_000) })
      .where(eq(webhookEndpoints.id, id));
    await record("order.status_changed", { orderNumber: "O-2026-0011", to: "testing" });
    await waitFor(
      "the endpoint to stop",
      () => db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id)),
      (r) => r[0]?.state === "disabled",
    );
    const [row] = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id));
    expect(row?.disabledReason).toMatch(/Answered 502/);
    await record("order.status_changed", { orderNumber: "O-2026-0011", to: "ready" });
    // the retry that was waiting is marked not sent; the later event made no delivery at all
    expect((await deliveriesOf(id)).map((d) => [d.state, d.attempts, d.nextAttemptAt])).toEqual([["cancelled", 1, null]]);
    const mail = await db
      .select()
      .from(emailOutbox)
      .where(and(eq(emailOutbox.shopId, shop.id), eq(emailOutbox.kind, "webhook-stopped")));
    expect(mail.map((m) => m.toEmail)).toEqual([shop.manager.email]);
    const message = await buildOutboxMessage(mail[0]!);
    expect(message.html).toContain(`http://127.0.0.1:${port}/dead`);
    expect(message.text).toContain(`/desk/${shop.slug}/webhooks/${id}`);
    const audit = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.subjectId, id), eq(auditEvents.action, "webhook-endpoint.stop")));
    expect(audit).toHaveLength(1);
    expect(audit[0]?.actorUserId).toBeNull();

    // started again by a manager: it is healthy again and takes new events
    await actAs(shop.manager.email);
    expect(await setWebhookEndpointState(shop.slug, { id, state: "active" })).toMatchObject({ ok: true });
    const [restarted] = await db.select().from(webhookEndpoints).where(eq(webhookEndpoints.id, id));
    expect(restarted).toMatchObject({ state: "active", failingSince: null, disabledReason: null });
  });
});

describe("where webhooks may go", () => {
  const refusedUrl = async (url: string) => {
    await actAs(shop.manager.email);
    const r = await createWebhookEndpoint(shop.slug, { url, description: "", events: ["quote.issued"] });
    return r.ok ? null : (r.fieldErrors?.url?.[0] ?? r.message ?? r.code);
  };

  beforeEach(() => configureWebhooks({ ...quick, allowLoopback: false }));

  it.each([
    ["a private-network address", "http://10.0.0.5/hook", /private-network/],
    ["a private 192.168 address", "https://192.168.1.20/hook", /private-network/],
    ["the cloud metadata address (link-local)", "http://169.254.169.254/latest", /link-local/],
    ["an IPv6 unique-local address", "http://[fd00::1]/hook", /private-network/],
    ["loopback", "http://127.0.0.1:8080/hook", /loopback/],
    ["IPv6 loopback", "http://[::1]:8080/hook", /loopback/],
    ["a name for loopback", "http://localhost:8080/hook", /localhost resolves to .*loopback/],
    ["an IPv4-mapped private address", "http://[::ffff:10.1.1.1]/hook", /private-network/],
    ["carrier-grade NAT", "http://100.64.0.9/hook", /carrier-grade NAT/],
    ["another scheme", "ftp://files.example.com/drop", /Only http/],
    ["credentials in the address", "https://user:pw@hooks.example.com/x", /No user name or password/],
  ])("refuses %s in production mode, at the field", async (_what, url, message) => {
    expect(await refusedUrl(url)).toMatch(message);
  });

  it("refuses a name that resolves to a private address, and takes one that resolves to a public one", async () => {
    configureWebhooks({ ...quick, allowLoopback: false, resolve: async () => [{ address: "192.168.7.7", family: 4 }] });
    expect(await refusedUrl("https://erp.shop-systems.example/hooks")).toMatch(
      /erp\.shop-systems\.example resolves to 192\.168\.7\.7 is a private-network address/,
    );
    configureWebhooks({
      ...quick,
      allowLoopback: false,
      resolve: async () => [
        { address: "93.184.216.34", family: 4 },
        { address: "10.0.0.1", family: 4 },
      ],
    });
    expect(await refusedUrl("https://mixed.shop-systems.example/hooks")).toMatch(/10\.0\.0\.1/);
    configureWebhooks({ ...quick, allowLoopback: false, resolve: async () => [{ address: "93.184.216.34", family: 4 }] });
    expect(await refusedUrl("https://erp.shop-systems.example/hooks")).toBeNull();
    await db.delete(webhookEndpoints).where(and(eq(webhookEndpoints.shopId, shop.id), eq(webhookEndpoints.url, "https://erp.shop-systems.example/hooks")));
  });

  it("checks again at delivery: an endpoint saved while loopback was allowed gets nothing once it is not", async () => {
    await stopWebhookWorker();
    try {
      configureWebhooks({ ...quick, allowLoopback: true });
      const id = await addEndpoint("/later", ["quote.accepted"]);
      configureWebhooks({ ...quick, allowLoopback: false });
      await record("quote.accepted", { quoteNumber: "Q-2026-0080", revision: 1 });
      const [d] = await deliveriesOf(id);
      expect(await attemptDelivery(shop.id, d?.id ?? "")).toBe("retrying");
      const [row] = await deliveriesOf(id);
      expect(row?.lastError).toMatch(/^Refused: .*loopback/);
      expect(row?.lastStatusCode).toBeNull();
      expect(hits("/later")).toHaveLength(0);
    } finally {
      configureWebhooks(quick);
      await startWebhookWorker();
    }
  });
});
