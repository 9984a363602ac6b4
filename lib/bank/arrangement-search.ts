import { formatDuration, formatQuantity } from "../quantities";
import { sizeBalancing, sizeBleeder, type BalancingResult, type BleederResult } from "./balancing";
import { MAX_CELLS_PER_BANK, MAX_LONGER_STRINGS, MAX_PARALLEL_COUNT, MAX_SERIES_COUNT } from "./bounds";
import { constantPowerSeconds } from "./discharge";
import { storedEnergy as storedEnergyOf, usableEnergy as usableEnergyOf } from "./energy";
import { analyzeOptionFailures, optionFailureCases, survivesFault, type FailureModeSummary, type OptionFailureCase, type OptionFailureInput } from "./failures";
import { checkStandby, shippingNotes, standingHeat, standingHeatWarning, technologyCautions, type StandbyCheck, type StandingHeat } from "./handling";
import { cappedLifeHours, DEFAULT_AMBIENT_TEMPERATURE, estimateOptionLife, HOURS_PER_YEAR, lifeFactors, type LifeCell } from "./life";
import { DEFAULT_RELIABILITY_SETTINGS, type ReliabilitySettings } from "./reliability-settings";
import type { ToleranceDistribution } from "./tolerance";
import {
  TECHNOLOGIES,
  type BalancingBoard,
  type DesignFactors,
  type EngineCell,
  type FaultFilter,
  type Requirement,
  type Technology,
  type Topology,
} from "./types";

/** Stored energy above which the burn and arc caution is shown (common practice: 10 J, from memory). */
export const HIGH_ENERGY_CAUTION_J = 10;

/** Lead time above which an option carries a warning (common practice for a quoting shop). */
export const LONG_LEAD_TIME_DAYS = 28;

/** The cell's figures an option carries (and a quote freezes). */
export type ArrangementCellFigures = Pick<
  EngineCell,
  | "sku"
  | "technology"
  | "capacitance"
  | "toleranceMinus"
  | "tolerancePlus"
  | "ratedVoltage"
  | "surgeVoltage"
  | "esr"
  | "leakageCurrent"
  | "peakCurrent"
  | "mass"
  | "volume"
> & {
  /** the cell's minimum voltage (V), null when it may go to 0 V */
  minVoltage: number | null;
};

/** What one failed cell of a kind does to an option (analyzeOptionFailures, at V_max, matched cells at their worst). */
export interface OptionFailureVerdict {
  /** every single fault of this kind leaves the bank working, every remaining cell within surge */
  survives: boolean;
  /** … and every remaining cell within its rating */
  withinRating: boolean;
  /** the fault shorts the whole bank */
  shortCircuit: boolean;
  /** capacitance after the fault (F), null on a short circuit */
  capacitance: number | null;
  /** the highest voltage on a remaining cell (V) */
  maxCellVoltage: number;
  /** "Survives one shorted cell: no — the other cells of that string reach 3.1 V, surge 2.85 V." */
  text: string;
}

/** Temperature and expected life of an option's cells in service (lib/bank/life.ts). */
export interface OptionLife {
  /** the ambient the estimate is for (°C) */
  ambientTemperature: number;
  /** no ambient was stated: DEFAULT_AMBIENT_TEMPERATURE is assumed */
  ambientAssumed: boolean;
  /** each cell's working voltage V_max/N_s (V) and rms current I_rms/N_p (A) */
  cellVoltage: number;
  cellRmsCurrent: number;
  /** I²·ESR per cell (W) and the self-heating ΔT it causes (K) */
  dissipation: number;
  selfHeating: number;
  cellTemperature: number;
  /** the top of the cell's range (°C) */
  maxTemperature: number;
  temperatureFactor: number;
  voltageFactor: number;
  lifeHours: number | null;
  lifeYears: number | null;
  /** the life reached the shop's ceiling */
  capped: boolean;
  /** why the cell cannot run there; null when it can */
  refusal: string | null;
  /** the bank at the bottom of the cell's range, where the catalog gives cold factors */
  cold: null | { temperature: number | null; capacitance: number | null; esr: number | null };
  assumptions: string[];
}

/** Each technology's limits and handling for an option (lib/bank/handling.ts). */
export interface OptionHandling {
  /** the cell's minimum voltage (V), null when it may go to 0 V */
  minCellVoltage: number | null;
  /** N_s × that minimum: the bank must never be taken below it (V) */
  floorVoltage: number | null;
  /** standby drain through the balancing resistors, for cells with a minimum voltage */
  standby: StandbyCheck | null;
  /** heat of the balancing resistors (and a continuous bleeder) in the enclosure */
  standingHeat: StandingHeat;
  /** transport classification and how to ship */
  shipping: string[];
}

/** What an option's tolerance yield is computed from (lib/bank/option-yield.ts), so a frozen option reproduces it. */
export interface YieldBasis {
  /** the shop's grading m: each cell's tolerance band clipped to ±m */
  matchingTolerance: number;
  distribution: ToleranceDistribution;
  /** end-of-life capacitance fade f_C: the requirement is checked at end of life */
  capacitanceFade: number;
}

export interface ArrangementOption {
  cell: ArrangementCellFigures;
  cellId: string;
  topology: Topology;
  seriesCount: number;
  parallelCount: number;
  cellCount: number;
  /** N_s is one more than the shortest safe string (DESIGN §3.2): cells run further below their rating */
  longerLife: boolean;
  /** nominal: N_p·C_n/N_s; design: with lower tolerance and end-of-life fade */
  capacitance: { nominal: number; design: number };
  /** N_s·V_r: the bank's rating with matched cells */
  maxVoltage: number;
  /** ½·C_nominal·V_max² (J) */
  storedEnergy: number;
  /** ½·C_design·(V_max² − V_min²) (J): guaranteed at end of life */
  usableEnergy: number;
  esr: { new: number; endOfLife: number };
  /** voltage drop at the peak current with end-of-life ESR (V), null without a peak-current requirement */
  peakDrop: number | null;
  mass: number;
  volume: number;
  /** worst-case transient cell voltage while charging with matched cells (V) */
  worstCellVoltage: number;
  /** passive balancing resistors as sizeBalancing gives them, and the active boards fitted, if any */
  balancing: Omit<BalancingResult, "chainResistance"> & { activeBoard: null | { sku: string; count: number } };
  /**
   * Self-discharge after switch-off, through the balancing chain and the bleeder. Worst case: the
   * bank's capacitance at the upper tolerance (the safe side: a larger C takes longer to fall to
   * V_safe). The discharge chart draws V(t) = V_max·e^(−t/(R·C)) with these same R and C, so it
   * crosses V_safe at secondsToSafe.
   */
  discharge: {
    /** time from V_max to V_safe (s); 0 when the bank works at or below V_safe */
    secondsToSafe: number;
    /** N_p·C_n·(1 + b)/N_s: the capacitance the time is computed with (F) */
    capacitance: number;
    /** the balancing resistors seen across the terminals (Ω); null without balancing resistors */
    chainResistance: number | null;
    /** chain and bleeder in parallel: what the bank discharges through (Ω); null when neither is fitted */
    resistance: number | null;
    bleeder: BleederResult["bleeder"];
  };
  /** constant-power backup time with design capacitance and end-of-life ESR (s) */
  backupSeconds?: number;
  /**
   * cells·unitCost + boards·unitCost + the caller's cost model, per bank, in float: the order the
   * search returns options in. The caller prices exactly; with a cost model that keeps this a lower
   * bound of the exact cost (lib/quoting/bill.ts), it can stop pricing once no cheaper option can follow.
   */
  costEstimate: number;
  leadTimeDays: number;
  warnings: string[];
  cautions: string[];
  /** one shorted cell and one open cell, at V_max (DESIGN §3.5) */
  failures: { short: OptionFailureVerdict; open: OptionFailureVerdict };
  /** temperature and expected life; null when the catalog gives no life data for the cell */
  life: OptionLife | null;
  handling: OptionHandling;
  yieldBasis: YieldBasis;
}

/**
 * Float costs the search adds to the parts it counts, in the shop's currency. Materials (the cells'
 * and boards' unit costs and the per-cell, per-bank and per-resistor material costs) are multiplied
 * by `materialsFactor` (1 + overhead); labour is added as it is.
 */
export interface CostModel {
  /** material cost per cell besides its unit cost (interconnects) */
  perCell: number;
  /** material cost per bank (terminals) */
  perBank: number;
  perBalancingResistor: number;
  /** added to each active board's unit cost */
  perBalancingBoard?: number;
  /** default 1 */
  materialsFactor?: number;
  /** labour per cell (assembly) */
  labourPerCell?: number;
  /** labour per bank (setup, test) */
  labourPerBank?: number;
}

export interface ArrangementSearchInput {
  requirement: Requirement;
  cells: EngineCell[];
  factors: DesignFactors;
  balancingBoards?: BalancingBoard[];
  /** default 12 */
  limit?: number;
  /**
   * Float costs added per cell (interconnect, assembly labour), per bank (setup, test, terminals),
   * per balancing resistor and per active board, with overhead on materials, so that the order
   * follows the shop's price closely; exact money stays with the caller.
   */
  costModel?: CostModel;
  /**
   * How many strings longer than the shortest safe one to consider besides it: default 1 (the
   * longer-life variant, DESIGN §3.2); an estimator may allow more, up to MAX_LONGER_STRINGS.
   */
  longerStrings?: number;
  /** the shop's failure, yield and life settings (default DEFAULT_RELIABILITY_SETTINGS) */
  reliability?: ReliabilitySettings;
}

export interface ArrangementSearchResult {
  options: ArrangementOption[];
  /** when no option fits: one line per technology family saying what ruled it out */
  reasons: string[];
}

const TOPO_STRINGS = 1; // index in TOPOLOGIES (0 is series-of-parallel-groups)
const TOPOLOGIES: readonly Topology[] = ["series-of-parallel-groups", "parallel-of-series-strings"];

/** what set N_p; 'string': even one string is beyond the mass, volume or cell-count limit */
type Driver = "capacitance" | "energy" | "backup" | "esr" | "peak" | "rms" | "thermal" | "string" | "none";
type Limit = "mass" | "volume" | "count";

interface TechnologyTally {
  cells: number;
  invalid: number;
  /** cells whose shortest safe string is longer than MAX_SERIES_COUNT */
  seriesBound: number;
  /** nearest sizing miss: ratio of needed to allowed (> 1) */
  missRatio: number;
  missDriver: Driver;
  missLimit: Limit;
  /** N_s of the nearest miss */
  missSeries: number;
  /** cells whose range excludes the ambient: [too hot, too cold] */
  tooHot: number;
  tooCold: number;
  /** the shortest string whose cells would sit below their minimum voltage at V_min (0: none met) */
  floorSeries: number;
  floorCellMin: number;
  /** candidates the customer's filters set aside: not surviving the fault, too short a life */
  faultFiltered: number;
  lifeFiltered: number;
  /** the longest life among the candidates set aside for it (years) */
  bestFilteredLife: number;
}

function isPositive(x: number): boolean {
  return x > 0 && Number.isFinite(x);
}

function isNonNegative(x: number): boolean {
  return x >= 0 && Number.isFinite(x);
}

function validCell(c: EngineCell): boolean {
  const min = c.minVoltage ?? 0;
  // a hybrid cell must say how low it may go (its minimum is what keeps it whole)
  if (c.technology === "hybrid" ? !(isPositive(min) && min < c.ratedVoltage) : !(isNonNegative(min) && min < c.ratedVoltage)) return false;
  return (
    isPositive(c.capacitance) &&
    isPositive(c.ratedVoltage) &&
    isNonNegative(c.toleranceMinus) &&
    c.toleranceMinus < 1 &&
    isNonNegative(c.tolerancePlus) &&
    isNonNegative(c.esr) &&
    isNonNegative(c.leakageCurrent) &&
    isNonNegative(c.mass) &&
    isNonNegative(c.volume) &&
    isNonNegative(c.unitCost) &&
    Number.isFinite(c.surgeVoltage) &&
    Number.isFinite(c.peakCurrent)
  );
}

/** ceil that forgives floating-point noise just above an integer (48/2.4 = 20.000000000000004). */
function ceilSafe(x: number): number {
  return Math.ceil(x - 1e-9 * Math.max(1, Math.abs(x)));
}

function floorSafe(x: number): number {
  return Math.floor(x + 1e-9 * Math.max(1, Math.abs(x)));
}

/**
 * Worst-case transient voltage of one cell while a string of N_s matched cells charges to V_max
 * (DESIGN §3.2): the weakest cell (C_lo = C_n(1 − m)) among N_s − 1 strong ones (C_hi = C_n(1 + m)),
 * V_w = V_max·(1/C_lo) / (1/C_lo + (N_s − 1)/C_hi) = V_max / (1 + (N_s − 1)·C_lo/C_hi).
 */
export function worstCaseCellVoltage(maxVoltage: number, seriesCount: number, matchingTolerance: number): number {
  const m = matchingTolerance;
  return maxVoltage / (1 + (seriesCount - 1) * ((1 - m) / (1 + m)));
}

const NUMBER_FIELDS = ["maxVoltage", "minVoltage", "capacitance", "energy", "maxMass", "maxVolume", "quantity", "rmsCurrent", "minLifeYears"] as const;

/** Refuses (RangeError) a requirement or design factors no search can mean; bounds are the schemas' job. */
function checkInputs(req: Requirement, f: DesignFactors): void {
  const bad = (what: string): never => {
    throw new RangeError(`${what} must be a finite number in range`);
  };
  for (const key of NUMBER_FIELDS) {
    const v = req[key];
    if (v !== undefined && !(Number.isFinite(v) && v >= 0)) bad(key);
  }
  for (const [what, v] of [
    ["backup.power", req.backup?.power],
    ["backup.seconds", req.backup?.seconds],
    ["peakCurrent.current", req.peakCurrent?.current],
    ["peakCurrent.maxDrop", req.peakCurrent?.maxDrop],
  ] as const) {
    if (v !== undefined && !(Number.isFinite(v) && v >= 0)) bad(what);
  }
  if (req.ambientTemperature !== undefined && !(Number.isFinite(req.ambientTemperature) && req.ambientTemperature >= -273.15)) bad("ambientTemperature");
  if (!(req.maxVoltage > 0)) bad("maxVoltage");
  const vMin = req.minVoltage ?? 0;
  if (!(vMin < req.maxVoltage)) throw new RangeError("minVoltage must be at least 0 and below maxVoltage");
  if (!(f.capacitanceFade >= 0 && f.capacitanceFade < 1)) bad("capacitanceFade");
  if (!(f.esrGrowth >= 0 && Number.isFinite(f.esrGrowth))) bad("esrGrowth");
  if (!(f.voltageDerating > 0 && f.voltageDerating <= 1)) bad("voltageDerating");
  if (!(f.matchingTolerance >= 0 && f.matchingTolerance < 1)) bad("matchingTolerance");
  if (!(f.balancingFactor > 0 && Number.isFinite(f.balancingFactor))) bad("balancingFactor");
  if (!(f.safeVoltage > 0 && Number.isFinite(f.safeVoltage))) bad("safeVoltage");
  if (!(f.safeTime > 0 && Number.isFinite(f.safeTime))) bad("safeTime");
}

/** stringBalancing's answer when a string of that length cannot be kept within its ratings */
const DOES_NOT_FIT = -2;
/** stringBalancing's answer when passive balancing resistors suffice */
const PASSIVE = -1;

/**
 * How a string of N_s cells is kept within its ratings while charging (DESIGN §3.2): PASSIVE when
 * the worst case V_w is within the rating, else the index of the cheapest active board that clamps
 * each cell at or below the rating (and not below V_max/N_s), else DOES_NOT_FIT (above the surge
 * rating, or no such board).
 */
function stringBalancing(vMax: number, ns: number, m: number, ratedVoltage: number, surgeVoltage: number, boards: readonly BalancingBoard[]): number {
  const vw = worstCaseCellVoltage(vMax, ns, m);
  if (vw > surgeVoltage * (1 + 1e-12)) return DOES_NOT_FIT;
  if (vw <= ratedVoltage * (1 + 1e-12)) return PASSIVE;
  const vCell = vMax / ns;
  let board = DOES_NOT_FIT;
  let bestCost = Infinity;
  for (let b = 0; b < boards.length; b++) {
    const bd = boards[b] as BalancingBoard;
    if (!(bd.channels >= 1) || bd.maxCellVoltage > ratedVoltage || bd.maxCellVoltage < vCell) continue;
    const cost = boardsPerString(ns, bd) * bd.unitCost;
    if (cost < bestCost) {
      bestCost = cost;
      board = b;
    }
  }
  return board;
}

/** Boards one string of N_s cells needs: one channel per series position. */
function boardsPerString(ns: number, board: BalancingBoard): number {
  return Math.ceil(ns / Math.floor(board.channels));
}

/** The least whole N_p a lower bound allows; a bound that is not a finite number (a 100 % fade, an underflow) is out of reach. */
function countAtLeast(bound: number): number {
  return bound <= 1 ? 1 : Number.isFinite(bound) ? ceilSafe(bound) : Infinity;
}

/**
 * Requirement → buildable arrangements (DESIGN §3.2): the best `limit` in the order of their float
 * cost estimate (then mass, volume, lead time, part number, N_s, topology). This order is a
 * pre-cut, not the ranking customers see: lib/quoting prices the options exactly, widening the
 * cut until no option beyond it can enter the best dozen (lib/quoting/priced-search.ts), ranks
 * them by exact price and marks the Pareto set over price, mass and volume.
 *
 * Every loop is bounded by construction: the series count is checked against MAX_SERIES_COUNT
 * before any string is tried, and the shortest safe string is found by the closed form of V_w
 * solved for N_s (at most a few steps of correction), so no requested value, however large, makes
 * the search run long. Throws RangeError for values no requirement can mean (NaN, negative).
 */
export function searchArrangements(input: ArrangementSearchInput): ArrangementSearchResult {
  const { requirement: req, cells, factors } = input;
  checkInputs(req, factors);
  const boards = input.balancingBoards ?? [];
  const limitIn = input.limit ?? 12;
  const limit = Number.isNaN(limitIn) ? 0 : Math.max(0, Math.floor(limitIn));
  const perCellCost = input.costModel?.perCell ?? 0;
  const perBankCost = input.costModel?.perBank ?? 0;
  const perResistorCost = input.costModel?.perBalancingResistor ?? 0;
  const perBoardCost = input.costModel?.perBalancingBoard ?? 0;
  const materialsFactor = input.costModel?.materialsFactor ?? 1;
  const labourPerCell = input.costModel?.labourPerCell ?? 0;
  const labourPerBank = input.costModel?.labourPerBank ?? 0;
  const longerIn = input.longerStrings ?? 1;
  const longer = Number.isFinite(longerIn) ? Math.min(MAX_LONGER_STRINGS, Math.max(0, Math.floor(longerIn))) : 1;

  const vMax = req.maxVoltage;
  const vMin = req.minVoltage ?? 0;
  const dV2 = vMax * vMax - vMin * vMin;
  const quantity = Math.max(1, Math.floor(req.quantity ?? 1));
  const cReq = req.capacitance ?? 0;
  const eReq = req.energy ?? 0;
  const backupPower = req.backup?.power ?? 0;
  const backupSeconds = req.backup?.seconds ?? 0;
  const hasBackup = backupPower > 0 && backupSeconds > 0;
  const peakI = req.peakCurrent?.current ?? 0;
  const maxDrop = req.peakCurrent?.maxDrop ?? Infinity;
  const maxMass = req.maxMass ?? Infinity;
  const maxVolume = req.maxVolume ?? Infinity;
  const m = factors.matchingTolerance;
  const matchRatio = (1 - m) / (1 + m);
  const derating = factors.voltageDerating;
  const fade = factors.capacitanceFade;
  const growth = factors.esrGrowth;
  const reliability = input.reliability ?? DEFAULT_RELIABILITY_SETTINGS;
  const ambientStated = req.ambientTemperature !== undefined;
  const ambient = req.ambientTemperature ?? DEFAULT_AMBIENT_TEMPERATURE;
  const rms = req.rmsCurrent ?? 0;
  const survives: FaultFilter | null = req.survives ?? null;
  const minLifeHours = req.minLifeYears !== undefined && req.minLifeYears > 0 ? req.minLifeYears * HOURS_PER_YEAR : 0;
  const byLife = req.rankBy === "life";
  // Survival of one fault depends only on the topology, the counts and the cell's two voltage
  // ratings: cells that share them share the answer (most of a catalog does).
  const survival = new Map<string, boolean>();
  const survivalOf = (cell: EngineCell, t: number, ns: number, np: number): boolean => {
    const key = `${t}|${ns}|${np}|${cell.ratedVoltage}|${cell.surgeVoltage}`;
    let ok = survival.get(key);
    if (ok === undefined) {
      ok = survivesFaults(survives ?? "both", cell, TOPOLOGIES[t] as Topology, ns, np, vMax, m);
      survival.set(key, ok);
    }
    return ok;
  };

  // the caps, read once (module bindings are getters in some bundles)
  const maxSeries = MAX_SERIES_COUNT;
  const maxParallel = MAX_PARALLEL_COUNT;
  const maxCells = MAX_CELLS_PER_BANK;

  const tallies = new Map<Technology, TechnologyTally>();
  for (const t of TECHNOLOGIES) {
    tallies.set(t, {
      cells: 0,
      invalid: 0,
      seriesBound: 0,
      missRatio: Infinity,
      missDriver: "none",
      missLimit: "count",
      missSeries: 0,
      tooHot: 0,
      tooCold: 0,
      floorSeries: 0,
      floorCellMin: 0,
      faultFiltered: 0,
      lifeFiltered: 0,
      bestFilteredLife: 0,
    });
  }

  // Candidate store: one row per (cell, N_s, topology), structure of arrays, no per-candidate objects.
  const capacity = cells.length * 2 * (longer + 1) + 4;
  const cCell = new Int32Array(capacity);
  const cNs = new Int32Array(capacity);
  const cNp = new Int32Array(capacity);
  const cTopo = new Uint8Array(capacity);
  const cLonger = new Uint8Array(capacity);
  const cBoard = new Int32Array(capacity);
  const cBoardCount = new Int32Array(capacity);
  const cCost = new Float64Array(capacity);
  const cMass = new Float64Array(capacity);
  const cVolume = new Float64Array(capacity);
  const cLead = new Float64Array(capacity);
  /** expected life (h) for ranking by life; −1 when the catalog gives no life data */
  const cLife = new Float64Array(capacity);
  let count = 0;

  for (let ci = 0; ci < cells.length; ci++) {
    const cell = cells[ci] as EngineCell;
    if (req.technology !== undefined && cell.technology !== req.technology) continue;
    const tally = tallies.get(cell.technology);
    if (!tally) continue;
    tally.cells++;
    if (!validCell(cell)) {
      tally.invalid++;
      continue;
    }
    const cn = cell.capacitance;
    const vr = cell.ratedVoltage;
    const surge = Math.max(cell.surgeVoltage, vr);
    const cd = cn * (1 - cell.toleranceMinus) * (1 - fade);
    const esrEol = cell.esr * (1 + growth);
    const cellMin = cell.minVoltage ?? 0;
    const life = lifeCellOf(cell);
    const thermal = cell.thermal ?? null;
    const maxT = thermal?.maxTemperature ?? null;
    const minT = thermal?.minTemperature ?? null;

    // The cell's temperature range must hold the stated ambient (DESIGN §3.5).
    if (ambientStated && maxT !== null && ambient > maxT) {
      tally.tooHot++;
      continue;
    }
    if (ambientStated && minT !== null && ambient < minT) {
      tally.tooCold++;
      continue;
    }
    // A cell with a minimum voltage (hybrid) must stay above it at V_min: N_s ≤ V_min / V_cell,min.
    const nsFloor = cellMin > 0 ? floorSafe(vMin / cellMin) : Infinity;

    // The fewest cells the voltage needs, checked as an integer before any string is tried.
    const nsVoltage = Math.max(1, ceilSafe(vMax / (derating * vr)));
    if (!(nsVoltage <= maxSeries)) {
      tally.seriesBound++;
      continue;
    }

    // The shortest safe string (DESIGN §3.2): from the voltage's count upward to the first whose
    // worst case is within the surge rating (within the rating where only passive balancing is
    // fitted). V_w ≤ L ⇔ N_s ≥ 1 + (V_max/L − 1)·C_hi/C_lo, so the count comes from the closed
    // form; the few steps after it only absorb rounding.
    const nsSurge = Math.max(nsVoltage, ceilSafe(1 + (vMax / surge - 1) / matchRatio));
    const nsRated = Math.max(nsVoltage, ceilSafe(1 + (vMax / vr - 1) / matchRatio));
    let nsBoard = Infinity;
    for (let b = 0; b < boards.length; b++) {
      const bd = boards[b] as BalancingBoard;
      if (bd.channels >= 1 && bd.maxCellVoltage > 0 && bd.maxCellVoltage <= vr) nsBoard = Math.min(nsBoard, ceilSafe(vMax / bd.maxCellVoltage));
    }
    let nsSafe = Math.min(nsRated, Math.max(nsSurge, nsBoard));
    if (!(nsSafe <= maxSeries + 1)) {
      tally.seriesBound++;
      continue;
    }
    for (let k = 0; k < 2 && nsSafe - 1 >= nsVoltage && stringBalancing(vMax, nsSafe - 1, m, vr, surge, boards) !== DOES_NOT_FIT; k++) nsSafe--;
    for (let k = 0; k < 3 && stringBalancing(vMax, nsSafe, m, vr, surge, boards) === DOES_NOT_FIT; k++) nsSafe++;
    if (nsSafe > maxSeries || stringBalancing(vMax, nsSafe, m, vr, surge, boards) === DOES_NOT_FIT) {
      tally.seriesBound++;
      continue;
    }

    // the shortest safe string, then `longer` more (by default one: the longer-life variant)
    for (let ns = nsSafe; ns <= nsSafe + longer && ns <= maxSeries; ns++) {
      if (ns > nsFloor) {
        if (tally.floorSeries === 0 || ns < tally.floorSeries) {
          tally.floorSeries = ns;
          tally.floorCellMin = cellMin;
        }
        continue;
      }
      const board = stringBalancing(vMax, ns, m, vr, surge, boards);
      if (board === DOES_NOT_FIT) continue;
      const perString = board >= 0 ? boardsPerString(ns, boards[board] as BalancingBoard) : 0;

      // Lower bounds on N_p from closed forms; the largest one names the driving requirement.
      let npNeed = 1;
      let driver: Driver = "none";
      let n = 1;
      if (cReq > 0 && (n = countAtLeast((cReq * ns) / cd)) > npNeed) [npNeed, driver] = [n, "capacitance"];
      if (eReq > 0 && (n = countAtLeast((2 * eReq * ns) / (cd * dV2))) > npNeed) [npNeed, driver] = [n, "energy"];
      // without ESR the constant-power backup lasts C·(V_max² − V_min²)/(2P): a lower bound
      if (hasBackup && (n = countAtLeast((2 * backupPower * backupSeconds * ns) / (cd * dV2))) > npNeed) [npNeed, driver] = [n, "backup"];
      if (peakI > 0) {
        if ((n = countAtLeast((esrEol * ns * peakI) / maxDrop)) > npNeed) [npNeed, driver] = [n, "esr"];
        if ((n = countAtLeast(cell.peakCurrent > 0 ? peakI / cell.peakCurrent : Infinity)) > npNeed) [npNeed, driver] = [n, "peak"];
      }
      if (rms > 0) {
        // each parallel path carries I_rms/N_p: within the continuous rating, and self-heating
        // (I_rms/N_p)²·ESR·R_th within the headroom from the ambient to the top of the range
        if (cell.continuousCurrent > 0 && (n = countAtLeast(rms / cell.continuousCurrent)) > npNeed) [npNeed, driver] = [n, "rms"];
        const rth = thermal?.thermalResistance ?? null;
        if (maxT !== null && rth !== null && rth > 0) {
          const headroom = maxT - ambient;
          if ((n = headroom > 0 ? countAtLeast(rms * Math.sqrt((cell.esr * rth) / headroom)) : Infinity) > npNeed) [npNeed, driver] = [n, "thermal"];
        }
      }

      // Upper bounds on N_p from the mass, volume and cell-count limits.
      let npMax = Math.min(maxParallel, floorSafe(maxCells / ns));
      let limitBy: Limit = "count";
      if (Number.isFinite(maxMass) && cell.mass > 0) {
        const n = floorSafe(maxMass / (ns * cell.mass));
        if (n < npMax) {
          npMax = n;
          limitBy = "mass";
        }
      }
      if (Number.isFinite(maxVolume) && cell.volume > 0) {
        const n = floorSafe(maxVolume / (ns * cell.volume));
        if (n < npMax) {
          npMax = n;
          limitBy = "volume";
        }
      }

      if (!(npNeed <= npMax)) {
        const ratio = npMax > 0 ? npNeed / npMax : Infinity;
        if (ratio < tally.missRatio || tally.missDriver === "none") {
          tally.missRatio = ratio;
          tally.missDriver = driver === "none" ? "string" : driver;
          tally.missLimit = limitBy;
          tally.missSeries = ns;
        }
        continue;
      }

      let np = npNeed;
      if (hasBackup) {
        // With ESR the backup is shorter; the time rises with N_p: exponential then binary search,
        // both within [N_p, npMax] (at most 2·log2(MAX_PARALLEL_COUNT) steps).
        const lasts = (n: number): number => constantPowerSeconds((n * cd) / ns, (esrEol * ns) / n, vMax, backupPower, vMin);
        if (lasts(np) < backupSeconds) {
          let lo = np; // fails
          let step = 1;
          let hi = -1;
          while (lo < npMax) {
            const next = Math.min(lo + step, npMax);
            if (lasts(next) >= backupSeconds) {
              hi = next;
              break;
            }
            lo = next;
            step *= 2;
          }
          if (hi < 0) {
            const ratio = 1 + (backupSeconds - lasts(npMax)) / backupSeconds;
            if (ratio < tally.missRatio || tally.missDriver === "none") {
              tally.missRatio = ratio;
              tally.missDriver = "backup";
              tally.missLimit = limitBy;
              tally.missSeries = ns;
            }
            continue;
          }
          while (hi - lo > 1) {
            const mid = (lo + hi) >>> 1;
            if (lasts(mid) >= backupSeconds) hi = mid;
            else lo = mid;
          }
          np = hi;
        }
      }

      // expected life, for the customer's filter and ranking (numbers only: O(1) per candidate)
      let lifeHours = -1;
      if ((minLifeHours > 0 || byLife) && life) {
        const f = lifeFactors(life, ambient, vMax / ns, rms / np, reliability.voltageDoublingStep[cell.technology]);
        lifeHours = cappedLifeHours(life.ratedLifeHours, f.temperatureFactor, f.voltageFactor, reliability);
      }
      if (minLifeHours > 0 && lifeHours < minLifeHours * (1 - 1e-12)) {
        tally.lifeFiltered++;
        if (lifeHours > 0) tally.bestFilteredLife = Math.max(tally.bestFilteredLife, lifeHours / HOURS_PER_YEAR);
        continue;
      }

      const cellCount = ns * np;
      const cellCost = cellCount * cell.unitCost;
      const mass = cellCount * cell.mass;
      const volume = cellCount * cell.volume;
      const cellLead = cell.stock >= cellCount * quantity ? 0 : cell.leadTimeDays;
      const bd = board >= 0 ? (boards[board] as BalancingBoard) : null;
      const lead = bd ? Math.max(cellLead, bd.leadTimeDays) : cellLead;
      // one topology when both are the same circuit (a single string or a single group)
      const topologies = ns === 1 || np === 1 ? 1 : 2;
      for (let t = 0; t < topologies; t++) {
        if (survives !== null && !survivalOf(cell, t, ns, np)) {
          tally.faultFiltered++;
          continue;
        }
        const boardCount = bd ? (t === TOPO_STRINGS ? perString * np : perString) : 0;
        cCell[count] = ci;
        cNs[count] = ns;
        cNp[count] = np;
        cTopo[count] = t;
        cLonger[count] = ns > nsSafe ? 1 : 0;
        cBoard[count] = board;
        cBoardCount[count] = boardCount;
        // the balancing resistors sizeBalancing fits: none for a single series position
        const resistors = bd || ns <= 1 ? 0 : t === TOPO_STRINGS ? cellCount : ns;
        const materials = cellCost + (bd ? boardCount * (bd.unitCost + perBoardCost) : 0) + cellCount * perCellCost + perBankCost + resistors * perResistorCost;
        cCost[count] = materials * materialsFactor + cellCount * labourPerCell + labourPerBank;
        cMass[count] = mass;
        cVolume[count] = volume;
        cLead[count] = lead;
        cLife[count] = lifeHours;
        count++;
      }
    }
  }

  // Best `limit` by (cost, mass, volume, lead time, sku, N_s, topology): a small sorted selection,
  // or one sort when most candidates are wanted.
  const compare = (a: number, b: number): number => {
    const d =
      (byLife ? (cLife[b] as number) - (cLife[a] as number) : 0) ||
      (cCost[a] as number) - (cCost[b] as number) ||
      (cMass[a] as number) - (cMass[b] as number) ||
      (cVolume[a] as number) - (cVolume[b] as number) ||
      (cLead[a] as number) - (cLead[b] as number);
    if (d !== 0) return d;
    const skuA = (cells[cCell[a] as number] as EngineCell).sku;
    const skuB = (cells[cCell[b] as number] as EngineCell).sku;
    if (skuA !== skuB) return skuA < skuB ? -1 : 1;
    return (cNs[a] as number) - (cNs[b] as number) || (cTopo[a] as number) - (cTopo[b] as number) || a - b;
  };
  let best: number[] = [];
  if (limit >= count / 8) {
    best = Array.from({ length: count }, (_, i) => i).sort(compare);
    if (best.length > limit) best.length = limit;
  } else {
    for (let i = 0; i < count; i++) {
      if (best.length === limit && compare(i, best[limit - 1] as number) >= 0) continue;
      let pos = best.length;
      while (pos > 0 && compare(i, best[pos - 1] as number) < 0) pos--;
      best.splice(pos, 0, i);
      if (best.length > limit) best.pop();
    }
  }

  const options = best.map((i) => {
    return buildOption({
      cell: cells[cCell[i] as number] as EngineCell,
      topology: TOPOLOGIES[cTopo[i] as number] as Topology,
      ns: cNs[i] as number,
      np: cNp[i] as number,
      longerLife: cLonger[i] === 1,
      board: (cBoard[i] as number) >= 0 ? (boards[cBoard[i] as number] as BalancingBoard) : null,
      boardCount: cBoardCount[i] as number,
      cost: cCost[i] as number,
      lead: cLead[i] as number,
      req,
      factors,
      reliability,
      quantity,
    });
  });

  const reasons: string[] = [];
  if (options.length === 0) {
    const families = req.technology ? [req.technology] : TECHNOLOGIES;
    for (const tech of families) {
      reasons.push(reasonFor(tech, tallies.get(tech) as TechnologyTally, req));
    }
  }
  return { options, reasons };
}

function fmt(value: number, unit: string): string {
  return formatQuantity(value, unit);
}

function reasonFor(tech: Technology, tally: TechnologyTally, req: Requirement): string {
  if (tally.cells === 0) return `${tech}: no ${tech} cells in the catalog`;
  if (tally.invalid === tally.cells) {
    return `${tech}: no cell has complete electrical data${tech === "hybrid" ? " (a hybrid cell needs its minimum voltage)" : ""}`;
  }
  // sized, but set aside by the customer's own filters
  if (tally.faultFiltered > 0 || tally.lifeFiltered > 0) {
    const parts: string[] = [];
    if (tally.faultFiltered > 0) parts.push(`none survives ${faultWords(req.survives ?? "both")}`);
    if (tally.lifeFiltered > 0) {
      const best = tally.bestFilteredLife > 0 ? ` (the longest: ${tally.bestFilteredLife.toFixed(1)} years)` : " (no life data for these cells)";
      parts.push(`none is expected to last ${req.minLifeYears ?? 0} years${best}`);
    }
    return `${tech}: of the arrangements that fit, ${parts.join(" and ")}`;
  }
  if (tally.missDriver !== "none") {
    const within =
      tally.missLimit === "mass" ? fmt(req.maxMass ?? 0, "kg") : tally.missLimit === "volume" ? fmt(req.maxVolume ?? 0, "m³") : `${MAX_CELLS_PER_BANK} cells`;
    if (tally.missDriver === "string") return `${tech}: even one string of ${tally.missSeries} cells in series is beyond ${within}`;
    let need: string;
    switch (tally.missDriver) {
      case "capacitance":
        need = `${fmt(req.capacitance ?? 0, "F")}`;
        break;
      case "energy":
        need = `${fmt(req.energy ?? 0, "J")} usable`;
        break;
      case "backup":
        need = `a ${fmt(req.backup?.power ?? 0, "W")} backup for ${fmt(req.backup?.seconds ?? 0, "s")}`;
        break;
      case "esr":
        need = `a drop of at most ${fmt(req.peakCurrent?.maxDrop ?? 0, "V")} at ${fmt(req.peakCurrent?.current ?? 0, "A")}`;
        break;
      case "rms":
        need = `${fmt(req.rmsCurrent ?? 0, "A")} rms within the cells' continuous rating`;
        break;
      case "thermal":
        need = `${fmt(req.rmsCurrent ?? 0, "A")} rms without heating its cells past their maximum temperature at ${degrees(req.ambientTemperature ?? DEFAULT_AMBIENT_TEMPERATURE)}`;
        break;
      default:
        need = `${fmt(req.peakCurrent?.current ?? 0, "A")} peak current`;
    }
    return `${tech}: no cell reaches ${need} within ${within}`;
  }
  if (tally.floorSeries > 0) {
    const ns = tally.floorSeries;
    const vMin = req.minVoltage ?? 0;
    return `${tech}: a safe string needs ${ns} cells in series, and at the ${fmt(vMin, "V")} minimum each would sit at ${fmt(vMin / ns, "V")}, below the cells' ${fmt(tally.floorCellMin, "V")} minimum; such a bank needs a minimum voltage of at least ${fmt(ns * tally.floorCellMin, "V")}`;
  }
  if (tally.tooHot + tally.tooCold > 0) {
    return `${tech}: the ${degrees(req.ambientTemperature ?? DEFAULT_AMBIENT_TEMPERATURE)} ambient is outside every cell's temperature range`;
  }
  if (tally.seriesBound > 0) {
    return `${tech}: at ${fmt(req.maxVoltage, "V")} no cell stays within its ratings in a string of at most ${MAX_SERIES_COUNT.toLocaleString("en-GB")} cells in series (the search's bound)`;
  }
  return `${tech}: no cell fits`;
}

function degrees(x: number): string {
  return `${Number(x.toFixed(1))} °C`;
}

function faultWords(f: FaultFilter): string {
  return f === "short" ? "one shorted cell" : f === "open" ? "one open cell" : "one shorted and one open cell";
}

/** The cell's life data in the form lib/bank/life.ts reads; null without a rated life and a top temperature. */
function lifeCellOf(cell: EngineCell): LifeCell | null {
  const t = cell.thermal;
  if (!t || t.ratedLifeHours === null || !(t.ratedLifeHours > 0) || t.maxTemperature === null || !Number.isFinite(t.maxTemperature)) return null;
  const life: LifeCell = {
    technology: cell.technology,
    ratedVoltage: cell.ratedVoltage,
    esr: cell.esr,
    capacitance: cell.capacitance,
    ratedLifeHours: t.ratedLifeHours,
    maxTemperature: t.maxTemperature,
    thermalResistance: t.thermalResistance !== null && t.thermalResistance >= 0 ? t.thermalResistance : 0,
  };
  if (t.ratedTemperature !== null) life.ratedTemperature = t.ratedTemperature;
  if (t.minTemperature !== null) life.minTemperature = t.minTemperature;
  if (t.coldCapacitanceFactor !== null || t.coldEsrFactor !== null) {
    life.coldFactors = {
      ...(t.coldCapacitanceFactor !== null ? { capacitance: t.coldCapacitanceFactor } : {}),
      ...(t.coldEsrFactor !== null ? { esr: t.coldEsrFactor } : {}),
    };
  }
  return life;
}

/** The one-cell failure analysis of an arrangement: at V_max, with matched cells at their worst. */
function failureInput(cell: EngineCell, topology: Topology, ns: number, np: number, vMax: number, m: number): OptionFailureInput {
  return {
    cell: { capacitance: cell.capacitance, ratedVoltage: cell.ratedVoltage, surgeVoltage: Math.max(cell.surgeVoltage, cell.ratedVoltage) },
    topology,
    seriesCount: ns,
    parallelCount: np,
    appliedVoltage: vMax,
    matchingTolerance: m,
  };
}

function survivesFaults(filter: FaultFilter, cell: EngineCell, topology: Topology, ns: number, np: number, vMax: number, m: number): boolean {
  const { cases } = optionFailureCases(failureInput(cell, topology, ns, np, vMax, m));
  return (filter === "open" || survivesFault(cases.short)) && (filter === "short" || survivesFault(cases.open));
}

function verdictOf(summary: FailureModeSummary, c: OptionFailureCase): OptionFailureVerdict {
  return {
    survives: summary.survives,
    withinRating: summary.withinRating,
    shortCircuit: c.shortCircuit,
    capacitance: c.capacitance,
    maxCellVoltage: c.maxCellVoltage,
    text: summary.text,
  };
}

/** Balancing chain (Infinity when none) and bleeder in parallel; null when the bank has neither. */
function dischargeResistance(chain: number, bleeder: number | null): number | null {
  const hasChain = Number.isFinite(chain) && chain > 0;
  if (bleeder !== null && hasChain) return (chain * bleeder) / (chain + bleeder);
  return bleeder ?? (hasChain ? chain : null);
}

function buildOption(a: {
  cell: EngineCell;
  topology: Topology;
  ns: number;
  np: number;
  longerLife: boolean;
  board: BalancingBoard | null;
  boardCount: number;
  cost: number;
  lead: number;
  req: Requirement;
  factors: DesignFactors;
  reliability: ReliabilitySettings;
  quantity: number;
}): ArrangementOption {
  const { cell, ns, np, req, factors } = a;
  const vMax = req.maxVoltage;
  const vMin = req.minVoltage ?? 0;
  const cellCount = ns * np;
  const cd = cell.capacitance * (1 - cell.toleranceMinus) * (1 - factors.capacitanceFade);
  const cNominal = (np * cell.capacitance) / ns;
  const cDesign = (np * cd) / ns;
  const esrNew = (cell.esr * ns) / np;
  const esrEol = esrNew * (1 + factors.esrGrowth);
  const worstCellVoltage = worstCaseCellVoltage(vMax, ns, factors.matchingTolerance);
  const storedEnergy = storedEnergyOf(cNominal, vMax);

  const balancing = sizeBalancing({
    topology: a.topology,
    maxVoltage: vMax,
    seriesCount: ns,
    parallelCount: np,
    cellCapacitance: cell.capacitance,
    leakageCurrent: cell.leakageCurrent,
    balancingFactor: factors.balancingFactor,
    resistorSeries: factors.resistorSeries,
  });
  const cWorst = cNominal * (1 + cell.tolerancePlus);
  const minCellVoltage = cell.minVoltage !== undefined && cell.minVoltage !== null && cell.minVoltage > 0 ? cell.minVoltage : null;
  const floorVoltage = minCellVoltage === null ? null : ns * minCellVoltage;
  // A cell with a minimum voltage gets no permanent bleeder: it would drain the cells below it.
  const discharge: BleederResult =
    minCellVoltage === null || !Number.isFinite(balancing.chainResistance)
      ? sizeBleeder({
          capacitance: cWorst,
          maxVoltage: vMax,
          chainResistance: balancing.chainResistance,
          safeVoltage: factors.safeVoltage,
          safeTime: factors.safeTime,
          resistorSeries: factors.resistorSeries,
        })
      : { secondsToSafe: vMax <= factors.safeVoltage ? 0 : cWorst * balancing.chainResistance * Math.log(vMax / factors.safeVoltage), bleeder: null };

  const warnings: string[] = [];
  const needed = cellCount * a.quantity;
  if (cell.stock < needed) {
    warnings.push(
      `Stock covers ${Math.max(0, cell.stock)} of the ${needed} cells needed for ${a.quantity} bank${a.quantity === 1 ? "" : "s"}; the rest take ${cell.leadTimeDays} days.`,
    );
  }
  if (a.lead > LONG_LEAD_TIME_DAYS) warnings.push(`Long lead time: ${a.lead} days.`);
  if (a.board) {
    warnings.push(
      `Balancing needed: while charging a cell can reach ${fmt(worstCellVoltage, "V")}, above its ${fmt(cell.ratedVoltage, "V")} rating; ${a.boardCount} active balancing board${a.boardCount === 1 ? "" : "s"} ${a.board.sku} clamp each cell at ${fmt(a.board.maxCellVoltage, "V")}.`,
    );
  }
  if (balancing.count > 0 && balancing.powerRating === null) {
    warnings.push(`Each balancing resistor dissipates ${fmt(balancing.power, "W")}, beyond standard resistor ratings.`);
  }
  if (discharge.bleeder?.switched) {
    warnings.push(`A continuous bleeder would dissipate ${fmt(discharge.bleeder.power, "W")}: a switched discharge circuit is needed instead.`);
  }

  // standby drain: switched off at V_max, the cells must outlast the shop's standby time above their
  // minimum; the worst case is the cell at its lower tolerance (the least charge to lose)
  let standby: StandbyCheck | null = null;
  if (minCellVoltage !== null) {
    standby = checkStandby(
      {
        startVoltage: vMax / ns,
        minVoltage: minCellVoltage,
        capacitance: cell.capacitance * (1 - cell.toleranceMinus),
        leakageCurrent: cell.leakageCurrent,
        resistance: balancing.resistance,
        cellsPerResistor: a.topology === "series-of-parallel-groups" ? np : 1,
      },
      a.reliability.standbyDays,
    );
    if (standby.needsDisconnect) {
      warnings.push(
        `Standby drain: switched off, the balancing resistors take each cell from ${fmt(vMax / ns, "V")} to its ${fmt(minCellVoltage, "V")} minimum in ${formatDuration(standby.seconds ?? 0)}, sooner than the shop's ${a.reliability.standbyDays}-day standby: the bank needs a disconnect that opens the balancing circuit while it stands idle (or a recharge within that time).`,
      );
    }
    if (floorVoltage !== null && vMax > factors.safeVoltage && floorVoltage < factors.safeVoltage) {
      warnings.push(
        `No bleeder is fitted: a permanent one would drain the hybrid cells below their minimum. Bring the bank to the ${fmt(factors.safeVoltage, "V")} safe voltage with a switched discharge circuit that stops there (the cells must stay above ${fmt(floorVoltage, "V")}).`,
      );
    }
  }

  // standing heat of what dissipates whenever the bank is charged
  const continuousBleeder = discharge.bleeder && !discharge.bleeder.switched ? discharge.bleeder.power : 0;
  const heat = standingHeat(balancing.standbyLoss + continuousBleeder, cellCount * cell.volume);
  if (heat.significant) warnings.push(standingHeatWarning(heat, continuousBleeder > 0));

  let backupSeconds: number | undefined;
  if (req.backup && req.backup.power > 0) {
    backupSeconds = constantPowerSeconds(cDesign, esrEol, vMax, req.backup.power, vMin);
    // current at the end of the backup, per string of cells
    const vEnd = Math.max(vMin, Math.sqrt(req.backup.power * esrEol));
    const perCell = vEnd > 0 ? req.backup.power / vEnd / np : Infinity;
    if (!Number.isFinite(perCell)) {
      warnings.push("A constant-power backup down to 0 V draws unbounded current: state a minimum voltage.");
    } else if (cell.continuousCurrent > 0 && perCell > cell.continuousCurrent) {
      warnings.push(`Backup current reaches ${fmt(perCell, "A")} per cell, above the ${fmt(cell.continuousCurrent, "A")} continuous rating.`);
    }
  }

  const cautions = technologyCautions({
    technology: cell.technology,
    maxVoltage: vMax,
    safeVoltage: factors.safeVoltage,
    storedEnergy,
    highEnergy: HIGH_ENERGY_CAUTION_J,
    floorVoltage,
    minCellVoltage,
  });

  const analysis = analyzeOptionFailures(failureInput(cell, a.topology, ns, np, vMax, factors.matchingTolerance));
  const life = optionLife(cell, a.topology, ns, np, req, a.reliability);

  const option: ArrangementOption = {
    cell: {
      sku: cell.sku,
      technology: cell.technology,
      capacitance: cell.capacitance,
      toleranceMinus: cell.toleranceMinus,
      tolerancePlus: cell.tolerancePlus,
      ratedVoltage: cell.ratedVoltage,
      surgeVoltage: cell.surgeVoltage,
      esr: cell.esr,
      leakageCurrent: cell.leakageCurrent,
      peakCurrent: cell.peakCurrent,
      mass: cell.mass,
      volume: cell.volume,
      minVoltage: minCellVoltage,
    },
    cellId: cell.id,
    topology: a.topology,
    seriesCount: ns,
    parallelCount: np,
    cellCount,
    longerLife: a.longerLife,
    capacitance: { nominal: cNominal, design: cDesign },
    maxVoltage: ns * cell.ratedVoltage,
    storedEnergy,
    usableEnergy: usableEnergyOf(cDesign, vMax, vMin),
    esr: { new: esrNew, endOfLife: esrEol },
    peakDrop: req.peakCurrent ? req.peakCurrent.current * esrEol : null,
    mass: cellCount * cell.mass,
    volume: cellCount * cell.volume,
    worstCellVoltage,
    balancing: {
      resistance: balancing.resistance,
      power: balancing.power,
      powerRating: balancing.powerRating,
      count: balancing.count,
      standbyLoss: balancing.standbyLoss,
      timeConstant: balancing.timeConstant,
      activeBoard: a.board ? { sku: a.board.sku, count: a.boardCount } : null,
    },
    discharge: {
      secondsToSafe: discharge.secondsToSafe,
      capacitance: cWorst,
      chainResistance: Number.isFinite(balancing.chainResistance) ? balancing.chainResistance : null,
      resistance: dischargeResistance(balancing.chainResistance, discharge.bleeder?.resistance ?? null),
      bleeder: discharge.bleeder,
    },
    costEstimate: a.cost,
    leadTimeDays: a.lead,
    warnings,
    cautions,
    failures: {
      short: verdictOf(analysis.summary.short, analysis.cases.short),
      open: verdictOf(analysis.summary.open, analysis.cases.open),
    },
    life,
    handling: {
      minCellVoltage,
      floorVoltage,
      standby,
      standingHeat: heat,
      shipping: shippingNotes({ technology: cell.technology, capacitance: cell.capacitance, ratedVoltage: cell.ratedVoltage, minVoltage: minCellVoltage }),
    },
    yieldBasis: { matchingTolerance: factors.matchingTolerance, distribution: a.reliability.yieldDistribution, capacitanceFade: factors.capacitanceFade },
  };
  if (backupSeconds !== undefined) option.backupSeconds = backupSeconds;
  return option;
}

/** The option's temperature and life in service; null when the catalog gives no life data (or figures the estimate refuses). */
function optionLife(cell: EngineCell, topology: Topology, ns: number, np: number, req: Requirement, settings: ReliabilitySettings): OptionLife | null {
  const lifeCell = lifeCellOf(cell);
  if (!lifeCell) return null;
  const ambientAssumed = req.ambientTemperature === undefined;
  const ambient = req.ambientTemperature ?? DEFAULT_AMBIENT_TEMPERATURE;
  let e: ReturnType<typeof estimateOptionLife>;
  try {
    e = estimateOptionLife({
      cell: lifeCell,
      topology,
      seriesCount: ns,
      parallelCount: np,
      workingVoltage: req.maxVoltage,
      ambientTemperature: ambient,
      ...(req.rmsCurrent !== undefined ? { rmsCurrent: req.rmsCurrent } : {}),
      settings,
    });
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
  const stated: string[] = [];
  if (ambientAssumed) stated.push(`No ambient temperature was stated: ${degrees(ambient)} is assumed.`);
  if (req.rmsCurrent === undefined) stated.push("No rms current was stated: the cells are taken not to heat themselves.");
  else if (cell.thermal?.thermalResistance === null || cell.thermal?.thermalResistance === undefined)
    stated.push("The catalog gives no thermal resistance for this cell: self-heating is not counted.");
  const assumptions = [...stated, ...e.assumptions];
  return {
    ambientTemperature: ambient,
    ambientAssumed,
    cellVoltage: e.cellVoltage,
    cellRmsCurrent: e.cellRmsCurrent,
    dissipation: e.dissipation,
    selfHeating: e.selfHeating,
    cellTemperature: e.cellTemperature,
    maxTemperature: lifeCell.maxTemperature,
    temperatureFactor: e.temperatureFactor,
    voltageFactor: e.voltageFactor,
    lifeHours: e.lifeHours,
    lifeYears: e.lifeYears,
    capped: e.capped,
    refusal: e.refusal,
    cold: e.bankCold ? { temperature: e.cold?.temperature ?? null, capacitance: e.bankCold.capacitance, esr: e.bankCold.esr } : null,
    assumptions,
  };
}
