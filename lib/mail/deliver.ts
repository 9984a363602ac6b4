import "server-only";
import { getShopSender } from "@/db/queries/mail-sender";
import { getOutboxRow, lockWaitingOutboxRow, markOutboxSent, recordOutboxFailure } from "@/db/queries/outbox";
import { withShop } from "@/db/tx";
import { mailSettings } from "./config";
import { shopSenderAddress } from "./format";
import { buildOutboxMessage } from "./messages";
import { sendMessage } from "./transport";

export type DeliveryOutcome = "sent" | "skipped";

function reasonOf(error: unknown): string {
  const e = error as { code?: unknown; message?: unknown };
  const message = typeof e?.message === "string" ? e.message : String(error);
  const code = typeof e?.code === "string" && !message.includes(e.code) ? `${e.code}: ` : "";
  return `${code}${message}`.slice(0, 1000);
}

/**
 * Delivers one outbox row at most once in the normal path: the row is locked (`FOR UPDATE SKIP
 * LOCKED`) and re-checked as still waiting while the SMTP conversation runs, and marked sent in
 * the same transaction; a second job for the same row finds it locked or sent and does nothing.
 * Only a crash between the server's "250 OK" and the commit can send it again, and then with the
 * same Message-ID. A failure counts the attempt, keeps the reason and throws, so the queue retries
 * with back-off; on the `final` attempt the row becomes `failed`.
 */
export async function deliverOutboxRow(shopId: string, outboxId: string, { final = false }: { final?: boolean } = {}): Promise<DeliveryOutcome> {
  const row = await getOutboxRow(shopId, outboxId);
  if (!row || row.status !== "waiting") return "skipped";

  let message;
  try {
    message = await buildOutboxMessage(row);
    // sent as the shop, replies to the shop's manager
    const sender = await getShopSender(shopId);
    if (sender) {
      message = { ...message, from: shopSenderAddress(sender.shopName, mailSettings().from), ...(sender.replyTo ? { replyTo: sender.replyTo } : {}) };
    }
  } catch (error) {
    await recordOutboxFailure(shopId, outboxId, reasonOf(error), final);
    throw error;
  }

  const result = await withShop(shopId, async (tx) => {
    if (!(await lockWaitingOutboxRow(tx, shopId, outboxId))) return { outcome: "skipped" as const };
    try {
      const info = await sendMessage(message);
      await markOutboxSent(tx, shopId, outboxId, info.messageId);
      return { outcome: "sent" as const };
    } catch (error) {
      // recorded in this transaction (it commits), thrown after it
      await recordOutboxFailure(shopId, outboxId, reasonOf(error), final);
      return { outcome: "failed" as const, error };
    }
  });
  if (result.outcome === "failed") throw result.error;
  return result.outcome;
}
