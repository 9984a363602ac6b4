import { formatQuantity } from "@/lib/quantities";

/** Beyond any of these a request goes to the shop's estimators instead of being quoted at once. */
export interface AutoQuoteLimits {
  /** V */
  maxVoltage: number;
  /** J, stored at V_max */
  maxStoredEnergy: number;
  maxCellCount: number;
}

/** Common practice for a small shop: larger banks get an engineer's eye before a price. */
export const DEFAULT_AUTO_QUOTE_LIMITS: Readonly<AutoQuoteLimits> = Object.freeze({ maxVoltage: 1000, maxStoredEnergy: 2_000_000, maxCellCount: 400 });

/** What the limits are checked against: the requirement's voltage and the chosen option's size. */
export interface LimitSubject {
  /** the requirement's V_max (V) */
  maxVoltage: number;
  /** the option's stored energy at its rating, ONE bank (J) */
  storedEnergy: number;
  /** cells in ONE bank */
  cellCount: number;
}

/**
 * Reasons a choice must go to the estimators instead of being quoted at once; empty when it may be
 * auto-quoted. The limits are per bank: they bound how dangerous and how large one build is, which
 * the ordered quantity does not change (an order of many small banks is still quoted at once).
 * Pure: no database.
 */
export function checkAutoQuoteLimits(subject: LimitSubject, limits: AutoQuoteLimits): string[] {
  const reasons: string[] = [];
  if (subject.maxVoltage > limits.maxVoltage) {
    reasons.push(`Voltage ${formatQuantity(subject.maxVoltage, "V")} is above the ${formatQuantity(limits.maxVoltage, "V")} this shop quotes automatically.`);
  }
  if (subject.storedEnergy > limits.maxStoredEnergy) {
    reasons.push(
      `Stored energy ${formatQuantity(subject.storedEnergy, "J")} is above the ${formatQuantity(limits.maxStoredEnergy, "J")} this shop quotes automatically.`,
    );
  }
  if (subject.cellCount > limits.maxCellCount) {
    reasons.push(`${subject.cellCount} cells per bank is above the ${limits.maxCellCount} this shop quotes automatically.`);
  }
  return reasons;
}
