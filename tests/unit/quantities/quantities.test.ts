import { describe, expect, it } from "vitest";
import { formatQuantity, parseQuantity, type QuantityUnit } from "@/lib/quantities";

// SI prefixes and unit symbols: the SI Brochure (BIPM, 9th edition, 2019), from memory.
const accepted: [string, QuantityUnit | undefined, number, QuantityUnit | null][] = [
  ["470 µF", "F", 470e-6, "F"], // U+00B5 MICRO SIGN
  ["470 μF", "F", 470e-6, "F"], // U+03BC GREEK SMALL LETTER MU
  ["470u", "F", 470e-6, "F"],
  ["470uF", "F", 470e-6, "F"],
  ["470 uf", "F", 470e-6, "F"],
  ["0.47 mF", "F", 470e-6, "F"],
  ["1.5 kF", "F", 1500, "F"],
  ["3000", "F", 3000, "F"],
  ["100 nF", undefined, 100e-9, "F"],
  ["22 pF", "F", 22e-12, "F"],
  ["48 V", "V", 48, "V"],
  ["48V", undefined, 48, "V"],
  ["1.2 kV", "V", 1200, "V"],
  ["2.2 mΩ", "Ω", 2.2e-3, "Ω"],
  ["2.2 mΩ", "Ω", 2.2e-3, "Ω"], // U+2126 OHM SIGN
  ["2.2 mohm", "Ω", 2.2e-3, "Ω"],
  ["10 kohms", "Ω", 10e3, "Ω"],
  ["4.7 MΩ", "Ω", 4.7e6, "Ω"],
  ["12.5 kJ", "J", 12500, "J"],
  ["2 kW", "W", 2000, "W"],
  ["150 A", "A", 150, "A"],
  ["10 ms", "s", 0.01, "s"],
  ["2 min", "s", 120, "s"],
  ["1.5 kWh", "Wh", 1500, "Wh"],
  ["500 g", "kg", 0.5, "kg"],
  ["12 kg", "kg", 12, "kg"],
  ["20 L", "m³", 0.02, "m³"],
  ["150 cm³", "m³", 150e-6, "m³"],
  ["0.02 m3", "m³", 0.02, "m³"],
  ["1e-3", "F", 1e-3, "F"],
  ["2.5E3 V", "V", 2500, "V"],
  ["3,5 V", "V", 3.5, "V"], // decimal comma
  ["  .5 F ", "F", 0.5, "F"],
  ["1 G", "Ω", 1e9, "Ω"],
];

const refused: [string, QuantityUnit | undefined, RegExp][] = [
  ["48 V", "F", /^"48 V" is not a value in farads$/],
  ["48 Vx", "F", /^"48 Vx" is not a value in farads$/],
  ["2.2 mΩ", "F", /not a value in farads/],
  ["abc", "V", /not a value in volts/],
  ["", "F", /Enter a value in farads/],
  ["   ", undefined, /Enter a value/],
  ["-5 V", "V", /must not be negative/],
  ["0", "F", /greater than zero/],
  ["NaN", "F", /not a value/],
  ["Infinity", "V", /not a value/],
  ["1,500 F", "F", /ambiguous/],
  ["1.5,0 F", "F", /not a value/],
  ["5 K", "V", /not a value/], // capital K is not an SI prefix (kelvin)
  ["2k", "kg", /not a value in kilograms/],
  ["1e999 F", "F", /too large/],
];

describe("parseQuantity", () => {
  for (const [input, unit, value, parsedUnit] of accepted) {
    it(`accepts ${JSON.stringify(input)}${unit ? ` as ${unit}` : ""}`, () => {
      const r = parseQuantity(input, unit);
      expect(r).toEqual({ ok: true, value, unit: parsedUnit });
    });
  }
  for (const [input, unit, message] of refused) {
    it(`refuses ${JSON.stringify(input)}${unit ? ` as ${unit}` : ""}`, () => {
      const r = parseQuantity(input, unit);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.message).toMatch(message);
    });
  }
  it("accepts zero and negatives only when asked", () => {
    expect(parseQuantity("0 V", "V", { allowZero: true })).toEqual({ ok: true, value: 0, unit: "V" });
    expect(parseQuantity("-5 A", "A", { allowNegative: true })).toEqual({ ok: true, value: -5, unit: "A" });
  });
  it("gives a unitless prefix value with unit null when no unit is expected", () => {
    expect(parseQuantity("470u")).toEqual({ ok: true, value: 470e-6, unit: null });
  });
});

describe("formatQuantity", () => {
  const cases: [number, string, string, number?][] = [
    [0.00047, "F", "470 µF"],
    [1500, "F", "1.5 kF"],
    [0.0022, "Ω", "2.2 mΩ"],
    [12500, "J", "12.5 kJ"],
    [48, "V", "48 V"],
    [999.96, "V", "1 kV"],
    [1 / 3, "F", "333 mF"],
    [1 / 3, "F", "333.33 mF", 5],
    [22e-12, "F", "22 pF"],
    [0, "V", "0 V"],
    [-0.0015, "A", "-1.5 mA"],
    [0.02, "m³", "20 L"],
    [1.5e-5, "m³", "15 cm³"],
    [0.35, "kg", "350 g"],
    [3600, "s", "3600 s"],
    [0.004, "s", "4 ms"],
  ];
  for (const [value, unit, text, digits] of cases) {
    it(`formats ${value} ${unit} as ${JSON.stringify(text)}`, () => {
      expect(formatQuantity(value, unit, digits ? { digits } : {})).toBe(text);
    });
  }

  it("round-trips with the parser to the shown precision", () => {
    const units: QuantityUnit[] = ["F", "V", "Ω", "A", "J", "W", "s", "kg", "m³", "Wh"];
    let x = 1.234567e-11;
    while (x < 1e11) {
      for (const unit of units) {
        if (unit === "s" && x > 1e6) continue;
        const text = formatQuantity(x, unit, { digits: 4 });
        const back = parseQuantity(text, unit);
        expect(back.ok, `${x} ${unit} → ${text}`).toBe(true);
        if (back.ok) expect(Math.abs(back.value / x - 1)).toBeLessThan(5e-4);
      }
      x *= 7.3;
    }
  });
});
