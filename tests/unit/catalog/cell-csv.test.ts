/**
 * A catalog cell read from what people type, a CSV row or a JSON body; two versions compared field
 * by field; the CSV written and planned for import. Parts, makers and figures are invented.
 */
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { cellCsvTemplate, cellsToCsv, planCellImport, CSV_COLUMNS } from "@/lib/catalog/cell-csv";
import { cellFormText, diffCells, fromCellRecord, readCell, toCellRecord, type CellRecord } from "@/lib/catalog/cell-fields";

const CELL: CellRecord = {
  sku: "TQ-1200-27",
  manufacturer: "Tessaly Parts",
  series: "TQ",
  technology: "edlc",
  capacitance: 1200,
  toleranceMinus: 0.1,
  tolerancePlus: 0.2,
  ratedVoltage: 2.7,
  surgeVoltage: 2.85,
  esr: 0.00058,
  leakageCurrent: 0.0027,
  continuousCurrent: 80,
  peakCurrent: 955,
  mass: 0.272,
  shape: "cylinder",
  diameter: 0.06,
  length: null,
  width: null,
  height: 0.074,
  unitCost: "23.8000",
  stock: 240,
  leadTimeDays: 3,
  active: true,
};

const typed = {
  sku: "TQ-1200-27",
  manufacturer: "Tessaly Parts",
  series: "TQ",
  technology: "EDLC",
  capacitance: "1.2 kF",
  toleranceMinus: "10 %",
  tolerancePlus: "0.2",
  ratedVoltage: "2.7 V",
  surgeVoltage: "2,85 V",
  esr: "0.58 mΩ",
  leakageCurrent: "2.7 mA",
  continuousCurrent: "80 A",
  peakCurrent: "955",
  mass: "272 g",
  shape: "cylinder",
  diameter: "60 mm",
  length: "",
  width: "",
  height: "7.4 cm",
  unitCost: "23.80",
  stock: "240",
  leadTimeDays: "3",
  active: "yes",
};

describe("readCell", () => {
  it("reads engineering text (prefixes, decimal comma, %, g, mm, cm) into the SI record", () => {
    const r = readCell(typed);
    expect(r).toEqual({ ok: true, record: CELL });
  });

  it("reads the same cell from SI numbers, as the API sends them", () => {
    const { unitCost, ...numbers } = CELL;
    expect(readCell({ ...numbers, unitCost })).toEqual({ ok: true, record: CELL });
  });

  it.each([
    ["capacitance", "1200 V", /not a value in farads; write the capacitance like 1200 F/],
    ["capacitance", "0 F", /greater than zero/],
    ["capacitance", "200 MF", /at most 100 MF/],
    ["ratedVoltage", "", /Enter the rated voltage, e\.g\. 2\.7 V/],
    ["toleranceMinus", "120 %", /from 0 % to 99 %/],
    ["toleranceMinus", "ten", /percentage like 10 %/],
    ["unitCost", "€23.80", /decimal in the shop's currency/],
    ["unitCost", "23.80123", /at most 4 decimals/],
    ["unitCost", "-1", /decimal in the shop's currency/],
    ["stock", "2.5", /whole number from 0 to 1,000,000/],
    ["technology", "graphene", /one of: edlc, hybrid, electrolytic, film/],
    ["sku", "has space", /letters, digits/],
    ["active", "maybe", /true or false/],
    ["diameter", "60", /not a value in metres|greater than zero|at most/],
  ])("refuses %s = %j with a message for the field", (field, value, message) => {
    const r = readCell({ ...typed, [field]: value });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      const issue = r.issues.find((i) => i.field === field);
      expect(issue?.message).toMatch(message);
    }
  });

  it("checks across fields: surge at least rated, peak at least continuous, the shape's dimensions", () => {
    const r = readCell({ ...typed, surgeVoltage: "2.5 V", peakCurrent: "10 A", shape: "box" });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.field)).toEqual(["surgeVoltage", "peakCurrent", "length", "width"]);
  });

  it("an update names only what changes; the rest comes from the stored cell", () => {
    const r = readCell({ unitCost: "21.5" }, CELL);
    expect(r).toEqual({ ok: true, record: { ...CELL, unitCost: "21.5000" } });
  });

  it("round-trips the database's units without float dust (mm ↔ m, % ↔ fraction)", () => {
    const db = fromCellRecord({ ...CELL, diameter: 0.0607, toleranceMinus: 0.07 });
    expect(db.diameterMm).toBe(60.7);
    expect(db.toleranceMinusPct).toBe(7);
    expect(toCellRecord({ ...db }).diameter).toBe(0.0607);
  });

  it("the edit form's text reads back as the same cell", () => {
    const odd = { ...CELL, capacitance: 0.123456789, esr: 0.000291 };
    const r = readCell(cellFormText(odd));
    expect(r.ok).toBe(true);
    if (r.ok) expect(diffCells(odd, r.record)).toEqual([]);
  });
});

describe("diffCells", () => {
  it("names each changed field with both values as people read them", () => {
    expect(diffCells(CELL, { ...CELL, unitCost: "21.5", esr: 0.00052, active: false })).toEqual([
      { field: "esr", from: "580 µΩ", to: "520 µΩ" },
      { field: "unitCost", from: "23.8", to: "21.5" },
      { field: "active", from: "true", to: "false" },
    ]);
  });

  it("treats equal money and numbers equal within float dust as unchanged", () => {
    expect(diffCells(CELL, { ...CELL, unitCost: "23.80", capacitance: 1200 * (1 + 1e-12) })).toEqual([]);
  });
});

describe("CSV", () => {
  const existing = new Map([[CELL.sku, CELL]]);

  it("exports a header of the field names and reads its own export back as 0 changes", () => {
    const other = { ...CELL, sku: "TQ-BOX-1", shape: "box" as const, diameter: null, length: 0.0457, width: 0.0301, unitCost: "7.1250" };
    const csv = cellsToCsv([CELL, other]);
    expect(csv.split("\r\n")[0]).toBe(CSV_COLUMNS.join(","));
    const plan = planCellImport(csv, new Map([...existing, [other.sku, other]]));
    expect(plan).toMatchObject({ created: 0, updated: 0, unchanged: 2, errors: [] });
  });

  it("plans new, changed (field by field) and unchanged rows, with a partial set of columns", () => {
    const csv = "sku;unitCost;stock\r\nTQ-1200-27;21.50;240\r\n";
    const plan = planCellImport(csv, existing);
    expect(plan.rows).toEqual([
      {
        row: 2,
        sku: "TQ-1200-27",
        status: "changed",
        changes: [{ field: "unitCost", from: "23.8", to: "21.5" }],
        errors: [],
        record: { ...CELL, unitCost: "21.5000" },
      },
    ]);
  });

  it("reports each bad row with its row, column and reason, and counts only the good ones", () => {
    const template = cellCsvTemplate();
    const rows = Papa.parse<string[]>(template).data;
    const header = rows[0]!;
    const good = rows[1]!;
    const bad = good.map((v, i) => (header[i] === "sku" ? "NEW-CELL-02" : header[i] === "ratedVoltage" ? "2.7 A" : v));
    const dup = good;
    const csv = Papa.unparse([header, good, bad, dup]);
    const plan = planCellImport(csv, existing);
    expect(plan.created).toBe(1);
    expect(plan.errors).toEqual([
      { row: 3, column: "ratedVoltage", message: expect.stringMatching(/"2.7 A" is not a value in volts/) },
      { row: 4, column: "sku", message: "NEW-CELL-01 appears again (first on row 2); a cell may appear once" },
    ]);
    expect(plan.rows.map((r) => r.status)).toEqual(["new", "error", "error"]);
  });

  it("refuses an unknown column, a missing sku column and an empty file at row 1", () => {
    expect(planCellImport("sku,colour\r\nA,red", existing).errors).toEqual([
      { row: 1, column: "colour", message: expect.stringMatching(/^Unknown column "colour"/) },
    ]);
    expect(planCellImport("unitCost\r\n1", existing).errors[0]).toMatchObject({ row: 1, column: "sku" });
    expect(planCellImport("\uFEFF  \r\n", existing).errors[0]).toMatchObject({ row: 1, message: expect.stringMatching(/empty/) });
  });

  it("refuses a row with the wrong number of values (papaparse's field count)", () => {
    const plan = planCellImport("sku,unitCost\r\nTQ-1200-27,1,2\r\n", existing);
    expect(plan.errors).toEqual([{ row: 2, column: "", message: expect.stringMatching(/3 values for 2 columns/) }]);
  });
});
