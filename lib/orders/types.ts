/**
 * What an order's records hold beside plain columns: a built bank's measurements, the limits they
 * were judged against (frozen with the record) and the verdict of each check. Plain types, no
 * database and no framework, so the pure modules, the schema and the PDFs share them.
 */

/** What the tester measured on one built bank (SI units). */
export interface TestMeasurement {
  /** equivalent capacitance (F) */
  capacitance: number;
  /** equivalent series resistance (Ω) */
  esr: number;
  /** current the bank draws at the test voltage after the hold (A) */
  leakageCurrent: number;
  /** how long the bank was held at the test voltage before leakage and voltages were read (minutes) */
  holdMinutes: number;
  /** each series position's voltage after the hold (V), in position order (g1, g2, … or s1-c1, s1-c2, …) */
  positionVoltages: number[];
}

/** The pass limits of one bank, derived from the quote revision's frozen specification (lib/orders/test-limits.ts). */
export interface TestLimits {
  /** the voltage the bank is charged to for the leakage and balance checks: the requirement's working voltage (V) */
  testVoltage: number;
  capacitance: { min: number; max: number; nominal: number };
  esr: { max: number; new: number };
  leakage: { max: number };
  /** the least hold before leakage and position voltages count (minutes) */
  minHoldMinutes: number;
  positionVoltage: { min: number; max: number; nominal: number };
  /** names of the measured positions, in order */
  positions: string[];
}

export type TestCheckKey = "capacitance" | "esr" | "leakage" | "hold" | "positions";

/** One check's verdict in words a tester and a customer read. */
export interface TestCheck {
  key: TestCheckKey;
  label: string;
  passed: boolean;
  /** what was measured, formatted */
  measured: string;
  /** the limit, formatted */
  limit: string;
}
