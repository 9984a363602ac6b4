/**
 * A built bank's acceptance test: the limits, derived from the quote revision's frozen
 * specification, and the verdict on what the tester measured (pure: no database, no framework).
 *
 * Which limits, and where each comes from:
 * - capacitance within the cell's tolerance of the bank's nominal capacitance: every cell within
 *   −a/+b of C_n gives a bank within −a/+b of N_p·C_n/N_s, since a series/parallel network's
 *   capacitance rises with each cell's (so all-low and all-high cells are the extremes);
 * - ESR at most the new bank's ESR (the maker's cell ESR × N_s / N_p) plus ESR_ALLOWANCE for the
 *   interconnects and the measurement;
 * - leakage: the current the bank draws at its working voltage after the hold, at most the cells'
 *   leakage (N_p strings or groups, each passing the maker's I_lk) plus what the balancing
 *   resistors and a continuous bleeder draw by Ohm's law (a switched discharge circuit is off);
 * - each series position's voltage after a charge hold within the spread matched cells may have:
 *   V_max/N_s ± (V_w − V_max/N_s), with V_w the frozen worst-case charging voltage of a cell
 *   (cells graded to the shop's matching tolerance m), never above the cell's rating, and never
 *   narrower than ±MEASUREMENT_ALLOWANCE of the nominal position voltage.
 * The bank is tested at the requirement's working voltage V_max, never at the bank's rating.
 */
import type { PricedOption } from "@/lib/quoting/types";
import type { Requirement, Technology } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";
import type { TestCheck, TestLimits, TestMeasurement } from "./types";

/** ESR may exceed the new bank's by this share: bus bars, lugs and the meter (common practice). */
export const ESR_ALLOWANCE = 0.2;

/** A position voltage band is never narrower than this share of its nominal voltage: a bench meter's reading (common practice). */
export const MEASUREMENT_ALLOWANCE = 0.01;

/**
 * Least hold at the test voltage before leakage and position voltages are read, per technology
 * (common practice, from memory): supercapacitor and hybrid cells keep absorbing charge for hours,
 * so an hour at least (the maker's own leakage figure is usually after 72 h); aluminium
 * electrolytics settle within minutes (5 min after reaching the voltage); film within a minute.
 */
export const MIN_HOLD_MINUTES: Record<Technology, number> = { edlc: 60, hybrid: 60, electrolytic: 5, film: 1 };

/** How many positions a test lists: one per group, or one per cell of every string. */
export function positionNames(o: Pick<PricedOption, "topology" | "seriesCount" | "parallelCount">): string[] {
  const { seriesCount: ns, parallelCount: np } = o;
  if (o.topology === "series-of-parallel-groups") return Array.from({ length: ns }, (_, s) => `g${s + 1}`);
  const names: string[] = [];
  for (let p = 1; p <= np; p++) for (let s = 1; s <= ns; s++) names.push(`s${p}-c${s}`);
  return names;
}

/** The limits one bank of this frozen arrangement is tested against. */
export function testLimitsOf(option: PricedOption, requirement: Pick<Requirement, "maxVoltage">): TestLimits {
  const o = option;
  const ns = o.seriesCount;
  const np = o.parallelCount;
  const testVoltage = requirement.maxVoltage;
  const vCell = testVoltage / ns;

  const nominalC = o.capacitance.nominal;
  const capacitance = { nominal: nominalC, min: nominalC * (1 - o.cell.toleranceMinus), max: nominalC * (1 + o.cell.tolerancePlus) };

  const esr = { new: o.esr.new, max: o.esr.new * (1 + ESR_ALLOWANCE) };

  // every group (or string) passes the same current in series: N_p cells' leakage, plus the resistors'
  const cells = np * o.cell.leakageCurrent;
  const r = o.balancing.resistance;
  const resistors = r !== null && o.balancing.count > 0 ? (o.topology === "series-of-parallel-groups" ? vCell / r : np * (vCell / r)) : 0;
  const bleeder = o.discharge.bleeder && !o.discharge.bleeder.switched ? testVoltage / o.discharge.bleeder.resistance : 0;
  const leakage = { max: cells + resistors + bleeder };

  const spread = Math.max(o.worstCellVoltage - vCell, MEASUREMENT_ALLOWANCE * vCell);
  const top = Math.max(vCell, Math.min(vCell + spread, o.cell.ratedVoltage));
  const half = Math.max(top - vCell, MEASUREMENT_ALLOWANCE * vCell);
  const positionVoltage = { nominal: vCell, min: vCell - half, max: vCell + half };

  return {
    testVoltage,
    capacitance,
    esr,
    leakage,
    minHoldMinutes: MIN_HOLD_MINUTES[o.cell.technology],
    positionVoltage,
    positions: positionNames(o),
  };
}

const q = (value: number, unit: string) => formatQuantity(value, unit, { digits: 4 });

/** How many failing positions a verdict names before it says "and N more". */
const NAMED_FAILURES = 6;

/** Judges one bank's measurements against its limits: every check with its verdict, and the whole. */
export function judgeTest(m: TestMeasurement, l: TestLimits): { passed: boolean; checks: TestCheck[] } {
  const checks: TestCheck[] = [];
  checks.push({
    key: "capacitance",
    label: "Capacitance",
    passed: m.capacitance >= l.capacitance.min && m.capacitance <= l.capacitance.max,
    measured: q(m.capacitance, "F"),
    limit: `${q(l.capacitance.min, "F")} to ${q(l.capacitance.max, "F")}`,
  });
  checks.push({ key: "esr", label: "ESR", passed: m.esr <= l.esr.max, measured: q(m.esr, "Ω"), limit: `at most ${q(l.esr.max, "Ω")}` });
  checks.push({
    key: "hold",
    label: "Hold at the test voltage",
    passed: m.holdMinutes >= l.minHoldMinutes,
    measured: `${m.holdMinutes} min`,
    limit: `at least ${l.minHoldMinutes} min at ${q(l.testVoltage, "V")}`,
  });
  checks.push({
    key: "leakage",
    label: "Leakage current after the hold",
    passed: m.leakageCurrent <= l.leakage.max,
    measured: q(m.leakageCurrent, "A"),
    limit: `at most ${q(l.leakage.max, "A")}`,
  });
  const outside: string[] = [];
  if (m.positionVoltages.length === l.positions.length) {
    m.positionVoltages.forEach((v, i) => {
      if (!(v >= l.positionVoltage.min && v <= l.positionVoltage.max)) outside.push(`${l.positions[i] ?? `#${i + 1}`} ${q(v, "V")}`);
    });
  }
  const countOk = m.positionVoltages.length === l.positions.length;
  const named = outside.slice(0, NAMED_FAILURES).join(", ") + (outside.length > NAMED_FAILURES ? ` and ${outside.length - NAMED_FAILURES} more` : "");
  checks.push({
    key: "positions",
    label: l.positions.length === 1 ? "Cell voltage after the hold" : "Position voltages after the hold",
    passed: countOk && outside.length === 0,
    measured: !countOk
      ? `${m.positionVoltages.length} of ${l.positions.length} positions read`
      : outside.length === 0
        ? `all ${l.positions.length} within`
        : `outside: ${named}`,
    limit: `${q(l.positionVoltage.min, "V")} to ${q(l.positionVoltage.max, "V")} each`,
  });
  return { passed: checks.every((c) => c.passed), checks };
}

/** Whether every bank of an order has a passing latest test (what moving to "ready" needs), and which do not. */
export function banksNotPassed(quantity: number, latest: readonly { bank: number; isPassed: boolean }[]): { missing: number[]; failed: number[] } {
  const byBank = new Map(latest.map((t) => [t.bank, t.isPassed]));
  const missing: number[] = [];
  const failed: number[] = [];
  for (let b = 1; b <= quantity; b++) {
    const passed = byBank.get(b);
    if (passed === undefined) missing.push(b);
    else if (!passed) failed.push(b);
  }
  return { missing, failed };
}
