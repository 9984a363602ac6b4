import { describe, expect, it } from "vitest";
import type { Requirement } from "@/lib/bank";
import {
  describeRequirement,
  OUTBOX_STATUS_LABELS,
  reasonWords,
  QUOTE_STATUS_LABELS,
  REQUEST_STATUS_LABELS,
  requirementFacts,
  ROLE_LABELS,
  TECHNOLOGY_LABELS,
  TECHNOLOGY_SHORT,
  TOPOLOGY_LABELS,
} from "@/lib/vocabulary";

describe("one description of a requirement", () => {
  it.each<[string, Requirement, string]>([
    ["the storefront journey's bank", { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 }, "48 V → 24 V, 20 kJ usable, 2 banks"],
    ["a DC-link capacitance with no minimum", { maxVoltage: 800, capacitance: 4.7e-3 }, "800 V, 4.7 mF, 1 bank"],
    ["a minimum of 0 V reads as no minimum", { maxVoltage: 48, minVoltage: 0, capacitance: 58, quantity: 1 }, "48 V, 58 F, 1 bank"],
    [
      "a backup with peak current, limits and a technology",
      {
        maxVoltage: 400,
        minVoltage: 200,
        backup: { power: 5000, seconds: 30 },
        peakCurrent: { current: 200, maxDrop: 4 },
        maxMass: 25,
        maxVolume: 0.012,
        technology: "hybrid",
        quantity: 12_000,
      },
      "400 V → 200 V, 5 kW for 30 s, 200 A peak with at most 4 V drop, at most 25 kg, at most 12 L, Hybrid lithium-ion capacitor only, 12,000 banks",
    ],
  ])("%s", (_name, requirement, line) => {
    expect(describeRequirement(requirement)).toBe(line);
  });

  it("the quote's rows state the same parts as the one line", () => {
    const r: Requirement = { maxVoltage: 400, minVoltage: 200, backup: { power: 5000, seconds: 30 }, maxMass: 25, technology: "film", quantity: 3 };
    const rows = requirementFacts(r);
    expect(rows.map((x) => x.label)).toEqual(["Maximum voltage", "Minimum voltage", "Backup", "Mass limit", "Technology", "Quantity"]);
    const line = describeRequirement(r);
    for (const row of rows) expect(line, row.label).toContain(row.value);
  });
});

describe("labels", () => {
  // Two labels that read the same would make two different things look alike on screen.
  it.each([
    ["technologies", TECHNOLOGY_LABELS],
    ["technologies (short)", TECHNOLOGY_SHORT],
    ["topologies", TOPOLOGY_LABELS],
    ["roles", ROLE_LABELS],
    ["quote statuses", QUOTE_STATUS_LABELS],
    ["request statuses", REQUEST_STATUS_LABELS],
    ["outbox statuses", OUTBOX_STATUS_LABELS],
  ])("%s are distinct", (_name, labels) => {
    const values = Object.values(labels as Record<string, string>);
    expect(new Set(values.map((v) => v.toLowerCase())).size).toBe(values.length);
  });
});

describe("reasonWords", () => {
  it.each([
    ["edlc: no cell reaches 2 MJ usable within 20000 cells", "Supercapacitor (EDLC): no cell reaches 2 MJ usable within 20,000 cells"],
    ["hybrid: no hybrid cells in the catalog", `${TECHNOLOGY_LABELS.hybrid}: no hybrid cells in the catalog`],
    // decimals, short numbers and numbers inside other figures stay as they are
    ["film: even one string of 120 cells in series is beyond 12.5 kg", `${TECHNOLOGY_LABELS.film}: even one string of 120 cells in series is beyond 12.5 kg`],
    ["Stored energy 600000.5 J", "Stored energy 600000.5 J"],
    ["not a technology: 123456", "not a technology: 123,456"],
  ])("%s", (raw, words) => {
    expect(reasonWords(raw)).toBe(words);
  });
});
