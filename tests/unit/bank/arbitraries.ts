/** fast-check generators shared by the engine's and the priced search's property tests. */
import fc from "fast-check";
import type { DesignFactors } from "@/lib/bank";

/** A shop's design factors, anywhere in the ranges a shop might set them. */
export const arbFactors: fc.Arbitrary<DesignFactors> = fc.record({
  capacitanceFade: fc.double({ min: 0, max: 0.3, noNaN: true }),
  esrGrowth: fc.double({ min: 0, max: 1.5, noNaN: true }),
  voltageDerating: fc.double({ min: 0.7, max: 1, noNaN: true }),
  matchingTolerance: fc.double({ min: 0, max: 0.1, noNaN: true }),
  balancingFactor: fc.double({ min: 1, max: 20, noNaN: true }),
  resistorSeries: fc.constantFrom("E12" as const, "E24" as const, "E48" as const, "E96" as const),
  safeVoltage: fc.constantFrom(30, 50, 60),
  safeTime: fc.constantFrom(1, 5, 60),
});
