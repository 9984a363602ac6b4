/**
 * Faults the app must live through without anyone restarting it:
 * - PostgreSQL restarts while requests are in flight: those requests may fail, none hangs, the
 *   server process carries on, and the next requests are served on fresh connections;
 * - the mail server is down for the whole retry window: the message ends `failed` with the reason,
 *   and the manager sends it again from the outbox (recorded in the audit log);
 * - a crash between the SMTP server's acceptance and our commit sends a message twice, with the
 *   same Message-ID (at-least-once; DEVELOPERS.md, "Faults").
 */
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { requeueMessage } from "@/app/desk/[shop]/outbox/actions";
import { listAudit } from "@/db/queries/audit";
import { emailOutbox } from "@/db/schema";
import { configureMail, mailSettings } from "@/lib/mail/config";
import { deliverOutboxRow } from "@/lib/mail/deliver";
import { outboxMessageId } from "@/lib/mail/format";
import { startMailWorker, stopMailWorker } from "@/lib/mail/worker";
import { auditList } from "@/lib/validation/lists";
import { restartPostgres } from "../../scripts/services.mjs";
import { createQuote, createShop, KESTREL_REQUIREMENT, type TestShop } from "./fixtures";
import { actAs } from "./helpers";
import { postArrangements } from "./arrangements-call";
import { createMailStandin, freePort, jobsFor, makeQuote, outboxRow, waitFor, type MailStandin } from "./mail-support";
import { ownerDb } from "./owner-db";

const clusterDir = process.env.TEST_PG_DATA_DIR;

let shop: TestShop;
let smtp: MailStandin;

beforeAll(async () => {
  shop = await createShop("kestrel");
  smtp = await createMailStandin();
});

afterAll(async () => {
  await stopMailWorker();
  await smtp.remove();
});

/** One public arrangements request, as a server would run it: its status, or the error it ended with. */
async function search(): Promise<number | string> {
  try {
    const res = await postArrangements(shop.slug, KESTREL_REQUIREMENT);
    return res.status;
  } catch (error) {
    const e = error as { code?: string; cause?: { code?: string; message?: string }; message?: string };
    return `error: ${e.cause?.code ?? e.code ?? ""} ${e.cause?.message ?? e.message ?? ""}`.trim();
  }
}

describe("PostgreSQL restarts while requests are in flight", () => {
  it.skipIf(!clusterDir)("the requests caught in it fail, none hangs, and the same server serves the next ones", { timeout: 120_000 }, async () => {
    // a warm pool: several connections open and idle, as on a busy server
    expect(await Promise.all(Array.from({ length: 8 }, search))).toEqual(Array(8).fill(200));

    const during: Promise<number | string>[] = [];
    let restarting = true;
    const load = (async () => {
      while (restarting) {
        during.push(search());
        await new Promise((r) => setTimeout(r, 10));
      }
    })();
    await restartPostgres(clusterDir!);
    restarting = false;
    await load;
    const outcomes = await Promise.all(during);
    // every request caught in the restart has an answer (a success, or the database's error)
    expect(outcomes.length).toBeGreaterThan(5);
    for (const o of outcomes) expect(String(o)).toMatch(/^(200|error: .+)$/);

    // the same process and pool, no restart of the app: reads and writes work again
    expect(await Promise.all(Array.from({ length: 10 }, search))).toEqual(Array(10).fill(200));
    expect(await createQuote(shop, shop.customers[1])).toMatch(/^Q-\d{4}-\d{4}$/);
  });
});

describe("the mail server is down for the whole retry window", () => {
  it("the message ends failed with the reason; the manager sends it again and it goes out once", { timeout: 120_000 }, async () => {
    const closed = await freePort();
    // three tries a second apart, all refused
    configureMail({
      smtpHost: "127.0.0.1",
      smtpPort: closed,
      smtpTimeoutSeconds: 5,
      retryLimit: 2,
      retryDelaySeconds: 1,
      retryBackoff: false,
      pollingIntervalSeconds: 0.5,
    });
    await startMailWorker({ retryOnFailure: false });
    const { shopId, outboxId, quoteNumber } = await makeQuote(shop);
    const failed = await waitFor(
      "the row to fail",
      () => outboxRow(shopId, outboxId),
      (r) => r.status === "failed",
    );
    expect(failed).toMatchObject({ attempts: 3, sentAt: null });
    expect(failed.lastError).toMatch(/ECONNREFUSED/);
    await waitFor(
      "the job to give up",
      () => jobsFor(outboxId),
      (jobs) => jobs[0]?.state === "failed",
    );

    // only the manager may send it again
    await actAs(shop.estimator.email);
    expect(await requeueMessage(shop.slug, { outboxId })).toMatchObject({ ok: false, code: "forbidden" });

    // the mail server is back; the manager sends it again
    await smtp.start();
    configureMail({ smtpPort: smtp.smtpPort });
    await actAs(shop.manager.email);
    expect(await requeueMessage(shop.slug, { outboxId })).toEqual({ ok: true, data: { id: outboxId } });
    const sent = await waitFor(
      "the row to be sent",
      () => outboxRow(shopId, outboxId),
      (r) => r.status === "sent",
    );
    expect(sent.attempts).toBe(4);
    const mails = (await smtp.inbox()).filter((m) => m.subject.includes(`${quoteNumber} `));
    expect(mails).toHaveLength(1);
    expect(mails[0]?.headers["message-id"]).toBe(outboxMessageId(outboxId, mailSettings().from));

    // a second click finds nothing to send
    expect(await requeueMessage(shop.slug, { outboxId })).toMatchObject({ ok: false, code: "conflict" });
    const log = await listAudit(shop.id, auditList.parse({ action: "outbox" }).query);
    expect(log.rows).toHaveLength(1);
    expect(log.rows[0]).toMatchObject({
      action: "outbox.requeue",
      subjectId: outboxId,
      actorUserId: shop.manager.id,
      changes: { status: { from: "failed", to: "waiting" } },
    });
    expect(log.rows[0]?.summary).toMatch(/after 3 failed attempts .*ECONNREFUSED/);
    await stopMailWorker();
  });
});

describe("a crash between the SMTP server's acceptance and our commit", () => {
  it("sends the message again on the next attempt, with the same Message-ID", { timeout: 60_000 }, async () => {
    if (!smtp.running) await smtp.start();
    configureMail({ smtpPort: smtp.smtpPort });
    const { shopId, outboxId, quoteNumber } = await makeQuote(shop);
    expect(await deliverOutboxRow(shopId, outboxId)).toBe("sent");
    // the commit that marked it sent is lost: the row is still waiting as far as the database knows
    await ownerDb.update(emailOutbox).set({ status: "waiting", sentAt: null, messageId: null }).where(eq(emailOutbox.id, outboxId));
    expect(await deliverOutboxRow(shopId, outboxId)).toBe("sent");
    const mails = (await smtp.inbox()).filter((m) => m.subject.includes(`${quoteNumber} `));
    expect(mails).toHaveLength(2);
    expect(new Set(mails.map((m) => m.headers["message-id"]))).toEqual(new Set([outboxMessageId(outboxId, mailSettings().from)]));
  });
});
