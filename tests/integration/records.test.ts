import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { changedFields, listAuditForSubject, recordAudit } from "@/db/queries/audit";
import { recordShopEvent } from "@/db/queries/shop-events";
import { ownerDb as db } from "./owner-db";
import { shopEvents } from "@/db/schema";
import { withShop } from "@/db/tx";
import { createShop } from "./fixtures";

describe("the shop-scoped transaction", () => {
  it("sets app.shop_id for its own transaction only", async () => {
    const shop = await createShop("kestrel");
    const inside = await withShop(shop.id, async (tx) => (await tx.execute<{ v: string }>(sql`select current_setting('app.shop_id', true) as v`)).rows[0]?.v);
    expect(inside).toBe(shop.id);
    const after = (await db.execute<{ v: string | null }>(sql`select current_setting('app.shop_id', true) as v`)).rows[0]?.v;
    expect(after ?? "").toBe("");
  });
});

describe("audit entries and shop events", () => {
  it("are written with their cause and vanish with it when it rolls back", async () => {
    const shop = await createShop("marlow");
    const changes = changedFields({ unitCost: "41.20", stock: 10, sku: "X" }, { unitCost: "39.80", stock: 10 });
    expect(changes).toEqual({ unitCost: { from: "41.20", to: "39.80" } });
    await withShop(shop.id, async (tx) => {
      await recordAudit(tx, shop.id, {
        actorUserId: shop.estimator.id,
        action: "catalog-cell.update",
        subjectType: "catalog-cell",
        subjectId: "c1",
        summary: "Unit cost from 41.20 to 39.80",
        changes,
      });
      await recordShopEvent(tx, shop.id, "catalog.imported", { created: 1 });
    });
    await expect(
      withShop(shop.id, async (tx) => {
        await recordAudit(tx, shop.id, {
          actorUserId: null,
          action: "catalog-cell.update",
          subjectType: "catalog-cell",
          subjectId: "c1",
          summary: "rolled back",
        });
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    const entries = await withShop(shop.id, (tx) => listAuditForSubject(tx, shop.id, "catalog-cell", "c1"));
    expect(entries.map((e) => e.summary)).toEqual(["Unit cost from 41.20 to 39.80"]);
    const events = await db
      .select()
      .from(shopEvents)
      .where(sql`${shopEvents.shopId} = ${shop.id}`);
    expect(events.map((e) => [e.type, e.payload])).toEqual([["catalog.imported", { created: 1 }]]);
  });

  it("changedFields answers null when nothing differs", () => {
    expect(changedFields({ a: 1, b: { c: [1, 2] } }, { a: 1, b: { c: [1, 2] } })).toBeNull();
  });
});
