import { DEFAULT_LIFE_SETTINGS, type LifeSettings } from "./life";
import type { ToleranceDistribution } from "./tolerance";

/**
 * A shop's settings for failure, yield and life figures (DESIGN §3.5), one group apart from the
 * design factors: the voltage step per doubling of life for each technology and the life ceiling
 * (lib/bank/life.ts), the standby time hybrid cells must outlast, and how cell capacitances spread
 * within their tolerance in the yield figures.
 */
export interface ReliabilitySettings extends LifeSettings {
  /** days a switched-off bank may stand before its hybrid cells must still be above their minimum voltage */
  standbyDays: number;
  /** "uniform" over each cell's tolerance band, or "normal" with the band as ±3σ */
  yieldDistribution: ToleranceDistribution;
}

/**
 * Defaults, common practice (no maker's data behind them; see DEFAULT_LIFE_SETTINGS for the life
 * figures): a bank may stand switched off for a season, 90 days, before someone recharges it
 * (common practice for stored hybrid modules, from memory); capacitances spread evenly over the
 * graded band, the cautious choice when the supplier's distribution is unknown.
 */
export const DEFAULT_RELIABILITY_SETTINGS: ReliabilitySettings = {
  ...DEFAULT_LIFE_SETTINGS,
  standbyDays: 90,
  yieldDistribution: "uniform",
};

/** Bounds the settings may take (the settings form and its schema read them). */
export const RELIABILITY_SETTING_BOUNDS = {
  /** a step per doubling as a fraction of the rated voltage */
  voltageDoublingStep: { min: 0.005, max: 1 },
  maxLifeYears: { min: 1, max: 50 },
  standbyDays: { min: 0, max: 3650 },
} as const;
