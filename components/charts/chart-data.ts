import { formatQuantity } from "@/lib/quantities";
import { constantCurrentDischarge, constantPowerDischarge, resistiveDischarge, type DischargePoint, type Requirement } from "@/lib/bank";

/** The figures of an option the charts need (a subset of the priced option). */
export interface ChartOption {
  topology: "series-of-parallel-groups" | "parallel-of-series-strings";
  seriesCount: number;
  parallelCount: number;
  cell: { ratedVoltage: number; surgeVoltage: number; capacitance: number };
  capacitance: { nominal: number; design: number };
  esr: { new: number; endOfLife: number };
  worstCellVoltage: number;
  balancing: { resistance: number | null };
  discharge: { bleeder: null | { resistance: number } };
}

export interface CellVoltageBar {
  position: string;
  voltage: number;
  worst: boolean;
}

/** Most bars drawn; the positions after the weakest all charge to the same voltage. */
export const MAX_BARS = 24;

/**
 * Each series position's voltage at the end of charging to V_max, in the worst case of DESIGN §3.2:
 * the weakest position (lowest capacitance, C_lo) takes V_w, the others (C_hi) share the rest
 * equally, (V_max − V_w)/(N_s − 1), since every position in series holds the same charge.
 */
export function cellVoltageBars(option: ChartOption, maxVoltage: number): CellVoltageBar[] {
  const n = option.seriesCount;
  if (n === 1) return [{ position: "1", voltage: maxVoltage, worst: true }];
  const rest = (maxVoltage - option.worstCellVoltage) / (n - 1);
  const shown = Math.min(n, MAX_BARS);
  return Array.from({ length: shown }, (_, i) => ({ position: String(i + 1), voltage: i === 0 ? option.worstCellVoltage : rest, worst: i === 0 }));
}

export interface DischargeCurve {
  kind: "constant-power" | "constant-current" | "resistive";
  title: string;
  points: DischargePoint[];
  seconds: number;
  /** time the requirement asks for (backup), marked on the chart */
  requiredSeconds: number | null;
}

/**
 * The discharge the requirement describes, with design capacitance and end-of-life ESR
 * (DESIGN §3.3): constant power for a backup; constant current at the peak current; otherwise the
 * bank left alone after the supply is removed, discharging through its bleeder or balancing chain.
 */
export function dischargeCurve(option: ChartOption, requirement: Requirement, safeVoltage: number): DischargeCurve | null {
  const v0 = requirement.maxVoltage;
  const vEnd = requirement.minVoltage ?? 0;
  const c = option.capacitance.design;
  const esr = option.esr.endOfLife;
  if (requirement.backup) {
    const r = constantPowerDischarge({ capacitance: c, esr, v0, power: requirement.backup.power, vEnd, points: 80 });
    return { kind: "constant-power", title: `Constant ${Math.round(requirement.backup.power).toLocaleString("en-GB")} W backup at end of life`, points: r.points, seconds: r.seconds, requiredSeconds: requirement.backup.seconds };
  }
  if (requirement.peakCurrent) {
    const r = constantCurrentDischarge({ capacitance: c, esr, v0, current: requirement.peakCurrent.current, vEnd, points: 80 });
    return { kind: "constant-current", title: `Constant ${requirement.peakCurrent.current.toLocaleString("en-GB")} A at end of life`, points: r.points, seconds: r.seconds, requiredSeconds: null };
  }
  // Self-discharge after switch-off. The balancing chain: N_s resistors R in series across the
  // groups (one per group), or in each of the N_p strings N_s resistors R (one per cell).
  const r = option.balancing.resistance;
  const chainBank = r === null ? null : option.topology === "series-of-parallel-groups" ? option.seriesCount * r : (option.seriesCount * r) / option.parallelCount;
  const bleed = option.discharge.bleeder?.resistance ?? null;
  const rBank = chainBank !== null && bleed !== null ? (chainBank * bleed) / (chainBank + bleed) : (chainBank ?? bleed);
  if (rBank === null || !(rBank > 0)) return null;
  // run on below V_min (and below V_safe when the bank starts above it) so both crossings show
  const stop = Math.min(v0 / 4, vEnd > 0 ? 0.8 * vEnd : v0 / 4, 0.8 * safeVoltage);
  const d = resistiveDischarge({ capacitance: option.capacitance.nominal, resistance: rBank, v0, vEnd: stop, points: 80 });
  return { kind: "resistive", title: option.discharge.bleeder ? "Switched off: discharge through the bleeder and balancing resistors" : "Switched off: self-discharge through the balancing resistors", points: d.points, seconds: d.seconds, requiredSeconds: null };
}

/** A duration as people read it: "4.2 s", "12 min", "3.5 h", "670 days". */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "—";
  const sig = (x: number) => String(Number(x.toPrecision(2 + (x >= 100 ? 1 : 0))));
  if (seconds < 120) return formatQuantity(seconds, "s");
  if (seconds < 2 * 3600) return `${sig(seconds / 60)} min`;
  if (seconds < 48 * 3600) return `${sig(seconds / 3600)} h`;
  return `${sig(seconds / 86400)} days`;
}
