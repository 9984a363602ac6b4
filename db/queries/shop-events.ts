import "server-only";
import { shopEvents } from "@/db/schema";
import type { Tx } from "@/db/tx";
import type { ShopEventType } from "@/lib/vocabulary";
import { fanOutShopEvent } from "./webhooks";

/**
 * Records that something happened in a shop (quote issued or accepted, order moved, payment
 * refunded, catalog imported), in the transaction of its cause. The row's id is the event's stable
 * id; one webhook delivery per active endpoint that takes the type is written with it (the
 * delivery worker, lib/webhooks/worker.ts, sends them). Answers the id.
 */
export async function recordShopEvent(tx: Tx, shopId: string, type: ShopEventType, payload: Record<string, unknown>): Promise<string> {
  const [row] = await tx.insert(shopEvents).values({ shopId, type, payload }).returning({ id: shopEvents.id });
  if (!row) throw new Error("shop event insert returned no row");
  await fanOutShopEvent(tx, shopId, row.id, type);
  return row.id;
}
