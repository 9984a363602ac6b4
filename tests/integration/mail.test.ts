import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ownerDb as db } from "./owner-db";
import { getOutboxRow, listOutbox } from "@/db/queries/outbox";
import { emailOutbox } from "@/db/schema";
import { configureMail, mailSettings } from "@/lib/mail/config";
import { deliverOutboxRow } from "@/lib/mail/deliver";
import { outboxMessageId } from "@/lib/mail/format";
import { dispatchOutbox } from "@/lib/mail/outbox";
import { startMailWorker, stopMailWorker } from "@/lib/mail/worker";
import { outboxList } from "@/lib/validation/lists";
import { createShop, type TestShop } from "./fixtures";
import { createMailStandin, freePort, jobsFor, makeQuote as makeShopQuote, outboxRow, portOpen, waitFor, type MailStandin } from "./mail-support";

// The SMTP stand-in here is maildev (npm), started by this file on ports of its own so that it
// can be stopped and started again; its REST API (GET /api/email) lists what it received.

/** This file's own shop: its customer receives the quotes. */
let shop: TestShop;
let smtp: MailStandin;

const messagesFor = async (quoteNumber: string) =>
  (await smtp.inbox()).filter((m) => m.subject.includes(`${quoteNumber} `) && m.to.some((t) => t.address === shop.customers[0].email));

const makeQuote = () => makeShopQuote(shop);

beforeAll(async () => {
  shop = await createShop("kestrel");
  smtp = await createMailStandin();
  // short waits so an outage of a few seconds is retried several times within the test
  configureMail({
    smtpHost: "127.0.0.1",
    smtpPort: smtp.smtpPort,
    smtpTimeoutSeconds: 5,
    retryLimit: 8,
    retryDelaySeconds: 1,
    retryBackoff: true,
    pollingIntervalSeconds: 0.5,
  });
});

afterAll(async () => {
  await stopMailWorker();
  await smtp.remove();
});

describe("e-mail through the outbox and the job queue", () => {
  it("waits while the SMTP server is down, then delivers exactly once when it is back", { timeout: 120_000 }, async () => {
    expect(await portOpen(smtp.smtpPort)).toBe(false);
    await startMailWorker({ retryOnFailure: false });
    const { shopId, outboxId, quoteNumber } = await makeQuote();

    // down: attempts grow, the row keeps waiting with the reason, nothing is lost
    const waiting = await waitFor(
      "two failed attempts",
      () => outboxRow(shopId, outboxId),
      (r) => r.attempts >= 2,
    );
    expect(waiting.status).toBe("waiting");
    expect(waiting.sentAt).toBeNull();
    expect(waiting.lastError).toMatch(/ECONNREFUSED/);
    // one job, between attempts or (on a busy machine) already in its next one: never failed or done
    const jobs = await jobsFor(outboxId);
    expect(jobs).toHaveLength(1);
    expect(["retry", "active"]).toContain(jobs[0]!.state);

    // back up: the next retry delivers it
    await smtp.start();
    const sent = await waitFor(
      "the row to be sent",
      () => outboxRow(shopId, outboxId),
      (r) => r.status === "sent",
    );
    expect(sent.attempts).toBeGreaterThanOrEqual(3);
    expect(sent.sentAt).not.toBeNull();
    expect(sent.messageId).toBe(outboxMessageId(outboxId, mailSettings().from));

    // more dispatches and a late delivery attempt change nothing
    await dispatchOutbox();
    expect(await deliverOutboxRow(shopId, outboxId)).toBe("skipped");
    await waitFor(
      "the job to complete",
      () => jobsFor(outboxId),
      (jobs) => jobs.length === 1 && jobs[0]?.state === "completed",
    );

    const mails = await messagesFor(quoteNumber);
    expect(mails).toHaveLength(1);
    const mail = mails[0]!;
    expect(mail.to.map((t) => t.address)).toEqual([shop.customers[0].email]);
    expect(mail.subject).toBe(`Your quote ${quoteNumber} (revision 1) is ready`);
    expect(mail.headers["message-id"]).toBe(sent.messageId);
    // sent as the shop through the product's address, replies going to the shop's manager (RFC 5322 §3.6.2)
    expect(mail.from).toEqual([{ name: `${shop.name} via Faradsmith`, address: /<([^>]+)>/.exec(mailSettings().from)?.[1] }]);
    const source = await (await fetch(`http://127.0.0.1:${smtp.webPort}/api/email/${mail.id}/source`)).text();
    expect(source).toMatch(new RegExp(`^Reply-To: ${shop.manager.email.replace(/[.+]/g, "\\$&")}\\r?$`, "im"));
    const pdfs = (mail.attachments ?? []).filter((a) => a.contentType === "application/pdf");
    expect(pdfs).toHaveLength(1);
    expect(pdfs[0]!.filename).toContain(quoteNumber);
    // the attachment is a PDF file (ISO 32000-1 §7.5.2: a PDF starts with the header "%PDF-")
    const res = await fetch(`http://127.0.0.1:${smtp.webPort}/api/email/${mail.id}/attachment/${pdfs[0]!.generatedFileName}`);
    expect(res.status).toBe(200);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(bytes.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(bytes.length).toBeGreaterThan(1000);
  });

  it("queues a row once however often it is dispatched, and two racing deliveries send it once", { timeout: 120_000 }, async () => {
    await stopMailWorker();
    if (!smtp.running) await smtp.start();
    const { shopId, outboxId, quoteNumber } = await makeQuote(); // dispatches once
    await dispatchOutbox();
    await Promise.all([dispatchOutbox(), dispatchOutbox()]);
    expect(await jobsFor(outboxId)).toEqual([{ state: "created" }]);

    const outcomes = await Promise.all([deliverOutboxRow(shopId, outboxId), deliverOutboxRow(shopId, outboxId)]);
    expect(outcomes.sort()).toEqual(["sent", "skipped"]);
    const row = await outboxRow(shopId, outboxId);
    expect(row.status).toBe("sent");
    expect(row.attempts).toBe(1);

    // the queued job, when a worker takes it, finds the row sent and sends nothing
    await startMailWorker({ retryOnFailure: false });
    await waitFor(
      "the job to complete",
      () => jobsFor(outboxId),
      (jobs) => jobs[0]?.state === "completed",
    );
    expect(await messagesFor(quoteNumber)).toHaveLength(1);
  });

  it("after the last attempt the row is failed with the reason, and is not sent later", { timeout: 60_000 }, async () => {
    await stopMailWorker();
    const closed = await freePort();
    configureMail({ smtpPort: closed });
    try {
      const { shopId, outboxId, quoteNumber } = await makeQuote();
      await expect(deliverOutboxRow(shopId, outboxId)).rejects.toThrow(/ECONNREFUSED/);
      expect(await outboxRow(shopId, outboxId)).toMatchObject({ status: "waiting", attempts: 1 });
      await expect(deliverOutboxRow(shopId, outboxId, { final: true })).rejects.toThrow(/ECONNREFUSED/);
      const failed = await outboxRow(shopId, outboxId);
      expect(failed).toMatchObject({ status: "failed", attempts: 2, sentAt: null });
      expect(failed.lastError).toMatch(/ECONNREFUSED/);

      configureMail({ smtpPort: smtp.smtpPort });
      expect(await deliverOutboxRow(shopId, outboxId)).toBe("skipped");
      expect(await messagesFor(quoteNumber)).toHaveLength(0);
    } finally {
      configureMail({ smtpPort: smtp.smtpPort });
    }
  });
});

describe("the desk's outbox list", () => {
  /** Messages in a shop of the test's own: what the list must show, whatever else the database holds. */
  async function outboxOf(to: string, rows: { subject: string; status: "waiting" | "sent" | "failed"; attempts: number; minutesAgo: number }[]) {
    const target = await createShop("kestrel");
    const now = Date.now();
    const inserted = await db
      .insert(emailOutbox)
      .values(
        rows.map((r) => ({
          shopId: target.id,
          kind: "quote-ready",
          dedupeKey: randomUUID(),
          toEmail: to,
          subject: r.subject,
          status: r.status,
          attempts: r.attempts,
          lastError: r.status === "sent" ? null : "connect ECONNREFUSED",
          sentAt: r.status === "sent" ? new Date(now - r.minutesAgo * 60_000 + 1000) : null,
          createdAt: new Date(now - r.minutesAgo * 60_000),
        })),
      )
      .returning({ id: emailOutbox.id, subject: emailOutbox.subject });
    return { shop: target, ids: Object.fromEntries(inserted.map((r) => [r.subject, r.id])) as Record<string, string> };
  }

  it("shows a shop only its own messages; another shop's row is not found", async () => {
    const mine = await outboxOf("a@buyer.example", [{ subject: "Quote A", status: "sent", attempts: 1, minutesAgo: 5 }]);
    const theirs = await outboxOf("b@buyer.example", [{ subject: "Quote B", status: "sent", attempts: 1, minutesAgo: 5 }]);
    expect((await listOutbox(mine.shop.id, outboxList.defaults)).rows.map((r) => r.subject)).toEqual(["Quote A"]);
    expect(await getOutboxRow(theirs.shop.id, mine.ids["Quote A"]!)).toBeNull();
    expect(await getOutboxRow(mine.shop.id, mine.ids["Quote A"]!)).not.toBeNull();
  });

  it("filters by state and by recipient or subject, and sorts the useful way first with ties newest first", async () => {
    const { shop: s } = await outboxOf("Renske@Tollmere.example", [
      { subject: "Quote 1", status: "sent", attempts: 1, minutesAgo: 40 },
      { subject: "Quote 2", status: "failed", attempts: 9, minutesAgo: 30 },
      { subject: "Quote 3", status: "waiting", attempts: 2, minutesAgo: 20 },
      { subject: "Quote 4", status: "sent", attempts: 2, minutesAgo: 10 },
      { subject: "100% done_", status: "sent", attempts: 1, minutesAgo: 1 },
    ]);
    const subjects = async (query: Record<string, string>) => (await listOutbox(s.id, outboxList.parse(query).query)).rows.map((r) => r.subject);
    expect(await subjects({})).toEqual(["100% done_", "Quote 4", "Quote 3", "Quote 2", "Quote 1"]);
    expect(await subjects({ status: "failed" })).toEqual(["Quote 2"]);
    expect(await subjects({ q: "TOLLMERE" })).toHaveLength(5);
    // % and _ are searched for as themselves
    expect(await subjects({ q: "100%" })).toEqual(["100% done_"]);
    expect(await subjects({ q: "e_" })).toEqual(["100% done_"]);
    // what went wrong first; then waiting; then sent, newest first within each
    expect(await subjects({ sort: "status" })).toEqual(["Quote 2", "Quote 3", "100% done_", "Quote 4", "Quote 1"]);
    // most attempts first; ties newest first
    expect(await subjects({ sort: "attempts" })).toEqual(["Quote 2", "Quote 4", "Quote 3", "100% done_", "Quote 1"]);
    expect(await subjects({ sort: "attempts", dir: "asc" })).toEqual(["100% done_", "Quote 1", "Quote 4", "Quote 3", "Quote 2"]);
    // messages never sent come last whichever way "sent at" is sorted
    expect((await subjects({ sort: "sent" })).slice(-2).sort()).toEqual(["Quote 2", "Quote 3"]);
    expect((await subjects({ sort: "sent", dir: "asc" })).slice(-2).sort()).toEqual(["Quote 2", "Quote 3"]);
  });
});
