import { describe, expect, it } from "vitest";
import { deriveFigures, EMPTY_REQUEST_FORM, readRequestForm, type RequestFormValues } from "@/lib/validation/request-form";
import { requestFormSchema } from "@/lib/validation/request-form-schema";
import { arrangementRequestSchema } from "@/lib/validation/bank";
import { MAX_NOTES_LENGTH, MAX_QUANTITY } from "@/lib/validation/limits";

const form = (over: Partial<RequestFormValues>): RequestFormValues => ({ ...EMPTY_REQUEST_FORM, ...over });

/** The field → first message map the form shows. */
function errorsOf(values: RequestFormValues): Record<string, string> {
  const r = requestFormSchema.safeParse(values);
  if (r.success) return {};
  const out: Record<string, string> = {};
  for (const issue of r.error.issues) out[issue.path.join(".")] ??= issue.message;
  return out;
}

describe("request form: accepted values become an SI requirement", () => {
  it("a 48 V bank with 20 kJ usable down to 24 V", () => {
    const r = requestFormSchema.parse(
      form({ maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy", energy: "20 kJ", quantity: "2", notes: "  tram depot  " }),
    );
    expect(r.requirement).toEqual({ maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 });
    expect(r.notes).toBe("tram depot");
    // the same requirement passes the engine's own request schema (the server checks it again)
    expect(arrangementRequestSchema.safeParse(r.requirement).success).toBe(true);
  });

  it("only the chosen sizing goes into the requirement", () => {
    const r = requestFormSchema.parse(form({ maxVoltage: "48", sizeFor: "capacitance", capacitance: "58 F", energy: "20 kJ", backupPower: "5 kW" }));
    expect(r.requirement).toEqual({ maxVoltage: 48, capacitance: 58, quantity: 1 });
  });

  it("backup power for a time, peak current with drop, limits and technology", () => {
    const r = requestFormSchema.parse(
      form({
        maxVoltage: "400 V",
        minVoltage: "0 V",
        sizeFor: "backup",
        backupPower: "5 kW",
        backupTime: "2 min",
        peakCurrent: "200 A",
        maxDrop: "4 V",
        maxMass: "500 g",
        maxVolume: "12 L",
        technology: "film",
      }),
    );
    expect(r.requirement).toEqual({
      maxVoltage: 400,
      minVoltage: 0,
      backup: { power: 5000, seconds: 120 },
      peakCurrent: { current: 200, maxDrop: 4 },
      maxMass: 0.5,
      maxVolume: 0.012,
      quantity: 1,
      technology: "film",
    });
  });

  it("usable energy may be typed in watt-hours (1 W = 1 J/s, so 1 Wh = 3600 J: SI Brochure, 9th ed., 2019, from memory)", () => {
    const r = requestFormSchema.parse(form({ maxVoltage: "48 V", sizeFor: "energy", energy: "5.5 Wh" }));
    expect(r.requirement.energy).toBeCloseTo(19_800, 9);
  });

  it("capacitance in µF with either micro sign, decimal comma", () => {
    expect(requestFormSchema.parse(form({ maxVoltage: "450 V", sizeFor: "capacitance", capacitance: "470 µF" })).requirement.capacitance).toBe(470e-6);
    expect(requestFormSchema.parse(form({ maxVoltage: "450 V", sizeFor: "capacitance", capacitance: "470 μF" })).requirement.capacitance).toBe(470e-6);
    expect(requestFormSchema.parse(form({ maxVoltage: "2,7 V", sizeFor: "capacitance", capacitance: "3000" })).requirement.maxVoltage).toBe(2.7);
  });
});

describe("request form: every refused value is explained at its field", () => {
  const cases: [string, Partial<RequestFormValues>, string, RegExp][] = [
    ["missing maximum voltage", { sizeFor: "energy", energy: "1 kJ" }, "maxVoltage", /Enter the maximum voltage/],
    ["a unit of the wrong kind", { maxVoltage: "48 A", energy: "1 kJ" }, "maxVoltage", /not a value in volts/],
    ["words", { maxVoltage: "forty-eight", energy: "1 kJ" }, "maxVoltage", /not a value in volts/],
    ["negative voltage", { maxVoltage: "-48 V", energy: "1 kJ" }, "maxVoltage", /must not be negative/],
    ["zero voltage", { maxVoltage: "0 V", energy: "1 kJ" }, "maxVoltage", /greater than zero/],
    ["minimum not below maximum", { maxVoltage: "48 V", minVoltage: "48 V", energy: "1 kJ" }, "minVoltage", /below the maximum/],
    ["energy missing when sizing for energy", { maxVoltage: "48 V", sizeFor: "energy" }, "energy", /Enter the usable energy/],
    ["energy in watts", { maxVoltage: "48 V", energy: "20 kW" }, "energy", /not a value in joules/],
    ["capacitance missing when sizing for it", { maxVoltage: "48 V", sizeFor: "capacitance" }, "capacitance", /Enter the capacitance/],
    ["backup time missing", { maxVoltage: "48 V", sizeFor: "backup", backupPower: "5 kW" }, "backupTime", /Enter the backup time/],
    ["backup time in volts", { maxVoltage: "48 V", sizeFor: "backup", backupPower: "5 kW", backupTime: "30 V" }, "backupTime", /not a value in seconds/],
    ["peak current without a drop", { maxVoltage: "48 V", energy: "1 kJ", peakCurrent: "200 A" }, "maxDrop", /how far the voltage may drop/],
    ["a drop without a current", { maxVoltage: "48 V", energy: "1 kJ", maxDrop: "4 V" }, "peakCurrent", /peak current/],
    ["a drop above the maximum voltage", { maxVoltage: "48 V", energy: "1 kJ", peakCurrent: "200 A", maxDrop: "60 V" }, "maxDrop", /below the maximum voltage/],
    ["mass in litres", { maxVoltage: "48 V", energy: "1 kJ", maxMass: "12 L" }, "maxMass", /not a value in kilograms/],
    ["volume in kilograms", { maxVoltage: "48 V", energy: "1 kJ", maxVolume: "25 kg" }, "maxVolume", /not a value in cubic metres/],
    ["fractional quantity", { maxVoltage: "48 V", energy: "1 kJ", quantity: "1.5" }, "quantity", /whole number/],
    ["zero quantity", { maxVoltage: "48 V", energy: "1 kJ", quantity: "0" }, "quantity", /whole number/],
    ["one bank more than a request may ask for", { maxVoltage: "48 V", energy: "1 kJ", quantity: String(MAX_QUANTITY + 1) }, "quantity", /whole number/],
    ["an ambiguous thousands comma", { maxVoltage: "1,500 V", energy: "1 kJ" }, "maxVoltage", /ambiguous/],
    // physical upper bounds (lib/bank/bounds.ts), refused where they are typed
    ["1e17 V", { maxVoltage: "1e17 V", energy: "1 kJ" }, "maxVoltage", /maximum voltage must be at most 2 MV/],
    ["3 MV minimum voltage", { maxVoltage: "1 MV", minVoltage: "3 MV", energy: "1 kJ" }, "minVoltage", /at most 2 MV/],
    ["2 GJ of energy", { maxVoltage: "48 V", energy: "2 GJ" }, "energy", /at most 1 GJ/],
    ["an energy in Wh above 1 GJ", { maxVoltage: "48 V", energy: "1e6 kWh" }, "energy", /at most 1 GJ/],
    ["1e9 F", { maxVoltage: "48 V", sizeFor: "capacitance", capacitance: "1e9 F" }, "capacitance", /at most 100 MF/],
    ["5 GW of backup", { maxVoltage: "48 V", sizeFor: "backup", backupPower: "5 GW", backupTime: "1 s" }, "backupPower", /at most 1 GW/],
    ["a year of backup", { maxVoltage: "48 V", sizeFor: "backup", backupPower: "5 kW", backupTime: "31536000 s" }, "backupTime", /at most 86,400 s/],
    ["100 MA peak", { maxVoltage: "48 V", energy: "1 kJ", peakCurrent: "1e8 A", maxDrop: "4 V" }, "peakCurrent", /at most 10 MA/],
    ["1e7 kg", { maxVoltage: "48 V", energy: "1 kJ", maxMass: "1e7 kg" }, "maxMass", /at most 1,000,000 kg/],
    ["1e4 m³", { maxVoltage: "48 V", energy: "1 kJ", maxVolume: "1e7 L" }, "maxVolume", /at most 1,000 m³/],
  ];
  for (const [name, values, field, message] of cases) {
    it(name, () => {
      const errors = errorsOf(form(values));
      expect(errors[field], JSON.stringify(errors)).toMatch(message);
    });
  }

  it("a technology outside the list and over-long notes are refused", () => {
    const errors = errorsOf({ ...form({ maxVoltage: "48 V", energy: "1 kJ", notes: "x".repeat(MAX_NOTES_LENGTH + 1) }), technology: "lead-acid" as never });
    expect(errors.technology).toMatch(/technology/);
    expect(errors.notes).toMatch(String(MAX_NOTES_LENGTH));
  });

  it("takes the most banks and the longest notes a request may have, and the engine request schema agrees", () => {
    const r = requestFormSchema.parse(form({ maxVoltage: "48 V", energy: "1 kJ", quantity: String(MAX_QUANTITY), notes: "x".repeat(MAX_NOTES_LENGTH) }));
    expect(r.requirement.quantity).toBe(MAX_QUANTITY);
    expect(arrangementRequestSchema.safeParse(r.requirement).success).toBe(true);
    expect(arrangementRequestSchema.safeParse({ ...r.requirement, quantity: MAX_QUANTITY + 1 }).success).toBe(false);
  });

  it("reports every bad field at once, not only the first", () => {
    const r = readRequestForm(form({ maxVoltage: "abc", energy: "xyz", quantity: "-1" }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.field).sort()).toEqual(["energy", "maxVoltage", "quantity"]);
  });
});

describe("figures derived as people type", () => {
  // E = ½·C·V² for a capacitor: OpenStax University Physics Volume 2 (2016), section 8.3
  // "Energy Stored in a Capacitor"; usable energy between two voltages is the difference.
  it("energy and voltages give the capacitance: C = 2E/(Vmax² − Vmin²)", () => {
    const d = deriveFigures(form({ maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy", energy: "20 kJ" }));
    // 2 × 20 000 / (2304 − 576) = 40 000 / 1728 = 23.148 F
    expect(d.capacitance).toBeCloseTo(23.148148, 5);
    // ½ × 23.148 × 48² = 26 666.7 J stored at 48 V
    expect(d.storedEnergy).toBeCloseTo(26_666.667, 2);
  });

  it("backup P·t needs at least that energy: 5 kW × 30 s = 150 kJ", () => {
    const d = deriveFigures(form({ maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "backup", backupPower: "5 kW", backupTime: "30 s" }));
    expect(d.usableEnergy).toBe(150_000);
    // 2 × 150 000 / 1728 = 173.61 F
    expect(d.capacitance).toBeCloseTo(173.6111, 3);
  });

  it("a capacitance gives the usable and stored energy; an empty minimum means 0 V", () => {
    const d = deriveFigures(form({ maxVoltage: "48 V", sizeFor: "capacitance", capacitance: "58 F" }));
    // ½ × 58 × 48² = 66 816 J
    expect(d.usableEnergy).toBeCloseTo(66_816, 6);
    expect(d.storedEnergy).toBeCloseTo(66_816, 6);
  });

  it("peak current and drop give the largest ESR: 4 V / 200 A = 20 mΩ (Ohm’s law)", () => {
    expect(deriveFigures(form({ peakCurrent: "200 A", maxDrop: "4 V" })).maxEsr).toBeCloseTo(0.02, 12);
  });

  it("derives nothing from a value beyond its bound (the field says why)", () => {
    expect(deriveFigures(form({ maxVoltage: "1e17 V", sizeFor: "capacitance", capacitance: "40 F" })).storedEnergy).toBeNull();
  });

  it("derives nothing from values it cannot read", () => {
    const d = deriveFigures(form({ maxVoltage: "24 V", minVoltage: "48 V", sizeFor: "energy", energy: "20 kJ" }));
    expect(d.voltages).toBeNull();
    expect(d.capacitance).toBeNull();
    expect(deriveFigures(form({ maxVoltage: "x", energy: "y" })).usableEnergy).toBeNull();
  });
});
