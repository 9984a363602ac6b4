import type { ArrangementOption } from "./arrangement-search";
import { optionNetwork } from "./option-network";
import { runToleranceYield, type ToleranceResult } from "./tolerance";
import type { Requirement } from "./types";

/**
 * The tolerance yield of an arrangement option (DESIGN §3.5), computed from the option alone so
 * that the storefront (in the browser, on focus), the quote page and the quote PDF show the same
 * numbers: a fixed seed, a sample count fixed by the bank's size, and the shop's grading,
 * distribution and fade as the option carries them (`yieldBasis`).
 */

/** The seed every option's yield is drawn with. */
export const OPTION_YIELD_SEED = 2026;
/** At most this many samples × network nodes: a few tens of milliseconds in a browser. */
export const OPTION_YIELD_WORK = 2_000_000;
export const OPTION_YIELD_MAX_SAMPLES = 10_000;
export const OPTION_YIELD_MIN_SAMPLES = 100;
export const OPTION_YIELD_BINS = 30;

/** What the yield reads of an option. */
export type YieldOption = Pick<ArrangementOption, "cell" | "topology" | "seriesCount" | "parallelCount" | "yieldBasis">;

export interface OptionYield extends ToleranceResult {
  /** the capacitance a new bank needs so that it still meets the requirement after the end-of-life fade (F); null without a sizing requirement */
  requiredCapacitance: number | null;
}

/** Samples for a bank of this many cells: as many as the work budget allows, within the bounds. */
export function optionYieldSamples(option: Pick<YieldOption, "seriesCount" | "parallelCount" | "topology">): number {
  const ns = option.seriesCount;
  const np = option.parallelCount;
  const nodes = ns * np + (option.topology === "series-of-parallel-groups" ? ns : np) + 1;
  return Math.max(OPTION_YIELD_MIN_SAMPLES, Math.min(OPTION_YIELD_MAX_SAMPLES, Math.floor(OPTION_YIELD_WORK / nodes)));
}

/**
 * The capacitance a new bank must have so that it meets the requirement at end of life: the
 * larger of the stated capacitance, 2E/(V_max² − V_min²) for the usable energy and 2·P·t/(V_max² −
 * V_min²) for the backup (ESR left out), divided by (1 − f_C). Null when none is stated.
 */
export function endOfLifeCapacitanceNeed(requirement: Requirement, capacitanceFade: number): number | null {
  const vMax = requirement.maxVoltage;
  const vMin = requirement.minVoltage ?? 0;
  const dV2 = vMax * vMax - vMin * vMin;
  let need = 0;
  if (requirement.capacitance !== undefined) need = Math.max(need, requirement.capacitance);
  if (requirement.energy !== undefined && dV2 > 0) need = Math.max(need, (2 * requirement.energy) / dV2);
  if (requirement.backup && dV2 > 0) need = Math.max(need, (2 * requirement.backup.power * requirement.backup.seconds) / dV2);
  return need > 0 ? need / (1 - capacitanceFade) : null;
}

/** The seeded Monte-Carlo of the option's cells within their tolerance, charged to V_max. */
export function optionYield(option: YieldOption, requirement: Requirement): OptionYield {
  const { cell, yieldBasis: basis } = option;
  const network = optionNetwork({
    cell: {
      capacitance: cell.capacitance,
      ratedVoltage: cell.ratedVoltage,
      surgeVoltage: Math.max(cell.surgeVoltage, cell.ratedVoltage),
      toleranceMinus: cell.toleranceMinus,
      tolerancePlus: cell.tolerancePlus,
    },
    topology: option.topology,
    seriesCount: option.seriesCount,
    parallelCount: option.parallelCount,
  });
  const need = endOfLifeCapacitanceNeed(requirement, basis.capacitanceFade);
  const result = runToleranceYield({
    network,
    appliedVoltage: requirement.maxVoltage,
    samples: optionYieldSamples(option),
    seed: OPTION_YIELD_SEED,
    distribution: basis.distribution,
    matchingTolerance: basis.matchingTolerance,
    ...(need !== null ? { requirement: { capacitance: need } } : {}),
    bins: OPTION_YIELD_BINS,
  });
  return { ...result, requiredCapacitance: need };
}
