import type { ArrangementOption, OptionHandling } from "./arrangement-search";
import { constantCurrentDischarge, constantPowerDischarge, resistiveDischarge, type DischargePoint } from "./discharge";
import type { Requirement } from "./types";

/**
 * The curves drawn beside an option, from the option's own figures (the charts compute no physics
 * of their own): each series position's voltage at the end of charging, and the discharge the
 * requirement describes.
 */

/** What the curves read of an option. */
export type CurveOption = Pick<ArrangementOption, "seriesCount" | "worstCellVoltage" | "capacitance" | "esr" | "discharge"> & {
  /** cells with a minimum voltage: the switched-off curve stops at the bank's floor */
  handling?: Pick<OptionHandling, "floorVoltage" | "standby">;
};

export interface ChargingVoltages {
  /** the weakest position (lowest capacitance within the matching tolerance): V_w */
  weakest: number;
  /** every other position: the same charge on C_hi, (V_max − V_w)/(N_s − 1); null for a single cell */
  others: number | null;
  /** each position with perfectly matched cells: V_max/N_s */
  balanced: number;
}

/**
 * Each series position's voltage at the end of charging to V_max in the worst case of DESIGN §3.2:
 * the weakest position takes V_w; the others, holding the same charge on the higher capacitance,
 * share the rest equally.
 */
export function chargingVoltages(option: CurveOption, maxVoltage: number): ChargingVoltages {
  const n = option.seriesCount;
  if (n <= 1) return { weakest: maxVoltage, others: null, balanced: maxVoltage };
  return { weakest: option.worstCellVoltage, others: (maxVoltage - option.worstCellVoltage) / (n - 1), balanced: maxVoltage / n };
}

export interface DischargeCurve {
  kind: "constant-power" | "constant-current" | "resistive";
  points: DischargePoint[];
  /** time to the curve's end voltage (s) */
  seconds: number;
  /** time the requirement asks for (backup), marked on the chart */
  requiredSeconds: number | null;
}

/** Points drawn per curve. */
const CURVE_POINTS = 80;

/**
 * The discharge the requirement describes (DESIGN §3.3). A backup: constant power with the design
 * capacitance and end-of-life ESR, as option.backupSeconds is computed. A peak current: constant
 * current, likewise. Otherwise the bank left alone after switch-off, through its balancing chain
 * and bleeder with the worst-case capacitance, as option.discharge.secondsToSafe is computed, run on
 * below V_min and V_safe so both crossings show — but never below the floor of cells with a minimum
 * voltage (hybrid), which the drain must not pass. Null when the bank has no discharge path.
 */
export function dischargeCurve(option: CurveOption, requirement: Requirement, safeVoltage: number): DischargeCurve | null {
  const v0 = requirement.maxVoltage;
  const vEnd = requirement.minVoltage ?? 0;
  const c = option.capacitance.design;
  const esr = option.esr.endOfLife;
  if (requirement.backup) {
    const r = constantPowerDischarge({ capacitance: c, esr, v0, power: requirement.backup.power, vEnd, points: CURVE_POINTS });
    return { kind: "constant-power", points: r.points, seconds: r.seconds, requiredSeconds: requirement.backup.seconds };
  }
  if (requirement.peakCurrent) {
    const r = constantCurrentDischarge({ capacitance: c, esr, v0, current: requirement.peakCurrent.current, vEnd, points: CURVE_POINTS });
    return { kind: "constant-current", points: r.points, seconds: r.seconds, requiredSeconds: null };
  }
  const { resistance, capacitance } = option.discharge;
  if (resistance === null || !(resistance > 0)) return null;
  const floor = option.handling?.floorVoltage ?? null;
  const stop = Math.max(Math.min(v0 / 4, vEnd > 0 ? 0.8 * vEnd : v0 / 4, 0.8 * safeVoltage), floor !== null && floor < v0 ? floor : 0);
  const d = resistiveDischarge({ capacitance, resistance, v0, vEnd: stop, points: CURVE_POINTS });
  return { kind: "resistive", points: d.points, seconds: d.seconds, requiredSeconds: null };
}
