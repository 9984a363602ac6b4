/**
 * The priced search: its pre-cut never changes the best dozen (checked against pricing every
 * feasible option), the cost model stays a floor under the exact price, and a search over the
 * demo catalog returns what a quote then freezes.
 */
import { Decimal } from "decimal.js";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { DEFAULT_DESIGN_FACTORS, DEFAULT_RELIABILITY_SETTINGS, searchArrangements, type Requirement } from "@/lib/bank";
import { tryPriceBank, type PricingRules } from "@/lib/pricing";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { balancingBoardsOf, billFor, costModelOf, priceLowerBound, toEngineCell } from "@/lib/quoting/bill";
import { FIRST_CUT, indexOfChosen, searchPricedOptions } from "@/lib/quoting/priced-search";
import { rankPriced, SHOWN } from "@/lib/quoting/rank";
import type { CatalogCell, CatalogComponent, ShopCatalog } from "@/lib/quoting/types";
import { arbFactors } from "../bank/arbitraries";
import { demoCatalog } from "./demo-catalog";

// ---- generators: invented catalogs (invented part numbers) and pricing rules ----

const CURRENCIES = [
  { code: "EUR", digits: 2 },
  { code: "JPY", digits: 0 },
  { code: "KWD", digits: 3 },
] as const;

const money = (digits: number, maxUnits: number) => fc.integer({ min: 0, max: maxUnits }).map((i) => (i / 10 ** digits).toFixed(digits));
const pct = (max: number) => fc.integer({ min: 0, max: max * 10 }).map((i) => (i / 10).toFixed(1));

const arbRules: fc.Arbitrary<PricingRules> = fc.constantFrom(...CURRENCIES).chain(({ code, digits }) => {
  const scale = 10 ** digits;
  return fc.record({
    currency: fc.constant(code),
    labourRatePerHour: money(digits, 150 * scale),
    setupMinutes: fc.integer({ min: 0, max: 180 }),
    minutesPerCell: fc.integer({ min: 0, max: 15 }),
    testMinutes: fc.integer({ min: 0, max: 120 }),
    overheadPct: pct(40),
    marginPct: pct(60),
    taxRatePct: pct(25),
    interconnectCostPerCell: money(digits, 5 * scale),
    balancingBoardCost: money(digits, 80 * scale),
    terminalSetCost: money(digits, 60 * scale),
    enclosures: fc
      .array(fc.record({ name: fc.constant(""), maxVolumeM3: fc.double({ min: 0.001, max: 2, noNaN: true }), cost: money(digits, 500 * scale) }), {
        maxLength: 3,
      })
      .map((es) => es.map((e, i) => ({ ...e, name: `Enclosure ${i + 1}` }))),
    enclosurePackingFactor: fc.double({ min: 1, max: 2, noNaN: true }),
    quantityBreaks: fc.constant([{ minQuantity: 5, discountPct: "4" }]),
    quoteValidityDays: fc.constant(30),
    depositPercent: fc.integer({ min: 0, max: 100 }),
  });
});

const arbCell = (i: number): fc.Arbitrary<CatalogCell> =>
  fc
    .record({
      technology: fc.constantFrom("edlc" as const, "hybrid" as const, "electrolytic" as const, "film" as const),
      capacitanceF: fc.double({ min: 1e-4, max: 3000, noNaN: true }),
      toleranceMinusPct: fc.constantFrom(0, 5, 10, 20),
      tolerancePlusPct: fc.constantFrom(5, 10, 20),
      ratedVoltageV: fc.double({ min: 2, max: 500, noNaN: true }),
      surgeFactor: fc.double({ min: 1, max: 1.2, noNaN: true }),
      esrOhm: fc.double({ min: 1e-4, max: 0.3, noNaN: true }),
      leakageCurrentA: fc.double({ min: 0, max: 5e-3, noNaN: true }),
      peakCurrentA: fc.double({ min: 1, max: 2000, noNaN: true }),
      massKg: fc.double({ min: 0.005, max: 1.5, noNaN: true }),
      // numeric(14,4): four decimals, rounded to the currency by pricing
      unitCost: fc.integer({ min: 1, max: 1_000_000 }).map((n) => (n / 1e4).toFixed(4)),
      stock: fc.integer({ min: 0, max: 500 }),
      diameterMm: fc.integer({ min: 8, max: 70 }),
      heightMm: fc.integer({ min: 10, max: 150 }),
    })
    .map(({ surgeFactor, ...c }) => ({
      ...c,
      id: `cell-${i}`,
      sku: `TQ-${String(i).padStart(3, "0")}`,
      manufacturer: "Tessaly Parts",
      series: "TQ",
      surgeVoltageV: c.ratedVoltageV * surgeFactor,
      continuousCurrentA: c.peakCurrentA / 5,
      shape: "cylinder" as const,
      lengthMm: null,
      widthMm: null,
      leadTimeDays: 14,
      // hybrid cells must carry a minimum voltage (common practice: about 2.2 V per 3.8 V cell)
      minVoltageV: c.technology === "hybrid" ? c.ratedVoltageV * 0.58 : null,
      ratedLifeHours: 2000,
      ratedLifeTemperatureC: 85,
      minTemperatureC: -40,
      maxTemperatureC: 85,
      thermalResistanceKPerW: 5,
      coldCapacitanceFactor: null,
      coldEsrFactor: null,
    }));

const arbCells: fc.Arbitrary<CatalogCell[]> = fc.integer({ min: 1, max: 24 }).chain((n) => fc.tuple(...Array.from({ length: n }, (_, i) => arbCell(i))));

const arbBoards: fc.Arbitrary<CatalogComponent[]> = fc
  .array(
    fc.record({
      channels: fc.integer({ min: 1, max: 18 }),
      maxCellVoltage: fc.double({ min: 2, max: 500, noNaN: true }),
      unitCost: fc.integer({ min: 1, max: 900_000 }).map((n) => (n / 1e4).toFixed(4)),
    }),
    { maxLength: 3 },
  )
  .map((bs) =>
    bs.map((b, i) => ({
      id: `board-${i}`,
      kind: "balancing-board" as const,
      sku: `TQ-BAL-${i}`,
      name: "Board",
      unitCost: b.unitCost,
      specs: { channels: b.channels, maxCellVoltage: b.maxCellVoltage },
      leadTimeDays: 5,
    })),
  );

/** Resistors of a few power classes (the search's lower bound must hold whichever class a bank takes). */
const arbResistors: fc.Arbitrary<CatalogComponent[]> = fc
  .uniqueArray(fc.constantFrom(0.125, 0.25, 0.5, 1, 2, 5, 10, 25, 50, 100), { maxLength: 5 })
  .chain((ratings) => fc.tuple(...ratings.map((w) => fc.integer({ min: 1, max: 400_000 }).map((n) => ({ w, unitCost: (n / 1e4).toFixed(4) })))))
  .map((rs) =>
    rs.map((r, i) => ({
      id: `resistor-${i}`,
      kind: "resistor" as const,
      sku: `TQ-RES-${i}`,
      name: "Resistor",
      unitCost: r.unitCost,
      specs: { powerRatingW: r.w },
      leadTimeDays: 2,
    })),
  );

const arbRequirement: fc.Arbitrary<Requirement> = fc
  .record({
    maxVoltage: fc.double({ min: 3, max: 900, noNaN: true }),
    minFraction: fc.double({ min: 0, max: 0.8, noNaN: true }),
    capacitance: fc.option(fc.double({ min: 1e-5, max: 200, noNaN: true }), { nil: undefined }),
    energy: fc.option(fc.double({ min: 1, max: 5e4, noNaN: true }), { nil: undefined }),
    maxMass: fc.option(fc.double({ min: 1, max: 400, noNaN: true }), { nil: undefined }),
    quantity: fc.integer({ min: 1, max: 12 }),
  })
  .filter((r) => r.capacitance !== undefined || r.energy !== undefined)
  .map(({ minFraction, ...r }) => {
    const out: Requirement = { maxVoltage: r.maxVoltage, minVoltage: r.maxVoltage * minFraction, quantity: r.quantity };
    if (r.capacitance !== undefined) out.capacitance = r.capacitance;
    if (r.energy !== undefined) out.energy = r.energy;
    if (r.maxMass !== undefined) out.maxMass = r.maxMass;
    return out;
  });

const arbCatalog: fc.Arbitrary<ShopCatalog> = fc
  .record({ factors: arbFactors, rules: arbRules, cells: arbCells, boards: arbBoards, resistors: arbResistors })
  .map(({ boards, resistors, ...c }) => ({
    ...c,
    components: [...boards, ...resistors],
    autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS,
    reliability: DEFAULT_RELIABILITY_SETTINGS,
  }));

/** Every feasible option, each priced exactly: what no pre-cut may differ from. */
function everyOptionPriced(catalog: ShopCatalog, requirement: Requirement) {
  const byId = new Map(catalog.cells.map((c) => [c.id, c]));
  const all = searchArrangements({
    requirement,
    cells: catalog.cells.map(toEngineCell),
    factors: catalog.factors,
    balancingBoards: balancingBoardsOf(catalog.components),
    costModel: costModelOf(catalog.rules, catalog.components),
    limit: Number.POSITIVE_INFINITY,
  });
  return all.options.map((o) => {
    const bill = billFor(o, byId.get(o.cellId)!, catalog.components, requirement.quantity ?? 1);
    const r = bill.ok ? tryPriceBank(bill.bill, catalog.rules) : null;
    return { ...o, price: r?.ok ? { perBank: r.data.unitPrice, total: r.data.total } : null };
  });
}

const identity = (o: {
  cell: { sku: string };
  topology: string;
  seriesCount: number;
  parallelCount: number;
  price: { perBank: string } | null;
  pareto: boolean;
}) => [o.cell.sku, o.topology, o.seriesCount, o.parallelCount, o.price?.perBank ?? null, o.pareto] as const;

describe("searchPricedOptions: the pre-cut never changes the best dozen", () => {
  it("returns exactly the dozen, order and Pareto marks that pricing every feasible option gives", () => {
    let beyondFirstCut = 0;
    fc.assert(
      fc.property(arbCatalog, arbRequirement, (catalog, requirement) => {
        const everything = everyOptionPriced(catalog, requirement);
        if (everything.length > FIRST_CUT) beyondFirstCut++;
        const expected = rankPriced(everything, SHOWN).map(identity);
        const found = searchPricedOptions(catalog, requirement);
        expect(found.options.map(identity)).toEqual(expected);
        expect(found.records).toHaveLength(found.options.length);
      }),
      { numRuns: 300 },
    );
    // the property is only worth something when many searches had more options than the first cut.
    // Over 40 seeds of these 300 runs that count ran from 25 to 49 (mean 39), so the floor sits far
    // below chance (a floor of 30 failed about one run in twenty) and still fails a generator that
    // stops making large searches.
    expect(beyondFirstCut).toBeGreaterThan(15);
  }, 120_000);

  it("the cost model keeps every estimate's floor at or below the exact price per bank", () => {
    fc.assert(
      fc.property(arbCatalog, arbRequirement, (catalog, requirement) => {
        for (const o of everyOptionPriced(catalog, requirement)) {
          if (!o.price) continue;
          expect(new Decimal(priceLowerBound(o.costEstimate, catalog.rules)).lessThanOrEqualTo(o.price.perBank)).toBe(true);
        }
      }),
      { numRuns: 300 },
    );
  }, 120_000);
});

describe("searchPricedOptions over the demo catalog", () => {
  const kestrel = demoCatalog("kestrel-bank-works");

  it("prices the 48 V, 20 kJ journey bank and keeps the price build-up and cell behind each shown option", () => {
    const found = searchPricedOptions(kestrel, { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 });
    expect(found.options.length).toBeGreaterThan(0);
    expect(found.options.length).toBeLessThanOrEqual(SHOWN);
    expect(found.currency).toBe("EUR");
    found.options.forEach((o, i) => {
      const record = found.records[i]!;
      expect(record.cell.sku).toBe(o.cell.sku);
      expect(record.cell).not.toHaveProperty("stock");
      // the total shown is the total of the frozen build-up
      expect(o.price?.amount).toBe(record.price?.total);
      expect(o).not.toHaveProperty("costEstimate");
      expect(o).not.toHaveProperty("cellId");
    });
    const chosen = found.options[3]!;
    expect(
      indexOfChosen(found.options, {
        cellSku: chosen.cell.sku,
        topology: chosen.topology,
        seriesCount: chosen.seriesCount,
        parallelCount: chosen.parallelCount,
      }),
    ).toBe(3);
    expect(indexOfChosen(found.options, { cellSku: "NO-SUCH", topology: chosen.topology, seriesCount: 1, parallelCount: 1 })).toBe(-1);
  });

  it("gives a supercapacitor module around 125 V options, each string the shortest safe one or one longer (DESIGN §3.2)", () => {
    const requirement: Requirement = { maxVoltage: 125, minVoltage: 62.5, capacitance: 40, technology: "edlc" };
    const found = searchPricedOptions(kestrel, requirement);
    expect(found.reasons).toEqual([]);
    expect(found.options.length).toBeGreaterThan(0);
    const m = DEFAULT_DESIGN_FACTORS.matchingTolerance;
    const boards = balancingBoardsOf(kestrel.components);
    for (const o of found.options) {
      const { ratedVoltage: vr, surgeVoltage: vs } = o.cell;
      // V_w = V_max·(1/C_lo)/(1/C_lo + (N_s − 1)/C_hi) ≤ L  ⇔  N_s ≥ 1 + (V_max/L − 1)·C_hi/C_lo
      const cLo = 1 - m;
      const cHi = 1 + m;
      const smallest = (limit: number) => Math.max(Math.ceil(125 / vr), Math.ceil(1 + ((125 / limit - 1) * cHi) / cLo));
      const withBoard = smallest(vs);
      const boardClamps = boards.some((b) => b.maxCellVoltage <= vr && b.maxCellVoltage >= 125 / withBoard);
      const shortest = boardClamps ? withBoard : smallest(vr);
      expect(o.seriesCount).toBe(o.longerLife ? shortest + 1 : shortest);
      // the search reports what the closed form says about its own string
      const vw = (125 * (1 / cLo)) / (1 / cLo + (o.seriesCount - 1) / cHi);
      expect(o.worstCellVoltage).toBeCloseTo(vw, 9);
      expect(o.worstCellVoltage).toBeLessThanOrEqual(vs);
    }
    // 2.7 V cells with a 2.85 V surge rating and boards clamping at 2.7 V: N_s = ceil(1 + (125/2.85 − 1)·1.05/0.95) = 49,
    // where ceil(125/2.7) = 47 and 48 both let the weakest cell pass its surge rating
    expect(found.options.some((o) => o.cell.ratedVoltage === 2.7 && o.seriesCount === 49 && o.balancing.activeBoard !== null)).toBe(true);
  });
});
