/**
 * No requirement can stall the search: whatever numbers arrive, searchArrangements returns (options
 * or reasons) or refuses with a RangeError, and every option it returns stays within the caps.
 * Non-termination would show as this file never finishing; no assertion here is timed.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_DESIGN_FACTORS,
  MAX_CELLS_PER_BANK,
  MAX_PARALLEL_COUNT,
  MAX_SERIES_COUNT,
  searchArrangements,
  type BalancingBoard,
  type EngineCell,
  type Requirement,
} from "@/lib/bank";
import { arrangementRequestSchema } from "@/lib/validation/bank";
import { generateCatalog } from "./catalog-fixture";

const cells: EngineCell[] = generateCatalog(60, 11);
const boards: BalancingBoard[] = [
  { id: "b1", sku: "TB-BAL-27-06", channels: 6, maxCellVoltage: 2.7, unitCost: 30, leadTimeDays: 3 },
  { id: "b2", sku: "TB-BAL-38-12", channels: 12, maxCellVoltage: 3.8, unitCost: 70, leadTimeDays: 5 },
];

/** Every finite double, with the awkward ones drawn often: ±0, subnormals, 1e308, the largest double. */
const anyDouble = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.constantFrom(0, -0, Number.MIN_VALUE, 2.2e-308, 1e-300, 1e16, 2 ** 53, 3e16, 1e17, 1e200, 1e308, Number.MAX_VALUE, -1, -1e308),
);

const anyRequirement: fc.Arbitrary<Requirement> = fc
  .record(
    {
      maxVoltage: anyDouble,
      minVoltage: anyDouble,
      capacitance: anyDouble,
      energy: anyDouble,
      backup: fc.record({ power: anyDouble, seconds: anyDouble }),
      peakCurrent: fc.record({ current: anyDouble, maxDrop: anyDouble }),
      maxMass: anyDouble,
      maxVolume: anyDouble,
      quantity: anyDouble,
      technology: fc.constantFrom("edlc" as const, "hybrid" as const, "electrolytic" as const, "film" as const),
    },
    { requiredKeys: ["maxVoltage"] },
  )
  .map((r) => r as Requirement);

function searchOrRefuse(requirement: Requirement): "returned" | "refused" {
  try {
    const { options, reasons } = searchArrangements({ requirement, cells, factors: DEFAULT_DESIGN_FACTORS, balancingBoards: boards });
    expect(options.length > 0 || reasons.length > 0).toBe(true);
    for (const o of options) {
      expect(Number.isInteger(o.seriesCount) && o.seriesCount >= 1 && o.seriesCount <= MAX_SERIES_COUNT).toBe(true);
      expect(Number.isInteger(o.parallelCount) && o.parallelCount >= 1 && o.parallelCount <= MAX_PARALLEL_COUNT).toBe(true);
      expect(o.cellCount).toBe(o.seriesCount * o.parallelCount);
      expect(o.cellCount).toBeLessThanOrEqual(MAX_CELLS_PER_BANK);
    }
    return "returned";
  } catch (error) {
    expect(error).toBeInstanceOf(RangeError);
    return "refused";
  }
}

describe("the search is bounded for every input", () => {
  it("3e16 V (where ceil(V/V_r) passes 2^53 and a counting loop stops counting) answers with reasons", () => {
    const { options, reasons } = searchArrangements({
      requirement: { maxVoltage: 3e16, energy: 1 },
      cells,
      factors: DEFAULT_DESIGN_FACTORS,
      balancingBoards: boards,
    });
    expect(options).toEqual([]);
    expect(reasons.join("\n")).toMatch(/at most 5,000 cells in series/);
  });

  it("over the whole finite double range (1e308, subnormals, −0, negatives) it returns or refuses with a RangeError", () => {
    fc.assert(
      fc.property(anyRequirement, (requirement) => {
        searchOrRefuse(requirement);
      }),
      { numRuns: 2000 },
    );
  }, 120_000);

  it("never refuses a requirement the public schema accepts", () => {
    // values spread over the schema's own range, so most draws pass it
    const inRange = (max: number) => fc.oneof(fc.double({ min: Number.MIN_VALUE, max, noNaN: true }), fc.constantFrom(Number.MIN_VALUE, 1e-300, max));
    const accepted = fc
      .record(
        {
          maxVoltage: inRange(2e6),
          minVoltage: fc.oneof(fc.constant(0), inRange(2e6)),
          capacitance: inRange(1e8),
          energy: inRange(1e9),
          backup: fc.record({ power: inRange(1e9), seconds: inRange(86_400) }),
          peakCurrent: fc.record({ current: inRange(1e7), maxDrop: inRange(2e6) }),
          maxMass: inRange(1e6),
          maxVolume: inRange(1e3),
          quantity: fc.integer({ min: 1, max: 100_000 }),
        },
        { requiredKeys: ["maxVoltage"] },
      )
      .map((r) => arrangementRequestSchema.safeParse(r))
      .filter((p) => p.success)
      .map((p) => p.data as Requirement);
    fc.assert(
      fc.property(accepted, (requirement) => {
        expect(searchOrRefuse(requirement)).toBe("returned");
      }),
      { numRuns: 1000 },
    );
  }, 120_000);
});
