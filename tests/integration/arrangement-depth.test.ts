/**
 * Failures, life and handling in the product: the public arrangements answer carries them (in the
 * shapes lib/validation/arrangement-depth.ts exports) beside its unchanged fields, the customer's
 * filters and ranking work against the demo catalogs, the shop's own settings are read, hybrid
 * cells need their minimum voltage in the database, and a quote's PDF holds the sections.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as arrangements } from "@/app/api/v1/shops/[shop]/arrangements/route";
import { exploreArrangements } from "@/app/s/[shop]/actions";
import { saveDesignSettings } from "@/app/desk/[shop]/settings/actions";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { settingsFormText } from "@/lib/validation/design-settings";
import { ownerDb as db } from "./owner-db";
import { getQuoteByNumber } from "@/db/queries/quotes";
import { catalogCells, shopSettings } from "@/db/schema";
import { DEFAULT_DESIGN_FACTORS, DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank";
import { loadShopCatalog } from "@/db/queries/catalog";
import { loadQuotePdf } from "@/lib/quoting/quote-pdf-loader";
import { arrangementOptionDepthSchema } from "@/lib/validation/arrangement-depth";
import { EMPTY_REQUEST_FORM } from "@/lib/validation/request-form";
import { createQuote, createShop, type TestShop } from "./fixtures";
import { actAs, pdfToText } from "./helpers";

const post = (slug: string, body: unknown) =>
  arrangements(
    new Request(`http://127.0.0.1:3100/api/v1/shops/${slug}/arrangements`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    }),
    { params: Promise.resolve({ shop: slug }) },
  );

interface Option {
  cell: { sku: string; technology: string; minVoltage: number | null };
  seriesCount: number;
  parallelCount: number;
  cautions: string[];
  warnings: string[];
  failures: { short: { survives: boolean; text: string }; open: { survives: boolean; text: string } };
  life: { lifeYears: number | null; ambientTemperature: number; cellTemperature: number; maxTemperature: number } | null;
  handling: { floorVoltage: number | null; standby: { needsDisconnect: boolean } | null; shipping: string[] };
  price: { perBank: string } | null;
}

/** The option fields the answer had before failures and life joined it: they stay, with their types. */
const STABLE_FIELDS = [
  "cell",
  "topology",
  "seriesCount",
  "parallelCount",
  "cellCount",
  "longerLife",
  "capacitance",
  "maxVoltage",
  "storedEnergy",
  "usableEnergy",
  "esr",
  "peakDrop",
  "mass",
  "volume",
  "worstCellVoltage",
  "balancing",
  "discharge",
  "leadTimeDays",
  "warnings",
  "cautions",
  "price",
  "pareto",
];

describe("the arrangements answer gains failures, life and handling", () => {
  let kestrel: TestShop;
  let marlow: TestShop;
  beforeAll(async () => {
    [kestrel, marlow] = await Promise.all([createShop("kestrel"), createShop("marlow")]);
  });

  it("every option carries them in the exported shapes, and keeps every field it had", async () => {
    const res = await post(kestrel.slug, { maxVoltage: 48, minVoltage: 24, energy: 20_000, ambientTemperature: 35 });
    expect(res.status).toBe(200);
    const body = (await res.json()) as { designFactors: unknown; options: (Option & Record<string, unknown>)[] };
    expect(body.options.length).toBeGreaterThan(0);
    for (const o of body.options) {
      expect(Object.keys(o)).toEqual(expect.arrayContaining(STABLE_FIELDS));
      const parsed = arrangementOptionDepthSchema.safeParse(o);
      expect(parsed.success, JSON.stringify(parsed.error?.issues?.slice(0, 3))).toBe(true);
      expect(o.failures.short.text).toMatch(/^Survives one shorted cell: (yes|no)/);
      // the demo catalogs carry life data for every cell
      expect(o.life?.ambientTemperature).toBe(35);
      expect(o.life!.cellTemperature).toBeLessThanOrEqual(o.life!.maxTemperature);
    }
  });

  it("48 V → 24 V offers no hybrid bank (its cells would sit below 2.2 V); 48 V → 36 V does, with hybrid cautions and UN 3508", async () => {
    const low = await post(kestrel.slug, { maxVoltage: 48, minVoltage: 24, energy: 20_000, technology: "hybrid" });
    const lowBody = await low.json();
    expect(lowBody.options).toEqual([]);
    expect(lowBody.reasons.join(" ")).toMatch(/below the cells' 2.2 V minimum/);

    const res = await post(kestrel.slug, { maxVoltage: 48, minVoltage: 36, energy: 5000, technology: "hybrid" });
    const body = (await res.json()) as { options: Option[] };
    expect(body.options.length).toBeGreaterThan(0);
    for (const o of body.options) {
      expect(o.cell.technology).toBe("hybrid");
      expect(36 / o.seriesCount).toBeGreaterThanOrEqual(o.cell.minVoltage! - 1e-9);
      expect(o.handling.floorVoltage).toBeLessThanOrEqual(36);
      expect(o.cautions.join(" ")).toContain("never short the terminals");
      expect(o.cautions.join(" ")).not.toContain("short its terminals before handling");
      expect(o.handling.shipping.join(" ")).toContain("UN 3508");
      expect(o.handling.standby).not.toBeNull();
    }
  });

  it("filters for banks that survive one shorted and one open cell, and for a minimum life", async () => {
    const base = { maxVoltage: 48, minVoltage: 24, energy: 20_000 };
    const both = (await (await post(kestrel.slug, { ...base, survives: "both" })).json()) as { options: Option[] };
    expect(both.options.length).toBeGreaterThan(0);
    for (const o of both.options) expect(o.failures.short.survives && o.failures.open.survives).toBe(true);
    const all = (await (await post(kestrel.slug, base)).json()) as { options: Option[] };
    const years = all.options.map((o) => o.life!.lifeYears!).sort((a, b) => a - b);
    const cut = years[Math.floor(years.length / 2)]!;
    const long = (await (await post(kestrel.slug, { ...base, minLifeYears: cut })).json()) as { options: Option[] };
    expect(long.options.length).toBeGreaterThan(0);
    for (const o of long.options) expect(o.life!.lifeYears!).toBeGreaterThanOrEqual(cut - 1e-9);
  });

  it("ranks by life when asked: the longest-lived first", async () => {
    const body = (await (await post(kestrel.slug, { maxVoltage: 48, minVoltage: 24, energy: 20_000, ambientTemperature: 45, rankBy: "life" })).json()) as {
      options: Option[];
    };
    const years = body.options.map((o) => o.life?.lifeYears ?? -1);
    expect(years.length).toBeGreaterThan(1);
    expect(years).toEqual([...years].sort((a, b) => b - a));
  });

  it("refuses cells whose range excludes the ambient, and explains", async () => {
    const res = await post(marlow.slug, { maxVoltage: 48, minVoltage: 24, energy: 20_000, technology: "edlc", ambientTemperature: 80 });
    const body = await res.json();
    expect(body.options).toEqual([]);
    expect(body.reasons.join(" ")).toContain("the 80 °C ambient is outside every cell's temperature range");
  });

  it("answers 400 at the field for an ambient beyond its bound, an unknown failure filter or a life beyond 100 years", async () => {
    for (const [field, value, message] of [
      ["ambientTemperature", 500, "Ambient temperature must be at most 200 °C"],
      ["survives", "sometimes", 'survives must be "short", "open" or "both"'],
      ["minLifeYears", 1000, "Minimum life must be at most 100 years"],
      ["rmsCurrent", 1e9, "RMS current must be at most 10 MA"],
    ] as const) {
      const res = await post(kestrel.slug, { maxVoltage: 48, energy: 1000, [field]: value });
      expect(res.status, field).toBe(400);
      expect((await res.json()).issues).toContainEqual({ path: field, message });
    }
  });

  it("reads the shop's own standby time: a 3000-day standby makes its hybrid banks need a disconnect", async () => {
    const shop = await createShop("kestrel");
    const requirement = { maxVoltage: 48, minVoltage: 36, energy: 5000, technology: "hybrid" };
    const before = (await (await post(shop.slug, requirement)).json()) as { options: Option[] };
    // with the 90-day default most of Kestrel's hybrid banks outlast the standby on their balancing resistors
    expect(before.options.some((o) => o.handling.standby?.needsDisconnect === false)).toBe(true);
    await db
      .update(shopSettings)
      .set({ reliabilitySettings: { ...DEFAULT_RELIABILITY_SETTINGS, standbyDays: 3000 } })
      .where(eq(shopSettings.shopId, shop.id));
    const after = (await (await post(shop.slug, requirement)).json()) as { options: Option[] };
    expect(after.options.length).toBeGreaterThan(0);
    for (const o of after.options) {
      expect(o.handling.standby?.needsDisconnect).toBe(true);
      expect(o.warnings.join(" ")).toContain("the bank needs a disconnect");
    }
  });

  it("the storefront's search reads the service conditions and filters as typed", async () => {
    await actAs(null);
    const r = await exploreArrangements(kestrel.slug, {
      ...EMPTY_REQUEST_FORM,
      maxVoltage: "48 V",
      minVoltage: "24 V",
      sizeFor: "energy",
      energy: "20 kJ",
      ambientTemperature: "−10 °C",
      rmsCurrent: "30 A",
      survives: "short",
      minLifeYears: "2",
    });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.data.requirement).toMatchObject({ ambientTemperature: -10, rmsCurrent: 30, survives: "short", minLifeYears: 2 });
    for (const o of r.data.options) {
      expect(o.failures.short.survives).toBe(true);
      expect(o.life!.lifeYears!).toBeGreaterThanOrEqual(2);
      expect(o.life!.cellRmsCurrent).toBeCloseTo(30 / o.parallelCount, 9);
    }
    const bad = await exploreArrangements(kestrel.slug, { ...EMPTY_REQUEST_FORM, maxVoltage: "48 V", energy: "20 kJ", ambientTemperature: "hot" });
    expect(bad).toMatchObject({ ok: false, code: "invalid" });
    if (!bad.ok) expect(bad.fieldErrors?.ambientTemperature?.join(" ")).toMatch(/not a temperature/);
  });
});

describe("the catalog keeps a hybrid cell's minimum voltage", () => {
  it("refuses a hybrid cell without one (check constraint), and accepts an EDLC cell without one", async () => {
    const shop = await createShop("kestrel");
    const [hybrid] = await db.select().from(catalogCells).where(eq(catalogCells.shopId, shop.id)).limit(1);
    const row = { ...hybrid!, id: undefined, sku: "TEST-HYB-NOMIN", technology: "hybrid" as const, minVoltageV: null };
    await expect(db.insert(catalogCells).values(row)).rejects.toMatchObject({ cause: { code: "23514" } });
    await db.insert(catalogCells).values({ ...row, sku: "TEST-EDLC-NOMIN", technology: "edlc" as const });
  });
});

describe("a quote freezes the failure and life figures, and its PDF shows them", () => {
  it("the PDF holds the option's verdicts, its yield and its life as pdftotext reads them", async () => {
    const shop = await createShop("kestrel");
    const number = await createQuote(shop, shop.customers[0]);
    const quote = await getQuoteByNumber(shop.id, number);
    const { buffer } = await loadQuotePdf(shop.id, quote!.revisionId);
    const text = pdfToText(buffer).replace(/\s+/g, " ");
    expect(text).toContain("One failed cell");
    expect(text).toMatch(/Survives one shorted cell: (yes|no)/);
    expect(text).toMatch(/Survives one open cell: (yes|no)/);
    expect(text).toContain("Tolerance yield");
    expect(text).toContain("Temperature and expected life");
    expect(text).toMatch(/Expected life (about \d+(\.\d)? years|\d+ years or more)/);
  });
});

describe("the settings form edits the failure, yield and life group", () => {
  it("saves a shop's own standby and voltage step, which the search then uses, with an audit entry", async () => {
    const shop = await createShop("kestrel");
    await actAs(shop.manager.email);
    const groups = { designFactors: DEFAULT_DESIGN_FACTORS, autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS, reliabilitySettings: DEFAULT_RELIABILITY_SETTINGS };
    const values = settingsFormText(groups);
    // the per-technology step is a dotted key into the nested object
    expect(values.reliabilitySettings["voltageDoublingStep.edlc"]).toBe("3.7 %");
    values.reliabilitySettings.standbyDays = "30";
    values.reliabilitySettings["voltageDoublingStep.hybrid"] = "6 %";
    expect(await saveDesignSettings(shop.slug, { values })).toMatchObject({ ok: true, data: { changed: 2 } });
    const [row] = await db.select().from(shopSettings).where(eq(shopSettings.shopId, shop.id));
    expect(row?.reliabilitySettings).toEqual({
      ...DEFAULT_RELIABILITY_SETTINGS,
      standbyDays: 30,
      voltageDoublingStep: { ...DEFAULT_RELIABILITY_SETTINGS.voltageDoublingStep, hybrid: 0.06 },
    });
    expect((await loadShopCatalog(shop.id)).reliability.standbyDays).toBe(30);
    values.reliabilitySettings.standbyDays = "5000";
    const refused = await saveDesignSettings(shop.slug, { values });
    expect(refused).toMatchObject({ ok: false, code: "invalid" });
    if (!refused.ok) expect(refused.fieldErrors?.["reliabilitySettings.standbyDays"]?.join(" ")).toMatch(/at most 3650/);
  });
});
