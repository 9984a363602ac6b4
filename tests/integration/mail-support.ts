/**
 * What the mail and fault tests share: an SMTP stand-in a test file can stop and start (maildev
 * from npm, on ports of its own) with its inbox (maildev's REST API, GET /api/email), free ports,
 * polling, and a quote with the outbox row that announces it.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { and, eq, sql } from "drizzle-orm";
import { db } from "@/db";
import { getOutboxRow } from "@/db/queries/outbox";
import { emailOutbox, quoteRevisions, quotes } from "@/db/schema";
import { MAIL_QUEUE, PGBOSS_SCHEMA } from "@/lib/mail/queue";
import { createQuote, type TestShop } from "./fixtures";
import { waitFor } from "./helpers";
import { ownerDb } from "./owner-db";

export { waitFor };

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      server.close(() => (typeof address === "object" && address ? resolve(address.port) : reject(new Error("no port"))));
    });
  });
}

export function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ port, host: "127.0.0.1" });
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

export interface MaildevEmail {
  id: string;
  subject: string;
  to: { address: string }[];
  from: { name: string; address: string }[];
  headers: Record<string, string>;
  text?: string;
  attachments?: { filename?: string; generatedFileName: string; contentType: string; size: number }[];
}

/** One maildev on two free ports, not started until `start()`. */
export async function createMailStandin() {
  const smtpPort = await freePort();
  const webPort = await freePort();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-mail-test-"));
  let child: ChildProcess | null = null;
  return {
    smtpPort,
    webPort,
    get running() {
      return child !== null;
    },
    async start() {
      child = spawn(
        path.resolve("node_modules/.bin/maildev"),
        ["--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "--smtp", String(smtpPort), "--web", String(webPort), "--mail-directory", dir, "--silent"],
        { stdio: "ignore" },
      );
      await waitFor(
        "maildev to listen",
        async () => (await portOpen(smtpPort)) && (await portOpen(webPort)),
        (up) => up,
        20_000,
      );
    },
    async stop() {
      const c = child;
      child = null;
      if (!c || c.exitCode !== null) return;
      const exited = new Promise((r) => c.once("exit", r));
      c.kill("SIGTERM");
      await exited;
    },
    async inbox(): Promise<MaildevEmail[]> {
      const res = await fetch(`http://127.0.0.1:${webPort}/api/email`);
      if (!res.ok) throw new Error(`maildev answered ${res.status}`);
      return (await res.json()) as MaildevEmail[];
    },
    async remove() {
      await this.stop();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}
export type MailStandin = Awaited<ReturnType<typeof createMailStandin>>;

/** A real quote through the quoting path for the shop's first customer, and the outbox row announcing it. */
export async function makeQuote(shop: TestShop): Promise<{ shopId: string; outboxId: string; quoteNumber: string }> {
  const quoteNumber = await createQuote(shop, shop.customers[0]);
  const [row] = await ownerDb
    .select({ id: emailOutbox.id })
    .from(emailOutbox)
    .innerJoin(quoteRevisions, eq(quoteRevisions.id, emailOutbox.quoteRevisionId))
    .innerJoin(quotes, eq(quotes.id, quoteRevisions.quoteId))
    .where(and(eq(emailOutbox.shopId, shop.id), eq(quotes.shopId, shop.id), eq(quotes.number, quoteNumber)));
  if (!row) throw new Error(`no outbox row for ${quoteNumber}`);
  return { shopId: shop.id, outboxId: row.id, quoteNumber };
}

export async function outboxRow(shopId: string, id: string) {
  const row = await getOutboxRow(shopId, id);
  if (!row) throw new Error(`outbox row ${id} vanished`);
  return row;
}

/** Every job the queue holds for an outbox row (the dispatcher keys them by the row's id; the queue's schema is the app role's). */
export async function jobsFor(outboxId: string): Promise<{ state: string }[]> {
  const result = await db.execute<{ state: string }>(
    sql`SELECT state::text AS state FROM ${sql.identifier(PGBOSS_SCHEMA)}.job WHERE name = ${MAIL_QUEUE} AND singleton_key = ${outboxId}`,
  );
  return result.rows;
}
