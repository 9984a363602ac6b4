import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_PRICING_RULES,
  PricingError,
  priceBank,
  quickPrice,
  selectDiscountPct,
  selectEnclosure,
  tryPriceBank,
  type BankBill,
  type BankPrice,
  type PricingRules,
} from "@/lib/pricing";
import { sixCellBill } from "./six-cell-bill";

// All parts, part numbers and shops below are invented.
const rules = (over: Partial<PricingRules> = {}): PricingRules => ({
  ...DEFAULT_PRICING_RULES,
  ...over,
});

const lineAmounts = (p: BankPrice): Record<string, string> => Object.fromEntries(p.lines.map((l) => [l.code, l.amount]));

describe("priceBank — hand-worked example, EUR, default rules", () => {
  // Arithmetic by hand (EUR, 2 minor digits per ISO 4217; half-up rounding, common practice):
  // materials, per bank
  //   cells            6 × 6.40            =  38.40
  //   balancing res.   6 × 0.35 (0.25 W part)  =   2.10
  //   bleeder          one 2 W part at 1.80     =   1.80
  //   interconnects    6 × 1.80            =  10.80
  //   enclosure        0.000528 m³ × 1.6 = 0.0008448 m³ ≤ 0.002 → "Enclosure S" = 38.00
  //   terminals                            =  24.00
  //   materials                            = 115.10
  // overhead  12 % × 115.10 = 13.812        →  13.81
  // labour at 68.00/h
  //   setup     90 min = 1.5 h × 68         = 102.00
  //   assembly  6 min × 6 cells = 36 min = 0.6 h × 68 = 40.80
  //   test      45 min = 0.75 h × 68        =  51.00
  //   labour                                = 193.80
  // cost       115.10 + 13.81 + 193.80      = 322.71
  // unit price 322.71 / (1 − 0.28) = 448.2083… → 448.21   (margin on price)
  // quantity 10 → break at 10 → 7 %
  //   gross     448.21 × 10                 = 4482.10
  //   discount  7 % × 4482.10 = 313.747     →  313.75
  //   subtotal  4482.10 − 313.75            = 4168.35
  //   tax       20 % × 4168.35 = 833.67     →  833.67
  //   total     4168.35 + 833.67            = 5002.02
  const p = priceBank(sixCellBill, rules());

  it("prices every line", () => {
    expect(lineAmounts(p)).toEqual({
      cells: "38.40",
      "balancing-resistors": "2.10",
      bleeder: "1.80",
      interconnects: "10.80",
      enclosure: "38.00",
      terminals: "24.00",
      "labour-setup": "102.00",
      "labour-assembly": "40.80",
      "labour-test": "51.00",
      overhead: "13.81",
    });
    expect(p.lines.find((l) => l.code === "enclosure")?.description).toBe("Enclosure S, 2 L");
    expect(p.lines.find((l) => l.code === "bleeder")).toMatchObject({
      quantity: 1,
      unitPrice: "1.80",
      description: "Bleeder resistor 330 Ω, 2 W (RS-2W)",
    });
    expect(p.lines.find((l) => l.code === "balancing-resistors")?.description).toBe("Balancing resistor 1 kΩ, 0.25 W (RS-0W25)");
    expect(p.lines.find((l) => l.code === "labour-assembly")).toMatchObject({
      kind: "labour",
      quantity: 0.6,
      unit: "h",
      unitPrice: "68.00",
    });
  });

  it("totals the quote", () => {
    expect(p).toMatchObject({
      currency: "EUR",
      materials: "115.10",
      overhead: "13.81",
      labour: "193.80",
      cost: "322.71",
      marginPct: "28",
      unitPrice: "448.21",
      quantity: 10,
      discountPct: "7",
      discount: "313.75",
      subtotal: "4168.35",
      taxPct: "20",
      tax: "833.67",
      total: "5002.02",
    });
  });
});

describe("priceBank — extra lines beside the bank", () => {
  // The six-cell bill at the default rules again (unit price 448.21, 10 banks, 7 % break: gross
  // 4482.10, discount 313.75), with two sell-priced extras: 2 × 35.50 = 71.00 and 1 × 120.00.
  // subtotal 4482.10 − 313.75 + 71.00 + 120.00 = 4359.35; tax 20 % = 871.87; total 5231.22.
  const extras = [
    { description: "Spare cell kit", quantity: 2, unit: "set", unitPrice: "35.50" },
    { description: "Commissioning visit", quantity: 1, unit: "lot", unitPrice: "120" },
  ];
  const p = priceBank(sixCellBill, rules(), extras);

  it("adds them after the quantity discount, untouched by overhead and margin, and taxes them", () => {
    expect(p.unitPrice).toBe("448.21");
    expect(p.discount).toBe("313.75");
    expect(p.extras).toEqual([
      { ...extras[0], amount: "71.00" },
      { ...extras[1], unitPrice: "120.00", amount: "120.00" },
    ]);
    expect(p).toMatchObject({ subtotal: "4359.35", tax: "871.87", total: "5231.22" });
  });

  it("leaves a price without extras exactly as before (no extras field)", () => {
    expect(priceBank(sixCellBill, rules())).not.toHaveProperty("extras");
  });

  it("refuses an extra line without a description or with money finer than the currency", () => {
    const r = tryPriceBank(sixCellBill, rules(), [{ description: " ", quantity: 1, unit: "pc", unitPrice: "1.005" }]);
    expect(r).toMatchObject({ ok: false, code: "invalid-extras" });
    if (!r.ok) expect(r.issues.map((i) => i.path)).toEqual(["extras[0].description", "extras[0].unitPrice"]);
  });
});

describe("priceBank — hand-worked example, JPY (0 minor digits, ISO 4217)", () => {
  const jpyRules = rules({
    currency: "JPY",
    labourRatePerHour: "6000",
    setupMinutes: 60,
    minutesPerCell: 5,
    testMinutes: 30,
    overheadPct: "10",
    marginPct: "25",
    taxRatePct: "10",
    interconnectCostPerCell: "250",
    balancingBoardCost: "2500",
    terminalSetCost: "3000",
    enclosures: [
      { name: "Box B", maxVolumeM3: 0.05, cost: "20000" },
      { name: "Box A", maxVolumeM3: 0.01, cost: "9000" },
    ],
    enclosurePackingFactor: 1.5,
    quantityBreaks: [{ minQuantity: 2, discountPct: "3" }],
    quoteValidityDays: 14,
  });
  const bill: BankBill = {
    cell: { sku: "NV-60F-2V7", description: "", unitCost: "1234.5" },
    cellCount: 12,
    balancingResistors: null,
    bleeder: { resistance: 47, power: 5, unitCost: "600" },
    activeBoards: { sku: "AB-6S", count: 2, unitCost: "" },
    volumeM3: 0.0072,
    quantity: 3,
  };
  // cells        unit 1234.5 → 1235 (half-up to 0 digits); 12 × 1235 = 14820
  // bleeder      one 5 W part                 =   600
  // interconnect 12 × 250                     =  3000
  // boards       no unit cost → fallback 2500; 2 × 2500 = 5000
  // enclosure    0.0072 × 1.5 = 0.0108 m³ > 0.01 (Box A) → Box B = 20000
  // terminals                                 =  3000
  // materials                                 = 46420
  // overhead     10 % × 46420                 =  4642
  // labour       60 min → 6000; 5 × 12 = 60 min → 6000; 30 min → 3000; = 15000
  // cost         46420 + 4642 + 15000         = 66062
  // unit price   66062 / 0.75 = 88082.67      → 88083
  // quantity 3 ≥ 2 → 3 %: gross 3 × 88083 = 264249; discount 7927.47 → 7927; subtotal 256322
  // tax          10 % × 256322 = 25632.2      → 25632; total 281954
  const p = priceBank(bill, jpyRules);

  it("prices lines and totals with no decimals", () => {
    expect(lineAmounts(p)).toEqual({
      cells: "14820",
      bleeder: "600",
      interconnects: "3000",
      "balancing-boards": "5000",
      enclosure: "20000",
      terminals: "3000",
      "labour-setup": "6000",
      "labour-assembly": "6000",
      "labour-test": "3000",
      overhead: "4642",
    });
    expect(p.lines.find((l) => l.code === "cells")).toMatchObject({
      unitPrice: "1235",
      description: "NV-60F-2V7",
    });
    expect(p.lines.find((l) => l.code === "enclosure")?.description).toBe("Box B");
    expect(p).toMatchObject({
      materials: "46420",
      overhead: "4642",
      labour: "15000",
      cost: "66062",
      unitPrice: "88083",
      discountPct: "3",
      discount: "7927",
      subtotal: "256322",
      tax: "25632",
      total: "281954",
    });
  });
});

describe("priceBank — hand-worked example, KWD (3 minor digits, ISO 4217)", () => {
  const kwdRules = rules({
    currency: "KWD",
    labourRatePerHour: "12.500",
    setupMinutes: 20,
    minutesPerCell: 7,
    testMinutes: 13,
    overheadPct: "8.5",
    marginPct: "30",
    taxRatePct: "5",
    interconnectCostPerCell: "0.550",
    terminalSetCost: "7.250",
    enclosures: [
      { name: "Case 1", maxVolumeM3: 0.0056, cost: "11.000" },
      { name: "Case 2", maxVolumeM3: 0.02, cost: "19.000" },
    ],
    enclosurePackingFactor: 1.6,
    quantityBreaks: [],
    quoteValidityDays: 10,
  });
  const bill: BankBill = {
    cell: { sku: "RK-100F-3V0", description: "EDLC cell 100 F 3.0 V", unitCost: "3.1415" },
    cellCount: 4,
    balancingResistors: { count: 4, resistance: 2200, powerRating: 0.5, unitCost: "0.105" },
    bleeder: { resistance: 1500, power: 0.5, unitCost: "0.1375" },
    activeBoards: null,
    volumeM3: 0.0035,
    quantity: 1,
  };
  // cells        unit 3.1415 → 3.142 (half-up); 4 × 3.142  = 12.568
  // resistors    4 × 0.105                                  =  0.420
  // bleeder      a 0.5 W part at 0.1375 → 0.138 (half-up)  =  0.138
  // interconnect 4 × 0.550                                  =  2.200
  // enclosure    0.0035 × 1.6 = 0.0056 m³ exactly → fits Case 1 = 11.000
  //              (in binary floats 0.0035 * 1.6 = 0.005600000000000001 and would not fit)
  // terminals                                               =  7.250
  // materials                                               = 33.576
  // overhead     8.5 % × 33.576 = 2.85396                   →  2.854
  // labour at 12.500/h: setup 20 min = 4.1666… → 4.167; assembly 7 × 4 = 28 min = 5.8333… → 5.833;
  //              test 13 min = 2.7083… → 2.708; labour = 12.708
  // cost         33.576 + 2.854 + 12.708                    = 49.138
  // unit price   49.138 / 0.70 = 70.19714…                  → 70.197
  // no breaks: discount 0.000; subtotal 70.197; tax 5 % = 3.50985 → 3.510; total 73.707
  const p = priceBank(bill, kwdRules);

  it("prices lines and totals with three decimals", () => {
    expect(lineAmounts(p)).toEqual({
      cells: "12.568",
      "balancing-resistors": "0.420",
      bleeder: "0.138",
      interconnects: "2.200",
      enclosure: "11.000",
      terminals: "7.250",
      "labour-setup": "4.167",
      "labour-assembly": "5.833",
      "labour-test": "2.708",
      overhead: "2.854",
    });
    expect(p.lines.find((l) => l.code === "enclosure")?.description).toBe("Case 1");
    expect(p).toMatchObject({
      materials: "33.576",
      overhead: "2.854",
      labour: "12.708",
      cost: "49.138",
      marginPct: "30",
      unitPrice: "70.197",
      discountPct: "0",
      discount: "0.000",
      subtotal: "70.197",
      taxPct: "5",
      tax: "3.510",
      total: "73.707",
    });
  });
});

describe("margin on price", () => {
  // Margin on price: price = cost / (1 − m). 72 / (1 − 0.28) = 100.00.
  // A 28 % markup on cost would give 72 × 1.28 = 92.16 — the common mistake.
  it("quickPrice: cost 72 at 28 % margin → 100.00, not 92.16", () => {
    expect(quickPrice("72", "0", "28", "EUR")).toBe("100.00");
    expect(quickPrice("72", "0", "28", "EUR")).not.toBe("92.16");
  });

  it("quickPrice applies overhead then margin, rounded once", () => {
    // 100 × 1.12 / 0.72 = 155.5555… → 155.56
    expect(quickPrice("100", "12", "28", "EUR")).toBe("155.56");
    // 100 × 1.12 / 0.72 = 155.5555… → 156 in JPY; 155.556 in KWD
    expect(quickPrice("100", "12", "28", "JPY")).toBe("156");
    expect(quickPrice("100", "12", "28", "KWD")).toBe("155.556");
  });

  it("quickPrice refuses a margin of 100 % or more and bad input", () => {
    expect(() => quickPrice("72", "0", "100", "EUR")).toThrow(PricingError);
    expect(() => quickPrice("72", "0", "150", "EUR")).toThrow(PricingError);
    expect(() => quickPrice("abc", "0", "28", "EUR")).toThrow(PricingError);
    expect(() => quickPrice("72", "0", "28", "XYZ")).toThrow(/Unknown currency code/);
  });

  it("priceBank: a bank costing 72.00 sells at 100.00 with a 28 % margin", () => {
    const bare = rules({
      setupMinutes: 0,
      minutesPerCell: 0,
      testMinutes: 0,
      overheadPct: "0",
      taxRatePct: "0",
      interconnectCostPerCell: "0",
      terminalSetCost: "0",
      enclosures: [],
    });
    const p = priceBank(
      { ...sixCellBill, cell: { ...sixCellBill.cell, unitCost: "72" }, cellCount: 1, balancingResistors: null, bleeder: null, quantity: 1 },
      bare,
    );
    // cells 72.00; free interconnects and terminals still listed at 0.00; no labour lines
    expect(p.lines.map((l) => [l.code, l.amount])).toEqual([
      ["cells", "72.00"],
      ["interconnects", "0.00"],
      ["terminals", "0.00"],
    ]);
    expect(p.cost).toBe("72.00");
    expect(p.unitPrice).toBe("100.00");
    expect(p.total).toBe("100.00");
  });
});

describe("quantity breaks (default rules: 5 → 4 %, 10 → 7 %, 25 → 10 %)", () => {
  it.each([
    [1, "0"],
    [4, "0"],
    [5, "4"],
    [6, "4"],
    [9, "4"],
    [10, "7"],
    [11, "7"],
    [24, "7"],
    [25, "10"],
    [26, "10"],
    [1000, "10"],
  ] as const)("quantity %i → %s %%", (quantity, pct) => {
    expect(selectDiscountPct(quantity, DEFAULT_PRICING_RULES.quantityBreaks)).toBe(pct);
    expect(priceBank({ ...sixCellBill, quantity }, rules()).discountPct).toBe(pct);
  });

  it("takes the largest break reached whatever the list order", () => {
    const breaks = [
      { minQuantity: 25, discountPct: "10" },
      { minQuantity: 5, discountPct: "4" },
      { minQuantity: 10, discountPct: "7" },
    ];
    expect(selectDiscountPct(12, breaks)).toBe("7");
  });

  it("discounts the order: 4 banks at 448.21 pay no discount, 5 pay 4 %", () => {
    // 4 × 448.21 = 1792.84, no discount; tax 20 % = 358.568 → 358.57; total 2151.41
    const four = priceBank({ ...sixCellBill, quantity: 4 }, rules());
    expect([four.discount, four.subtotal, four.tax, four.total]).toEqual(["0.00", "1792.84", "358.57", "2151.41"]);
    // 5 × 448.21 = 2241.05; 4 % = 89.642 → 89.64; subtotal 2151.41; tax 430.282 → 430.28;
    // total 2581.69
    const five = priceBank({ ...sixCellBill, quantity: 5 }, rules());
    expect([five.discount, five.subtotal, five.tax, five.total]).toEqual(["89.64", "2151.41", "430.28", "2581.69"]);
  });
});

describe("enclosure choice by volume (default rules, packing factor 1.6)", () => {
  // Required volume = cell volume × 1.6; enclosures hold 0.002, 0.008, 0.03, 0.12 m³.
  it.each([
    [0.0001, "Enclosure S, 2 L"], // 0.00016
    [0.00125, "Enclosure S, 2 L"], // 0.002 exactly: fits
    [0.00126, "Enclosure M, 8 L"], // 0.002016
    [0.005, "Enclosure M, 8 L"], // 0.008 exactly
    [0.0175, "Enclosure L, 30 L"], // 0.028
    [0.075, "Cabinet XL, 120 L"], // 0.12 exactly
  ] as const)("%f m³ of cells → %s", (volumeM3, name) => {
    expect(selectEnclosure(volumeM3, DEFAULT_PRICING_RULES)?.name).toBe(name);
    const p = priceBank({ ...sixCellBill, volumeM3 }, rules());
    expect(p.lines.find((l) => l.code === "enclosure")?.description).toBe(name);
  });

  it("takes the smallest that fits whatever the list order, the cheaper of equal ones", () => {
    const enclosures = [
      { name: "Big", maxVolumeM3: 0.05, cost: "90.00" },
      { name: "Small dear", maxVolumeM3: 0.01, cost: "40.00" },
      { name: "Small cheap", maxVolumeM3: 0.01, cost: "35.00" },
      { name: "Tiny", maxVolumeM3: 0.001, cost: "20.00" },
    ];
    expect(selectEnclosure(0.005, { enclosures, enclosurePackingFactor: 1.6 })?.name).toBe("Small cheap");
  });

  it("does not auto-price a bank no enclosure holds: a typed no-enclosure-fits failure", () => {
    const bill = { ...sixCellBill, volumeM3: 0.0751 }; // needs 0.12016 m³ > 0.12
    expect(selectEnclosure(bill.volumeM3, DEFAULT_PRICING_RULES)).toBeNull();
    expect(() => priceBank(bill, rules())).toThrow(PricingError);
    const result = tryPriceBank(bill, rules());
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.code).toBe("no-enclosure-fits");
      expect(result.message).toMatch(/custom enclosure/);
      expect(result.issues[0]?.path).toBe("volumeM3");
    }
  });

  it("quotes without an enclosure line when the shop lists no enclosures", () => {
    const p = priceBank({ ...sixCellBill, volumeM3: 5 }, rules({ enclosures: [] }));
    expect(p.lines.some((l) => l.code === "enclosure")).toBe(false);
    // 115.10 − 38.00 = 77.10 of materials
    expect(p.materials).toBe("77.10");
  });
});

describe("active balancing boards", () => {
  const withBoards = (unitCost: string): BankBill => ({
    ...sixCellBill,
    activeBoards: { sku: "AB-6S", count: 2, unitCost },
  });

  it("uses the board unit cost, rounded half-up", () => {
    // 21.125 → 21.13; 2 × 21.13 = 42.26
    const p = priceBank(withBoards("21.125"), rules());
    expect(p.lines.find((l) => l.code === "balancing-boards")).toMatchObject({
      quantity: 2,
      unitPrice: "21.13",
      amount: "42.26",
    });
  });

  it("falls back to the rules board cost, or fails typed when there is none", () => {
    const p = priceBank(withBoards(""), rules());
    expect(p.lines.find((l) => l.code === "balancing-boards")?.amount).toBe("37.00"); // 2 × 18.50
    const noFallback = { ...rules() };
    delete noFallback.balancingBoardCost;
    const result = tryPriceBank(withBoards(""), noFallback);
    expect(result.ok === false && result.code).toBe("missing-board-cost");
  });
});

describe("a bank of mixed cells", () => {
  // The six-cell bank with two of its cells swapped for a dearer part: cells 4 × 6.40 + 2 × 9.15 =
  // 25.60 + 18.30 = 43.90 instead of 38.40; every other line is the same (interconnects and assembly
  // count all six cells).
  const mixed: BankBill = {
    ...sixCellBill,
    mixedCells: [
      { sku: "QX-350F-2V7", description: "EDLC cell 350 F 2.7 V", unitCost: "6.40", count: 4 },
      { sku: "QX-400F-2V7", description: "EDLC cell 400 F 2.7 V", unitCost: "9.15", count: 2 },
    ],
  };
  it("prices one cell line per part and everything else as for one part", () => {
    const one = priceBank(sixCellBill, rules());
    const two = priceBank(mixed, rules());
    expect(two.lines.filter((l) => l.code === "cells").map((l) => [l.quantity, l.unitPrice, l.amount])).toEqual([
      [4, "6.40", "25.60"],
      [2, "9.15", "18.30"],
    ]);
    expect(two.lines.filter((l) => l.code !== "cells")).toEqual(
      one.lines.filter((l) => l.code !== "cells").map((l) => (l.code === "overhead" ? expect.anything() : l)),
    );
    // materials rise by exactly 43.90 − 38.40 = 5.50
    expect(Number(two.materials) - Number(one.materials)).toBeCloseTo(5.5, 9);
  });
  it("refuses counts that do not add up to the bank's cells", () => {
    const r = tryPriceBank({ ...mixed, cellCount: 7 }, rules());
    expect(r).toMatchObject({ ok: false, code: "invalid-bill", issues: [{ path: "mixedCells" }] });
  });
});

describe("invalid input", () => {
  it("refuses invalid rules and bills with typed failures listing the issues", () => {
    const badRules = tryPriceBank(sixCellBill, rules({ marginPct: "100" }));
    expect(badRules).toMatchObject({ ok: false, code: "invalid-rules" });
    expect(badRules.ok === false && badRules.issues.map((i) => i.path)).toEqual(["marginPct"]);

    const badBill = tryPriceBank({ ...sixCellBill, cellCount: 0, quantity: 2.5 }, rules());
    expect(badBill).toMatchObject({ ok: false, code: "invalid-bill" });
    expect(badBill.ok === false && badBill.issues.map((i) => i.path)).toEqual(["cellCount", "quantity"]);
  });
});

describe("the quote always adds up (arithmetic identities over generated bills)", () => {
  const money = (digits: number, max: number) => fc.integer({ min: 0, max }).map((n) => (n / 10 ** digits).toFixed(digits));
  it("lines sum to the totals; unit price × count = amount; exact minor digits", () => {
    fc.assert(
      fc.property(
        fc.record({
          unitCost: money(4, 5_000_000),
          cellCount: fc.integer({ min: 1, max: 400 }),
          resistors: fc.integer({ min: 0, max: 400 }),
          bleederW: fc.constantFrom(0.25, 0.5, 1, 2, 5, 10, 25),
          bleederCost: money(4, 500_000),
          volumeM3: fc.double({ min: 1e-6, max: 0.07, noNaN: true }),
          quantity: fc.integer({ min: 1, max: 60 }),
          overheadPct: money(1, 400),
          marginPct: money(1, 900),
          taxPct: money(1, 300),
        }),
        (g) => {
          const r = rules({ overheadPct: g.overheadPct, marginPct: g.marginPct, taxRatePct: g.taxPct });
          const p = priceBank(
            {
              ...sixCellBill,
              cell: { ...sixCellBill.cell, unitCost: g.unitCost },
              cellCount: g.cellCount,
              balancingResistors: { count: g.resistors, resistance: 1000, powerRating: 0.25, unitCost: "0.35" },
              bleeder: { resistance: 100, power: g.bleederW, unitCost: g.bleederCost },
              volumeM3: g.volumeM3,
              quantity: g.quantity,
            },
            r,
          );
          const cents = (s: string): number => {
            expect(s).toMatch(/^\d+\.\d{2}$/);
            return Math.round(Number(s) * 100);
          };
          const byKind = (k: string) => p.lines.filter((l) => l.kind === k).reduce((a, l) => a + cents(l.amount), 0);
          for (const l of p.lines.filter((x) => x.kind === "material")) {
            expect(cents(l.unitPrice) * l.quantity).toBe(cents(l.amount));
          }
          expect(byKind("material")).toBe(cents(p.materials));
          expect(byKind("labour")).toBe(cents(p.labour));
          expect(byKind("overhead")).toBe(cents(p.overhead));
          expect(cents(p.materials) + cents(p.overhead) + cents(p.labour)).toBe(cents(p.cost));
          expect(cents(p.unitPrice) * p.quantity - cents(p.discount)).toBe(cents(p.subtotal));
          expect(cents(p.subtotal) + cents(p.tax)).toBe(cents(p.total));
          // margin on price: the rounded price is within half a cent of cost / (1 − m)
          const exact = cents(p.cost) / (1 - Number(g.marginPct) / 100);
          expect(Math.abs(cents(p.unitPrice) - exact)).toBeLessThanOrEqual(0.5 + 1e-6);
        },
      ),
      { numRuns: 300, seed: 4217 },
    );
  });
});
