import "server-only";
import { shopEvents } from "@/db/schema";
import type { Tx } from "@/db/tx";
import type { ShopEventType } from "@/lib/vocabulary";

/**
 * Records that something happened in a shop (quote issued or accepted, order moved, payment
 * refunded, catalog imported), in the transaction of its cause. The row's id is the event's stable
 * id; outbound webhook delivery reads these rows. Answers the id.
 */
export async function recordShopEvent(tx: Tx, shopId: string, type: ShopEventType, payload: Record<string, unknown>): Promise<string> {
  const [row] = await tx.insert(shopEvents).values({ shopId, type, payload }).returning({ id: shopEvents.id });
  if (!row) throw new Error("shop event insert returned no row");
  return row.id;
}
