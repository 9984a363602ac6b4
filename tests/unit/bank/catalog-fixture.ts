/**
 * Invented catalog data for tests and benchmarks: invented maker prefixes, invented part numbers.
 * Figures are plausible for each technology (common practice ranges), not copied from any datasheet.
 */
import type { EngineCell, Technology } from "@/lib/bank";

/** Small deterministic PRNG (mulberry32) so generated catalogs are the same on every run. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** rated life (h) at the top of the range (°C) */
const LIFE: Record<Technology, [number, number]> = { edlc: [1500, 65], hybrid: [1000, 70], electrolytic: [3000, 105], film: [100_000, 85] };

const PREFIX: Record<Technology, string> = { edlc: "QZ", hybrid: "HV", electrolytic: "EL", film: "FM" };

export function generateCatalog(count: number, seed = 1): EngineCell[] {
  const rnd = seededRandom(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)] as T;
  const cells: EngineCell[] = [];
  for (let i = 0; i < count; i++) {
    const technology = pick(["edlc", "edlc", "hybrid", "electrolytic", "film"] as const);
    let capacitance: number;
    let ratedVoltage: number;
    let esr: number;
    let leakage: number;
    let energyDensity: number; // J/kg, sets the mass
    switch (technology) {
      case "edlc":
        capacitance = pick([10, 25, 50, 100, 150, 350, 650, 1200, 3000]);
        ratedVoltage = pick([2.5, 2.7, 3.0]);
        esr = 0.6 / capacitance ** 0.9;
        leakage = capacitance * 3e-6;
        energyDensity = 15_000;
        break;
      case "hybrid":
        capacitance = pick([40, 100, 250, 500]);
        ratedVoltage = 3.8;
        esr = 0.4 / capacitance ** 0.9;
        leakage = capacitance * 1e-6;
        energyDensity = 30_000;
        break;
      case "electrolytic":
        capacitance = pick([470e-6, 1000e-6, 2200e-6, 4700e-6, 10_000e-6]);
        ratedVoltage = pick([63, 100, 250, 400, 450]);
        esr = 0.02 + 0.05 * rnd();
        leakage = 0.01 * capacitance * 1e6 * ratedVoltage * 1e-6; // 0.01·C·V (µA) rule of thumb
        energyDensity = 300;
        break;
      default:
        capacitance = pick([10e-6, 47e-6, 100e-6, 470e-6]);
        ratedVoltage = pick([450, 800, 1100]);
        esr = 0.002 + 0.003 * rnd();
        leakage = 1e-7;
        energyDensity = 100;
    }
    const energy = 0.5 * capacitance * ratedVoltage ** 2;
    const mass = Math.max(0.002, energy / energyDensity) * (0.8 + 0.4 * rnd());
    cells.push({
      id: `cell-${i}`,
      sku: `${PREFIX[technology]}-${String(i).padStart(5, "0")}`,
      technology,
      capacitance,
      toleranceMinus: pick([0, 0.1, 0.2]),
      tolerancePlus: pick([0.1, 0.2]),
      ratedVoltage,
      surgeVoltage: ratedVoltage * (technology === "film" ? 1.5 : 1.1),
      esr,
      leakageCurrent: leakage,
      continuousCurrent: technology === "edlc" || technology === "hybrid" ? capacitance * 0.2 + 5 : 5,
      peakCurrent: technology === "edlc" || technology === "hybrid" ? capacitance * 1.5 + 20 : 50,
      mass,
      volume: mass / 1500,
      unitCost: 0.5 + mass * (20 + 30 * rnd()),
      stock: Math.floor(rnd() * 2000),
      leadTimeDays: pick([7, 14, 21, 42]),
      // hybrid cells carry their minimum voltage (the usual 2.2 V, common practice)
      minVoltage: technology === "hybrid" ? 2.2 : null,
      // life data typical of the technology (common practice ranges, invented values)
      thermal: {
        ratedLifeHours: LIFE[technology][0],
        ratedTemperature: LIFE[technology][1],
        minTemperature: -25,
        maxTemperature: LIFE[technology][1],
        thermalResistance: 2 + 20 * rnd(),
        coldCapacitanceFactor: null,
        coldEsrFactor: null,
      },
    });
  }
  return cells;
}
