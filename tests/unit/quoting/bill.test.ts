import { describe, expect, it } from "vitest";
import { DEFAULT_DESIGN_FACTORS, searchArrangements } from "@/lib/bank";
import { DEFAULT_PRICING_RULES, priceBank } from "@/lib/pricing";
import { balancingBoardsOf, billFor, costModelOf, freezeCell, toBalancingBoard, toEngineCell } from "@/lib/quoting/bill";
import type { CatalogCell, CatalogComponent } from "@/lib/quoting/types";
import { SAMPLE_BOARD, SAMPLE_CELL, SAMPLE_RESISTORS } from "./sample-quote";

/** The bill, or the test fails with the reason it could not be made. */
function billed(...args: Parameters<typeof billFor>) {
  const r = billFor(...args);
  if (!r.ok) throw new Error(r.message);
  return r.bill;
}

/** An invented electrolytic box cell. */
const BOX: CatalogCell = {
  ...SAMPLE_CELL,
  id: "box-1",
  sku: "VX-4700-450",
  technology: "electrolytic",
  capacitanceF: 4700e-6,
  toleranceMinusPct: 20,
  tolerancePlusPct: 20,
  ratedVoltageV: 450,
  surgeVoltageV: 500,
  shape: "box",
  diameterMm: null,
  lengthMm: 50,
  widthMm: 40,
  heightMm: 100,
  unitCost: "12.3456",
};

describe("catalog row → engine cell", () => {
  it("turns percentages into fractions, the cost string into a number and the shape into a volume", () => {
    const c = toEngineCell(SAMPLE_CELL);
    expect(c).toMatchObject({
      id: SAMPLE_CELL.id,
      sku: "BWC-3000-27",
      technology: "edlc",
      capacitance: 3000,
      toleranceMinus: 0,
      tolerancePlus: 0.2,
      ratedVoltage: 2.7,
      surgeVoltage: 2.85,
      unitCost: 38.5,
      stock: 400,
      leadTimeDays: 10,
    });
    // a cylinder takes a square of its diameter: 60.7 mm × 60.7 mm × 138 mm
    expect(c.volume).toBeCloseTo(60.7 * 60.7 * 138e-9, 15);
    const b = toEngineCell(BOX);
    expect(b.toleranceMinus).toBeCloseTo(0.2, 15);
    expect(b.volume).toBeCloseTo(50 * 40 * 100e-9, 15);
    expect(b.unitCost).toBe(12.3456);
  });
});

describe("component row → balancing board", () => {
  it("reads channels and clamp voltage from the specs", () => {
    expect(toBalancingBoard(SAMPLE_BOARD)).toEqual({ id: SAMPLE_BOARD.id, sku: "BWC-BAL6", channels: 6, maxCellVoltage: 2.7, unitCost: 21.4, leadTimeDays: 7 });
  });

  it("is null for other kinds and for boards without their figures", () => {
    const terminal: CatalogComponent = { ...SAMPLE_BOARD, kind: "terminal", sku: "T-1" };
    const blank: CatalogComponent = { ...SAMPLE_BOARD, sku: "B-0", specs: { channels: 6 } };
    expect(toBalancingBoard(terminal)).toBeNull();
    expect(toBalancingBoard(blank)).toBeNull();
    expect(balancingBoardsOf([terminal, blank, SAMPLE_BOARD]).map((b) => b.sku)).toEqual(["BWC-BAL6"]);
  });
});

describe("option → bill of materials", () => {
  const search = (maxVoltage: number, boards: CatalogComponent[]) =>
    searchArrangements({
      requirement: { maxVoltage, energy: 20_000 },
      cells: [toEngineCell(SAMPLE_CELL)],
      factors: DEFAULT_DESIGN_FACTORS,
      balancingBoards: balancingBoardsOf(boards),
    }).options;

  it("bills the cells, the balancing resistors and the board the engine fitted, at the board's own unit cost", () => {
    const withBoard = search(48, [SAMPLE_BOARD]).find((o) => o.balancing.activeBoard !== null)!;
    const bill = billed(withBoard, SAMPLE_CELL, [SAMPLE_BOARD, ...SAMPLE_RESISTORS], 3);
    expect(bill.cell).toEqual({ sku: "BWC-3000-27", description: "Brightwater Cells BW-K", unitCost: "38.5000" });
    expect(bill.cellCount).toBe(withBoard.cellCount);
    expect(bill.activeBoards).toEqual({ sku: "BWC-BAL6", count: withBoard.balancing.activeBoard!.count, unitCost: "21.4000" });
    // twice what each dissipates is above the 0.25 W class and within the 1 W class
    expect(2 * withBoard.balancing.power).toBeGreaterThan(0.25);
    expect(2 * withBoard.balancing.power).toBeLessThanOrEqual(1);
    expect(bill.balancingResistors).toEqual({
      count: withBoard.balancing.count,
      resistance: withBoard.balancing.resistance,
      powerRating: 1,
      sku: "BWC-R1W",
      unitCost: "0.6000",
    });
    expect(bill.volumeM3).toBe(withBoard.volume);
    expect(bill.quantity).toBe(3);
  });

  it("a board the catalog no longer lists is billed with no unit cost, so the rules' fallback prices it", () => {
    const withBoard = search(48, [SAMPLE_BOARD]).find((o) => o.balancing.activeBoard !== null)!;
    expect(billed(withBoard, SAMPLE_CELL, SAMPLE_RESISTORS, 1).activeBoards?.unitCost).toBe("");
  });

  it("bills a continuous bleeder as the catalog part of its power class, and leaves a switched discharge circuit to the shop", () => {
    // 400 V from one 450 V cell: the bleeder that brings it to 60 V within 5 s would dissipate kW
    const options = searchArrangements({ requirement: { maxVoltage: 400, energy: 300 }, cells: [toEngineCell(BOX)], factors: DEFAULT_DESIGN_FACTORS }).options;
    const switched = options.find((o) => o.discharge.bleeder?.switched)!;
    expect(billed(switched, BOX, [], 1).bleeder).toBeNull();
    // 1.6 W dissipated needs a part rated for 3.2 W: the 5 W class (the 1 W class is too small)
    const slow = { ...switched, discharge: { ...switched.discharge, bleeder: { resistance: 1e5, power: 1.6, powerRating: 5, energy: 1, switched: false } } };
    expect(billed(slow, BOX, SAMPLE_RESISTORS, 1).bleeder).toEqual({ resistance: 1e5, power: 5, sku: "BWC-R5W", unitCost: "1.9000" });
    // 14 W needs 28 W: beyond the largest class this catalog holds (25 W), so no bill and no made-up price
    const hot = { ...slow, discharge: { ...slow.discharge, bleeder: { ...slow.discharge.bleeder, power: 14, powerRating: 50 } } };
    const refused = billFor(hot, BOX, SAMPLE_RESISTORS, 1);
    expect(refused).toEqual({ ok: false, message: "The catalog holds no resistor rated for 28 W (twice the bleeder's 14 W)." });
  });

  it("prices a balancing resistor by its power class: a hotter resistor takes a dearer part", () => {
    const o = search(48, [])[0]!;
    const cool = billed({ ...o, balancing: { ...o.balancing, power: 0.1 } }, SAMPLE_CELL, SAMPLE_RESISTORS, 1);
    const hot = billed({ ...o, balancing: { ...o.balancing, power: 2 } }, SAMPLE_CELL, SAMPLE_RESISTORS, 1);
    // 0.1 W dissipated needs 0.2 W: the 0.25 W class
    expect(cool.balancingResistors).toMatchObject({ sku: "BWC-R0W25", unitCost: "0.3500" });
    // 2 W dissipated needs 4 W: the 5 W class
    expect(hot.balancingResistors).toMatchObject({ sku: "BWC-R5W", powerRating: 5, unitCost: "1.9000" });
    const line = (b: typeof cool) => priceBank(b, DEFAULT_PRICING_RULES).lines.find((l) => l.code === "balancing-resistors");
    expect(line(cool)?.unitPrice).toBe("0.35");
    expect(line(hot)?.unitPrice).toBe("1.90");
    // with no resistor in the catalog the bank is not billed
    expect(billFor(o, SAMPLE_CELL, [SAMPLE_BOARD], 1)).toMatchObject({ ok: false });
  });

  it("prices through lib/pricing into the lines a quote freezes", () => {
    const o = search(48, [])[0]!;
    const price = priceBank(billed(o, SAMPLE_CELL, SAMPLE_RESISTORS, 1), DEFAULT_PRICING_RULES);
    expect(price.lines.find((l) => l.code === "cells")).toMatchObject({ quantity: o.cellCount, unitPrice: "38.50" });
  });
});

describe("the float cost model the search orders by", () => {
  it("splits materials (marked up by the overhead) from labour, less the rounding slack", () => {
    // EUR, 68.00/h, 12 % overhead: interconnect 1.80 − 0.005 per cell; terminals 24.00 per bank;
    // assembly 68·6/60 per cell; setup and test 68·(90 + 45)/60 − 0.02 per bank
    const m = costModelOf(DEFAULT_PRICING_RULES, SAMPLE_RESISTORS);
    expect(m.perCell).toBeCloseTo(1.8 - 0.005, 12);
    expect(m.perBank).toBe(24);
    // the cheapest resistor in the catalog, less the rounding slack
    expect(m.perBalancingResistor).toBeCloseTo(0.35 - 0.005, 12);
    expect(costModelOf(DEFAULT_PRICING_RULES).perBalancingResistor).toBe(0);
    expect(m.perBalancingBoard).toBeCloseTo(-0.005, 12);
    expect(m.materialsFactor).toBeCloseTo(1.12, 12);
    expect(m.labourPerCell).toBeCloseTo(6.8, 12);
    expect(m.labourPerBank).toBeCloseTo(153 - 0.02, 12);
    // JPY has no minor unit: the slack is half a yen per rounded price
    const jpy = costModelOf({ ...DEFAULT_PRICING_RULES, currency: "JPY", labourRatePerHour: "6000", interconnectCostPerCell: "200" });
    expect(jpy.perCell).toBeCloseTo(200 - 0.5, 12);
    expect(jpy.labourPerCell).toBeCloseTo(600, 12);
  });
});

describe("the cell a quote freezes", () => {
  it("keeps the catalog data and leaves the stock out", () => {
    const frozen = freezeCell(SAMPLE_CELL);
    const { stock: _stock, ...rest } = SAMPLE_CELL;
    expect(frozen).toEqual(rest);
    expect(frozen).not.toHaveProperty("stock");
  });
});
