import { formatQuantity } from "../quantities";
import type { Technology, Topology } from "./types";

/**
 * Temperature and expected life of a cell in service (DESIGN §3.5).
 *
 * - Self-heating: ΔT = I_rms,cell² · ESR · R_th (the cell's ESR losses through its thermal
 *   resistance to ambient); the cell runs at ambient + ΔT.
 * - Life: the rated life (at the rated temperature and rated voltage) doubles for each 10 °C the
 *   cell runs below its rated temperature and halves for each 10 °C above it — the Arrhenius
 *   "10 °C rule", common practice for capacitors.
 * - Voltage: life doubles for each step of the working voltage below the rated voltage, the step
 *   a fraction of the rated voltage set per technology in the shop's settings.
 * These are engineering estimates for comparing options; the maker's life data decides.
 */

export const HOURS_PER_YEAR = 8766; // 365.25 days

export interface LifeSettings {
  /**
   * per technology, the drop in working voltage (as a fraction of the rated voltage) that doubles
   * the expected life
   */
  voltageDoublingStep: Record<Technology, number>;
  /** expected life is not extended beyond this (years): seals and electrolyte age regardless */
  maxLifeYears: number;
}

/**
 * Defaults from common practice, recalled from memory (no maker's data behind them); every shop
 * should set its own from its suppliers' life curves.
 * - EDLC: life roughly doubles for each 0.1 V below the rating of a 2.7 V cell, about 3.7 %.
 * - hybrid (lithium-ion) capacitors: no widely quoted rule; taken at 5 % as a cautious guess.
 * - aluminium electrolytic: voltage matters much less than temperature; about 20 %.
 * - film: life ∝ (V_r/V)^n with n around 7 to 8 near the rating, about 9 % per doubling.
 * - 20 years as the ceiling: a typical calendar limit for sealed capacitors.
 */
export const DEFAULT_LIFE_SETTINGS: LifeSettings = {
  voltageDoublingStep: { edlc: 0.037, hybrid: 0.05, electrolytic: 0.2, film: 0.09 },
  maxLifeYears: 20,
};

export interface LifeCell {
  technology: Technology;
  /** rated voltage (V) */
  ratedVoltage: number;
  /** ESR used for self-heating (Ω) */
  esr: number;
  /** capacitance (F), for the figures at cold */
  capacitance?: number;
  /** life at the rated temperature and rated voltage (h) */
  ratedLifeHours: number;
  /** temperature the rated life is given at (°C); default the top of the range */
  ratedTemperature?: number;
  /** operating range (°C) */
  minTemperature?: number;
  maxTemperature: number;
  /** thermal resistance cell to ambient (K/W) */
  thermalResistance: number;
  /** capacitance and ESR at the bottom of the range, as factors of their values at 25 °C */
  coldFactors?: { capacitance?: number; esr?: number };
}

export interface LifeInput {
  cell: LifeCell;
  /** ambient temperature around the cells (°C) */
  ambientTemperature: number;
  /** working voltage across one cell (V) */
  cellVoltage: number;
  /** rms current through one cell (A); none: no self-heating */
  cellRmsCurrent?: number;
  settings?: LifeSettings;
}

export interface LifeEstimate {
  ok: boolean;
  /** why the cell cannot run there, when not ok */
  refusal: string | null;
  /** I²·ESR (W) */
  dissipation: number;
  /** ΔT (K) */
  selfHeating: number;
  /** ambient + ΔT (°C) */
  cellTemperature: number;
  /** 2^((T_rated − T_cell)/10) */
  temperatureFactor: number;
  /** 2^((V_r − V)/(step·V_r)) */
  voltageFactor: number;
  /** expected life, null when not ok (h) */
  lifeHours: number | null;
  lifeYears: number | null;
  /** the life reached the settings' ceiling */
  capped: boolean;
  /** capacitance (F) and ESR (Ω) of one cell at the bottom of its range, where the catalog gives factors */
  cold: null | { temperature: number | null; capacitance: number | null; esr: number | null };
  /** what the estimate assumes, in plain words */
  assumptions: string[];
}

function finite(x: number, what: string, min = -Infinity): void {
  if (!(Number.isFinite(x) && x >= min)) throw new RangeError(`${what} must be a number${min > -Infinity ? ` of at least ${min}` : ""}`);
}

/** Ambient temperature the estimate assumes when none is stated (°C): a room. */
export const DEFAULT_AMBIENT_TEMPERATURE = 25;

/**
 * The figures behind an estimate, numbers only (no checks, no words): self-heating, cell
 * temperature and the two factors on the rated life. Shared by estimateCellLife and the
 * search, which ranks and filters every candidate by it.
 */
export function lifeFactors(
  cell: { ratedVoltage: number; esr: number; thermalResistance: number; maxTemperature: number; ratedTemperature?: number },
  ambient: number,
  cellVoltage: number,
  cellRmsCurrent: number,
  voltageStep: number,
): { dissipation: number; selfHeating: number; cellTemperature: number; temperatureFactor: number; voltageFactor: number } {
  const ratedTemperature = cell.ratedTemperature ?? cell.maxTemperature;
  const dissipation = cellRmsCurrent * cellRmsCurrent * cell.esr;
  const selfHeating = dissipation * cell.thermalResistance;
  const cellTemperature = ambient + selfHeating;
  return {
    dissipation,
    selfHeating,
    cellTemperature,
    temperatureFactor: 2 ** ((ratedTemperature - cellTemperature) / 10),
    voltageFactor: 2 ** ((cell.ratedVoltage - cellVoltage) / (voltageStep * cell.ratedVoltage)),
  };
}

/** Expected life in hours with the settings' ceiling, numbers only: rated life × both factors. */
export function cappedLifeHours(ratedLifeHours: number, temperatureFactor: number, voltageFactor: number, settings: LifeSettings): number {
  return Math.min(ratedLifeHours * temperatureFactor * voltageFactor, settings.maxLifeYears * HOURS_PER_YEAR);
}

/**
 * Cell temperature and expected life for one cell in service. A cell that would run above its
 * maximum temperature, or sits in an ambient below its minimum, is refused (ok: false) with the
 * figures that refuse it. Throws RangeError on malformed figures.
 */
export function estimateCellLife(input: LifeInput): LifeEstimate {
  const { cell, ambientTemperature: ambient, cellVoltage } = input;
  const settings = input.settings ?? DEFAULT_LIFE_SETTINGS;
  const current = input.cellRmsCurrent ?? 0;
  finite(ambient, "ambient temperature", -273.15);
  finite(cellVoltage, "cell voltage", 0);
  finite(current, "rms current", 0);
  finite(cell.esr, "ESR", 0);
  finite(cell.thermalResistance, "thermal resistance", 0);
  finite(cell.maxTemperature, "maximum temperature", -273.15);
  if (!(cell.ratedVoltage > 0)) throw new RangeError("rated voltage must be positive");
  if (!(cell.ratedLifeHours > 0) || !Number.isFinite(cell.ratedLifeHours)) throw new RangeError("rated life must be a positive number of hours");
  const step = settings.voltageDoublingStep[cell.technology];
  if (!(step > 0) || !Number.isFinite(step)) throw new RangeError(`the voltage step per doubling for ${cell.technology} must be positive`);
  if (!(settings.maxLifeYears > 0)) throw new RangeError("the life ceiling must be positive");
  const ratedTemperature = cell.ratedTemperature ?? cell.maxTemperature;
  finite(ratedTemperature, "rated temperature", -273.15);

  const { dissipation, selfHeating, cellTemperature, temperatureFactor, voltageFactor } = lifeFactors(cell, ambient, cellVoltage, current, step);
  const f = (x: number, unit: string): string => formatQuantity(x, unit);
  const degrees = (x: number): string => `${Number(x.toFixed(1))} °C`;

  const assumptions = [
    `Self-heating ${f(current, "A")}² × ${f(cell.esr, "ohm")} × ${Number(cell.thermalResistance.toPrecision(3))} K/W = ${Number(selfHeating.toPrecision(3))} K over a ${degrees(ambient)} ambient.`,
    `Life doubles for each 10 °C below the rated ${degrees(ratedTemperature)} (common practice).`,
    `Life doubles for each ${Number((step * 100).toPrecision(3))} % of the rated voltage below it (${cell.technology}; the shop's setting).`,
    `Rated life ${Math.round(cell.ratedLifeHours)} h at ${degrees(ratedTemperature)} and ${f(cell.ratedVoltage, "V")}; an engineering estimate, the maker's life data decides.`,
  ];
  if (cellVoltage > cell.ratedVoltage) assumptions.push(`The cell works above its rated voltage (${f(cellVoltage, "V")}): its life is shortened accordingly.`);

  let cold: LifeEstimate["cold"] = null;
  if (cell.coldFactors && (cell.coldFactors.capacitance !== undefined || cell.coldFactors.esr !== undefined)) {
    const { capacitance: kc, esr: kr } = cell.coldFactors;
    if (kc !== undefined) finite(kc, "capacitance factor at cold", 0);
    if (kr !== undefined) finite(kr, "ESR factor at cold", 0);
    cold = {
      temperature: cell.minTemperature ?? null,
      capacitance: kc !== undefined && cell.capacitance !== undefined ? cell.capacitance * kc : null,
      esr: kr !== undefined ? cell.esr * kr : null,
    };
  }

  const base = { dissipation, selfHeating, cellTemperature, temperatureFactor, voltageFactor, cold, assumptions };
  if (cellTemperature > cell.maxTemperature) {
    return {
      ...base,
      ok: false,
      refusal: `The cell would run at ${degrees(cellTemperature)} (${degrees(ambient)} ambient + ${Number(selfHeating.toPrecision(3))} K self-heating), above its ${degrees(cell.maxTemperature)} maximum.`,
      lifeHours: null,
      lifeYears: null,
      capped: false,
    };
  }
  if (cell.minTemperature !== undefined && ambient < cell.minTemperature) {
    return {
      ...base,
      ok: false,
      refusal: `The ${degrees(ambient)} ambient is below the cell's ${degrees(cell.minTemperature)} minimum.`,
      lifeHours: null,
      lifeYears: null,
      capped: false,
    };
  }
  const lifeHours = cappedLifeHours(cell.ratedLifeHours, temperatureFactor, voltageFactor, settings);
  const capped = lifeHours < cell.ratedLifeHours * temperatureFactor * voltageFactor;
  if (capped) assumptions.push(`Capped at ${settings.maxLifeYears} years: beyond that, ageing of seals and electrolyte decides, not temperature or voltage.`);
  return { ...base, ok: true, refusal: null, lifeHours, lifeYears: lifeHours / HOURS_PER_YEAR, capped };
}

export interface OptionLifeInput {
  cell: LifeCell;
  topology: Topology;
  seriesCount: number;
  parallelCount: number;
  /** the bank's working voltage (V) */
  workingVoltage: number;
  ambientTemperature: number;
  /** rms current the bank carries in service (A) */
  rmsCurrent?: number;
  settings?: LifeSettings;
}

export interface OptionLifeEstimate extends LifeEstimate {
  cellVoltage: number;
  cellRmsCurrent: number;
  /** the bank's capacitance (F) and ESR (Ω) at the bottom of the range, where the catalog gives factors */
  bankCold: null | { capacitance: number | null; esr: number | null };
}

/**
 * Life of an arrangement option: each cell works at V/N_s and carries I_rms/N_p (the parallel
 * paths share the current equally in either topology).
 */
export function estimateOptionLife(input: OptionLifeInput): OptionLifeEstimate {
  const ns = input.seriesCount;
  const np = input.parallelCount;
  if (!Number.isInteger(ns) || !Number.isInteger(np) || ns < 1 || np < 1)
    throw new RangeError("series and parallel counts must be whole numbers of at least 1");
  finite(input.workingVoltage, "working voltage", 0);
  const cellVoltage = input.workingVoltage / ns;
  const cellRmsCurrent = (input.rmsCurrent ?? 0) / np;
  const estimate = estimateCellLife({
    cell: input.cell,
    ambientTemperature: input.ambientTemperature,
    cellVoltage,
    cellRmsCurrent,
    ...(input.settings ? { settings: input.settings } : {}),
  });
  estimate.assumptions.unshift(
    `Each cell works at ${formatQuantity(cellVoltage, "V")} and carries ${formatQuantity(cellRmsCurrent, "A")} rms (${input.topology === "parallel-of-series-strings" ? "strings" : "parallel cells"} share the current equally).`,
  );
  const bankCold = estimate.cold
    ? {
        capacitance: estimate.cold.capacitance === null ? null : (np * estimate.cold.capacitance) / ns,
        esr: estimate.cold.esr === null ? null : (ns * estimate.cold.esr) / np,
      }
    : null;
  return { ...estimate, cellVoltage, cellRmsCurrent, bankCold };
}
