/**
 * Keeping the catalog and the prices against PostgreSQL: a unit-cost edit moves new prices by
 * exactly the arithmetic of DESIGN.md §4 (checked with decimal.js, not with lib/pricing) and leaves
 * every issued revision as it was; so does a rule edit; a CSV export imported again changes nothing;
 * a bad row blocks the whole import unless the valid rows are asked for; two edits of one cell from
 * the same version: the second gets a clear 409; the unit-cost history says who, when, old → new.
 */
import { Decimal } from "decimal.js";
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { GET as cellRoute, PATCH as patchCellRoute } from "@/app/api/v1/shops/[shop]/cells/[sku]/route";
import { GET as exportRoute, POST as importRoute } from "@/app/api/v1/shops/[shop]/cells.csv/route";
import { ownerDb as db } from "./owner-db";
import { getQuoteByNumber, getRevision } from "@/db/queries/quotes";
import { auditEvents, catalogCells, shopEvents } from "@/db/schema";
import { createCell, listCostHistory, updateCell } from "@/lib/catalog/edit";
import { readCell } from "@/lib/catalog/cell-fields";
import { getRulesInForce } from "@/db/queries/pricing-rules";
import { savePricingRules } from "@/lib/quoting/pricing-rules";
import { contextOf, createQuote, createShop, KESTREL_REQUIREMENT, searchOptions, type TestShop } from "./fixtures";
import { request, sessionCookie } from "./helpers";

const params = <T extends Record<string, string>>(p: T) => ({ params: Promise.resolve(p) });
/** Half-up to cents, as DESIGN.md §4 and common commercial practice round money. */
const cents = (d: Decimal) => d.toDecimalPlaces(2, Decimal.ROUND_HALF_UP);

async function cellRow(shop: TestShop, sku: string) {
  const [row] = await db
    .select()
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shop.id), eq(catalogCells.sku, sku)));
  if (!row) throw new Error(`no cell ${sku}`);
  return row;
}

/** The issued quote's frozen revision, as stored. */
async function frozen(shop: TestShop, number: string) {
  const quote = await getQuoteByNumber(shop.id, number);
  const rev = await getRevision(shop.id, quote!.revisionId);
  return rev!;
}

/** The price record of the same arrangement priced now. */
async function pricedNow(shop: TestShop, option: { cell: { sku: string }; topology: string; seriesCount: number; parallelCount: number }) {
  const found = await searchOptions(shop.id, KESTREL_REQUIREMENT);
  const i = found.options.findIndex(
    (o) => o.cell.sku === option.cell.sku && o.topology === option.topology && o.seriesCount === option.seriesCount && o.parallelCount === option.parallelCount,
  );
  expect(i, "the same arrangement is still offered").toBeGreaterThanOrEqual(0);
  return found.records[i]!.price!;
}

describe("prices follow the catalog and the rules; issued revisions never move", () => {
  it("a unit-cost edit changes new prices by exactly the arithmetic and leaves the issued revision's total as it was", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const before = await frozen(shop, number);
    const option = before.revision.arrangement;
    const oldPrice = before.revision.pricing;
    const cell = await cellRow(shop, option.cell.sku);

    // +1.25 per cell
    const newCost = new Decimal(cell.unitCost).plus("1.25");
    const r = await updateCell(contextOf(shop, shop.estimator, "estimator"), cell.sku, { unitCost: newCost.toFixed(4) }, cell.version);
    expect(r).toMatchObject({ ok: true, data: { version: cell.version + 1, changes: [{ field: "unitCost" }] } });

    const now = await pricedNow(shop, option);
    // DESIGN.md §4: materials + cellCount × 1.25 (the cell price is rounded once per unit);
    // overhead = materials × overhead %, rounded; price = cost / (1 − margin), rounded
    const n = option.cellCount;
    const materials = new Decimal(oldPrice.materials).minus(new Decimal(oldPrice.lines.find((l) => l.code === "cells")!.amount)).plus(cents(newCost).times(n));
    const { rules } = await getRulesInForce(shop.id);
    const overhead = cents(materials.times(new Decimal(rules.overheadPct).div(100)));
    const cost = materials.plus(overhead).plus(oldPrice.labour);
    const unit = cents(cost.div(new Decimal(1).minus(new Decimal(oldPrice.marginPct).div(100))));
    expect(now.materials).toBe(materials.toFixed(2));
    expect(now.overhead).toBe(overhead.toFixed(2));
    expect(now.cost).toBe(cost.toFixed(2));
    expect(now.unitPrice).toBe(unit.toFixed(2));
    expect(new Decimal(now.unitPrice).greaterThan(oldPrice.unitPrice)).toBe(true);

    // the issued revision: the same total, build-up and cell cost as when it was issued
    const after = await frozen(shop, number);
    expect(after.revision.total).toBe(before.revision.total);
    expect(after.revision.pricing).toEqual(oldPrice);
    expect(after.revision.cell.unitCost).toBe(cell.unitCost);
    expect(after.lines).toEqual(before.lines);
  });

  it("a margin change prices new quotes at cost / (1 − margin) and leaves issued revisions as they were", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const before = await frozen(shop, number);
    const { rules, version } = await getRulesInForce(shop.id);
    const saved = await savePricingRules(contextOf(shop, shop.estimator, "estimator"), { ...rules, marginPct: "35" }, "Copper prices up", version);
    expect(saved).toMatchObject({ ok: true, data: { version: 2, changes: [{ key: "marginPct", from: "26 %", to: "35 %" }] } });

    const now = await pricedNow(shop, before.revision.arrangement);
    expect(now.cost).toBe(before.revision.pricing.cost);
    expect(now.unitPrice).toBe(cents(new Decimal(now.cost).div("0.65")).toFixed(2));
    const after = await frozen(shop, number);
    expect(after.revision.total).toBe(before.revision.total);
    expect(after.revision.pricing).toEqual(before.revision.pricing);
  });
});

describe("CSV export and import", () => {
  it("importing the shop's own export reports 0 changes and writes nothing", async () => {
    const shop = await createShop("marlow");
    const cookie = await sessionCookie(shop.estimator.email);
    const exported = await exportRoute(request(`/api/v1/shops/${shop.slug}/cells.csv`, { cookie }), params({ shop: shop.slug }));
    expect(exported.status).toBe(200);
    expect(exported.headers.get("content-type")).toMatch(/^text\/csv/);
    const csv = await exported.text();
    const versionsBefore = (await db.select({ v: catalogCells.version }).from(catalogCells).where(eq(catalogCells.shopId, shop.id))).map((r) => r.v);
    for (const dryRun of [true, false]) {
      const res = await importRoute(
        request(`/api/v1/shops/${shop.slug}/cells.csv${dryRun ? "?dryRun=1" : ""}`, {
          method: "POST",
          cookie,
          body: csv,
          headers: { "content-type": "text/csv" },
        }),
        params({ shop: shop.slug }),
      );
      expect(res.status).toBe(200);
      const body = await res.json();
      expect(body).toEqual({ created: 0, updated: 0, unchanged: versionsBefore.length, errors: [], applied: false, dryRun });
    }
    const versionsAfter = (await db.select({ v: catalogCells.version }).from(catalogCells).where(eq(catalogCells.shopId, shop.id))).map((r) => r.v);
    expect(versionsAfter).toEqual(versionsBefore);
  });

  it("a bad row blocks the import and nothing changes; with applyValid=1 the good rows go in, in one transaction, with the shop event", async () => {
    const shop = await createShop("kestrel");
    const cookie = await sessionCookie(shop.estimator.email);
    const csvOf = async () => (await exportRoute(request(`/api/v1/shops/${shop.slug}/cells.csv`, { cookie }), params({ shop: shop.slug }))).text();
    const original = await csvOf();
    const [header, first, second] = original.trim().split("\r\n");
    const cols = header!.split(",");
    const set = (line: string, col: string, value: string) =>
      line
        .split(",")
        .map((v, i) => (cols[i] === col ? value : v))
        .join(",");
    const good = set(first!, "unitCost", "99.99");
    const bad = set(second!, "ratedVoltage", "2.7 A");
    const body = [header, good, bad].join("\r\n");
    const post = (query: string) =>
      importRoute(
        request(`/api/v1/shops/${shop.slug}/cells.csv${query}`, { method: "POST", cookie, body, headers: { "content-type": "text/csv" } }),
        params({ shop: shop.slug }),
      );

    const refused = await post("");
    expect(refused.status).toBe(422);
    const answer = await refused.json();
    expect(answer).toMatchObject({ created: 0, updated: 1, unchanged: 0, applied: false });
    expect(answer.errors).toEqual([{ row: 3, column: "ratedVoltage", message: expect.stringMatching(/"2.7 A" is not a value in volts/) }]);
    expect(await csvOf()).toBe(original);
    expect(await db.select().from(shopEvents).where(eq(shopEvents.shopId, shop.id))).toEqual([]);

    const partial = await post("?applyValid=1");
    expect(partial.status).toBe(200);
    expect(await partial.json()).toMatchObject({ updated: 1, applied: true, errors: [{ row: 3 }] });
    const sku = first!.split(",")[0]!;
    expect((await cellRow(shop, sku)).unitCost).toBe("99.9900");
    const events = await db.select().from(shopEvents).where(eq(shopEvents.shopId, shop.id));
    expect(events.map((e) => [e.type, e.payload])).toEqual([["catalog.imported", { created: 0, updated: 1, unchanged: 0, skipped: 1 }]]);
    const audit = await db.select().from(auditEvents).where(eq(auditEvents.shopId, shop.id));
    expect(audit.map((a) => a.action).sort()).toEqual(["catalog-cell.update", "catalog.import"]);
    expect(audit.every((a) => a.actorUserId === shop.estimator.id)).toBe(true);
  });
});

describe("one cell edited twice from the same version", () => {
  it("the first edit wins; the second is refused with a clear conflict (409 on the API) and nothing of it is written", async () => {
    const shop = await createShop("kestrel");
    const sku = "QFS-1200R27";
    const { version } = await cellRow(shop, sku);
    const [a, b] = await Promise.all([
      updateCell(contextOf(shop, shop.estimator, "estimator"), sku, { unitCost: "20.00" }, version),
      updateCell(contextOf(shop, shop.manager, "manager"), sku, { stock: "7" }, version),
    ]);
    const results = [a, b];
    expect(results.filter((r) => r.ok)).toHaveLength(1);
    const lost = results.find((r) => !r.ok);
    expect(lost).toMatchObject({ ok: false, code: "conflict", message: expect.stringMatching(/changed by someone else.*Reload/) });
    const row = await cellRow(shop, sku);
    expect(row.version).toBe(version + 1);
    // exactly one of the two changes is in the row
    expect([row.unitCost === "20.0000", row.stock === 7].filter(Boolean)).toHaveLength(1);

    const cookie = await sessionCookie(shop.estimator.email);
    const stale = await patchCellRoute(
      request(`/api/v1/shops/${shop.slug}/cells/${sku}`, { method: "PATCH", cookie, body: JSON.stringify({ version, leadTimeDays: 9 }) }),
      params({ shop: shop.slug, sku }),
    );
    expect(stale.status).toBe(409);
    expect((await stale.json()).error).toMatch(/changed by someone else/);
    const fresh = await patchCellRoute(
      request(`/api/v1/shops/${shop.slug}/cells/${sku}`, { method: "PATCH", cookie, body: JSON.stringify({ version: row.version, leadTimeDays: 9 }) }),
      params({ shop: shop.slug, sku }),
    );
    expect(fresh.status).toBe(200);
    expect(await fresh.json()).toMatchObject({ sku, leadTimeDays: 9, version: row.version + 1 });
  });
});

describe("cells API and unit-cost history", () => {
  it("answers a cell with the arrangements answer's names, SI units and the unit cost in the shop's currency", async () => {
    const shop = await createShop("kestrel");
    const cookie = await sessionCookie(shop.manager.email);
    const res = await cellRoute(request(`/api/v1/shops/${shop.slug}/cells/QFS-1200R27`, { cookie }), params({ shop: shop.slug, sku: "QFS-1200R27" }));
    expect(res.status).toBe(200);
    const cell = await res.json();
    // the seed's cell: 1200 F, −10/+20 %, 60 mm × 74 mm cylinder, 23.80 EUR
    expect(cell).toMatchObject({
      sku: "QFS-1200R27",
      capacitance: 1200,
      toleranceMinus: 0.1,
      tolerancePlus: 0.2,
      ratedVoltage: 2.7,
      shape: "cylinder",
      diameter: 0.06,
      height: 0.074,
      unitCost: { amount: "23.8000", currency: "EUR" },
      active: true,
      datasheet: null,
    });
    // a cylinder takes the square of its diameter (lib/bank cellVolume): 0.06² × 0.074 m³
    expect(cell.volume).toBeCloseTo(0.06 * 0.06 * 0.074, 12);
    const missing = await cellRoute(request(`/api/v1/shops/${shop.slug}/cells/NOPE`, { cookie }), params({ shop: shop.slug, sku: "NOPE" }));
    expect(missing.status).toBe(404);
  });

  it("records who changed a cell's unit cost, when, from what to what", async () => {
    const shop = await createShop("kestrel");
    const ctx = contextOf(shop, shop.estimator, "estimator");
    const typed = {
      sku: "NEW-EDLC-500",
      manufacturer: "Quillfen",
      series: "Fenwall",
      technology: "edlc",
      capacitance: "500 F",
      toleranceMinus: "10 %",
      tolerancePlus: "20 %",
      ratedVoltage: "2.7 V",
      surgeVoltage: "2.85 V",
      esr: "1.2 mΩ",
      leakageCurrent: "1 mA",
      continuousCurrent: "40 A",
      peakCurrent: "400 A",
      mass: "150 g",
      shape: "cylinder",
      diameter: "35 mm",
      height: "60 mm",
      unitCost: "9.80",
      stock: "50",
      leadTimeDays: "5",
      active: "true",
    };
    const read = readCell(typed);
    if (!read.ok) throw new Error(JSON.stringify(read.issues));
    expect(await createCell(ctx, read.record)).toMatchObject({ ok: true });
    expect(await createCell(ctx, read.record)).toMatchObject({ ok: false, code: "conflict" });
    await updateCell(contextOf(shop, shop.manager, "manager"), "NEW-EDLC-500", { unitCost: "10.40" }, 1);
    const row = await cellRow(shop, "NEW-EDLC-500");
    const history = await listCostHistory(shop.id, row.id);
    expect(history.map((h) => [h.actorUserId, h.from, h.to])).toEqual([
      [shop.manager.id, "9.8", "10.4"],
      [shop.estimator.id, null, "9.8000"],
    ]);
    expect(history[0]!.at.getTime()).toBeGreaterThanOrEqual(history[1]!.at.getTime());
  });
});
