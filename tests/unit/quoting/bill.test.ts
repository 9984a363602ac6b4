import { describe, expect, it } from "vitest";
import { DEFAULT_DESIGN_FACTORS, searchArrangements } from "@/lib/bank";
import { DEFAULT_PRICING_RULES, priceBank } from "@/lib/pricing";
import { balancingBoardsOf, billFor, costModelOf, freezeCell, toBalancingBoard, toEngineCell } from "@/lib/quoting/bill";
import type { CatalogCell, CatalogComponent } from "@/lib/quoting/types";
import { SAMPLE_BOARD, SAMPLE_CELL } from "./sample-quote";

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
    const bill = billFor(withBoard, SAMPLE_CELL, [SAMPLE_BOARD], 3);
    expect(bill.cell).toEqual({ sku: "BWC-3000-27", description: "Brightwater Cells BW-K", unitCost: "38.5000" });
    expect(bill.cellCount).toBe(withBoard.cellCount);
    expect(bill.activeBoards).toEqual({ sku: "BWC-BAL6", count: withBoard.balancing.activeBoard!.count, unitCost: "21.4000" });
    expect(bill.balancingResistors).toEqual({
      count: withBoard.balancing.count,
      resistance: withBoard.balancing.resistance,
      powerRating: withBoard.balancing.powerRating,
    });
    expect(bill.volumeM3).toBe(withBoard.volume);
    expect(bill.quantity).toBe(3);
  });

  it("a board the catalog no longer lists is billed with no unit cost, so the rules' fallback prices it", () => {
    const withBoard = search(48, [SAMPLE_BOARD]).find((o) => o.balancing.activeBoard !== null)!;
    expect(billFor(withBoard, SAMPLE_CELL, [], 1).activeBoards?.unitCost).toBe("");
  });

  it("bills a continuous bleeder by its power rating, and leaves a switched discharge circuit to the shop", () => {
    // 400 V from one 450 V cell: the bleeder that brings it to 60 V within 5 s would dissipate kW
    const options = searchArrangements({ requirement: { maxVoltage: 400, energy: 300 }, cells: [toEngineCell(BOX)], factors: DEFAULT_DESIGN_FACTORS }).options;
    const switched = options.find((o) => o.discharge.bleeder?.switched)!;
    expect(billFor(switched, BOX, [], 1).bleeder).toBeNull();
    const slow = { ...switched, discharge: { ...switched.discharge, bleeder: { resistance: 1e5, power: 1.6, powerRating: 5, energy: 1, switched: false } } };
    expect(billFor(slow, BOX, [], 1).bleeder).toEqual({ resistance: 1e5, power: 5 });
  });

  it("prices through lib/pricing into the lines a quote freezes", () => {
    const o = search(48, [])[0]!;
    const price = priceBank(billFor(o, SAMPLE_CELL, [], 1), DEFAULT_PRICING_RULES);
    expect(price.lines.find((l) => l.code === "cells")).toMatchObject({ quantity: o.cellCount, unitPrice: "38.50" });
  });
});

describe("the float cost model the search orders by", () => {
  it("splits materials (marked up by the overhead) from labour, less the rounding slack", () => {
    // EUR, 68.00/h, 12 % overhead: interconnect 1.80 − 0.005 per cell; terminals 24.00 per bank;
    // assembly 68·6/60 per cell; setup and test 68·(90 + 45)/60 − 0.02 per bank
    const m = costModelOf(DEFAULT_PRICING_RULES);
    expect(m.perCell).toBeCloseTo(1.8 - 0.005, 12);
    expect(m.perBank).toBe(24);
    expect(m.perBalancingResistor).toBe(0.35);
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
