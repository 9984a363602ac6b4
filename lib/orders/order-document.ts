/**
 * What an order's build traveler and test certificate say, already worded, from the order and its
 * frozen quote revision (pure: no database, no framework; the PDF layouts render it).
 */
import type { Requirement } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";
import type { FrozenCell, PricedOption } from "@/lib/quoting/types";
import { arrangementLabel, TECHNOLOGY_LABELS, TOPOLOGY_LABELS, type LabelledValue } from "@/lib/vocabulary";
import { handlingRules, mayBeShorted } from "./safety";
import { ESR_ALLOWANCE, MEASUREMENT_ALLOWANCE, testLimitsOf } from "./test-limits";
import type { TestCheck, TestLimits, TestMeasurement } from "./types";

const q = (value: number, unit: string) => formatQuantity(value, unit, { digits: 4 });

export interface OrderFacts {
  shopName: string;
  orderNumber: string;
  quoteNumber: string;
  revision: number;
  customerName: string;
  customerEmail: string;
  quantity: number;
  /** YYYY-MM-DD */
  dueDate: string;
  requirement: Requirement;
  arrangement: PricedOption;
  cell: FrozenCell;
  /** the shop's safe voltage (design factors) */
  safeVoltage: number;
}

/** One row of the position table: a group (or string), its cells, and its balancing. */
export interface PositionRow {
  position: string;
  cells: string;
  balancing: string;
}

/** A row standing for positions left out of a long table. */
export interface PositionGap {
  gap: number;
}

export interface TestStep {
  step: string;
  limit: string;
}

export interface TravelerDocument {
  title: string;
  header: LabelledValue[];
  arrangement: LabelledValue[];
  positionsIntro: string;
  positions: (PositionRow | PositionGap)[];
  resistors: LabelledValue[];
  assembly: string[];
  tests: TestStep[];
  safety: string[];
}

/** How many rows of the position table a traveler prints before it shortens the middle. */
export const POSITION_ROWS = 40;
/** How many cells of one row it names before it shortens them. */
const CELLS_NAMED = 8;

function cellsOf(prefix: string, count: number): string {
  if (count <= CELLS_NAMED) return Array.from({ length: count }, (_, i) => `${prefix}-c${i + 1}`).join(", ");
  return `${prefix}-c1, ${prefix}-c2, ${prefix}-c3 … ${prefix}-c${count} (${count} cells)`;
}

/** Rows of the position table, numbered as the bank diagram numbers them (g3-c2, s2-c5). */
export function positionRows(o: Pick<PricedOption, "topology" | "seriesCount" | "parallelCount" | "balancing">): (PositionRow | PositionGap)[] {
  const groups = o.topology === "series-of-parallel-groups";
  const rows = groups ? o.seriesCount : o.parallelCount;
  const r = o.balancing.resistance;
  const balancing = (i: number) => {
    if (o.balancing.activeBoard) return `active board channel ${i}`;
    if (r === null || o.balancing.count === 0) return "none";
    return groups ? `R-g${i}: ${q(r, "Ω")} across the group` : `one ${q(r, "Ω")} across each cell (R-s${i}-c1 …)`;
  };
  const row = (i: number): PositionRow =>
    groups
      ? { position: `g${i}`, cells: cellsOf(`g${i}`, o.parallelCount), balancing: balancing(i) }
      : { position: `s${i}`, cells: cellsOf(`s${i}`, o.seriesCount), balancing: balancing(i) };
  if (rows <= POSITION_ROWS) return Array.from({ length: rows }, (_, i) => row(i + 1));
  const head = POSITION_ROWS - 3;
  return [...Array.from({ length: head }, (_, i) => row(i + 1)), { gap: rows - head - 2 }, row(rows - 1), row(rows)];
}

function describeArrangement(f: OrderFacts): LabelledValue[] {
  const o = f.arrangement;
  return [
    { label: "Arrangement", value: `${arrangementLabel(o)}, ${TOPOLOGY_LABELS[o.topology].toLowerCase()}` },
    { label: "Cells per bank", value: String(o.cellCount) },
    { label: "Cell", value: `${o.cell.sku} · ${[f.cell.manufacturer, f.cell.series].filter(Boolean).join(" ")}` },
    { label: "Technology", value: TECHNOLOGY_LABELS[o.cell.technology] },
    {
      label: "Cell rating",
      value: `${q(o.cell.capacitance, "F")} (−${pct(o.cell.toleranceMinus)}/+${pct(o.cell.tolerancePlus)}), ${q(o.cell.ratedVoltage, "V")}`,
    },
    { label: "Working voltage", value: q(f.requirement.maxVoltage, "V") },
    { label: "Bank rating", value: q(o.maxVoltage, "V") },
    { label: "Capacitance (nominal)", value: q(o.capacitance.nominal, "F") },
    { label: "ESR (new)", value: q(o.esr.new, "Ω") },
    { label: "Stored energy at working voltage", value: q(o.storedEnergy, "J") },
  ];
}

const pct = (fraction: number) => `${String(Math.round(fraction * 1000) / 10)} %`;

function describeResistors(o: PricedOption): LabelledValue[] {
  const rows: LabelledValue[] = [];
  const b = o.balancing;
  if (b.activeBoard) rows.push({ label: "Active balancing", value: `${b.activeBoard.count} × ${b.activeBoard.sku}` });
  if (b.resistance !== null && b.count > 0) {
    rows.push({
      label: "Balancing resistors",
      value: `${b.count} × ${q(b.resistance, "Ω")}, ${q(b.power, "W")} each${b.powerRating ? `, fit ${q(b.powerRating, "W")} rated` : ", above the standard ratings: use a resistor bank"}`,
    });
    rows.push({ label: "Standby loss (all resistors)", value: q(b.standbyLoss, "W") });
  } else if (!b.activeBoard) rows.push({ label: "Balancing resistors", value: "None (one series position)" });
  const bl = o.discharge.bleeder;
  if (bl) {
    rows.push({
      label: bl.switched ? "Switched discharge resistor" : "Bleeder resistor",
      value: `${q(bl.resistance, "Ω")}, ${q(bl.power, "W")}${bl.powerRating ? `, fit ${q(bl.powerRating, "W")} rated` : ""}; absorbs ${q(bl.energy, "J")}`,
    });
  } else rows.push({ label: "Bleeder resistor", value: "None needed" });
  rows.push({ label: "Time to the safe voltage", value: o.discharge.secondsToSafe > 0 ? q(o.discharge.secondsToSafe, "s") : "Works below the safe voltage" });
  return rows;
}

function assemblyNotes(f: OrderFacts): string[] {
  const o = f.arrangement;
  const groups = o.topology === "series-of-parallel-groups";
  const notes = [
    `Kit ${o.cellCount * f.quantity} cells of ${o.cell.sku} (${o.cellCount} per bank) from graded stock; measure each cell's capacitance and keep cells of one bank within the shop's matching tolerance.`,
    groups
      ? `Build ${o.seriesCount} groups of ${o.parallelCount} cell${o.parallelCount === 1 ? "" : "s"} in parallel (g1 … g${o.seriesCount}), then join the groups in series, g1 at the negative terminal.`
      : `Build ${o.parallelCount} string${o.parallelCount === 1 ? "" : "s"} of ${o.seriesCount} cells in series (s1 … s${o.parallelCount}), c1 at the negative terminal, then join the strings in parallel.`,
    "Check every cell's polarity before it is joined; tighten every joint to the cell maker's torque and mark it.",
  ];
  if (o.balancing.activeBoard)
    notes.push(
      `Fit ${o.balancing.activeBoard.count} active balancing board${o.balancing.activeBoard.count === 1 ? "" : "s"} (${o.balancing.activeBoard.sku}), one channel per series position.`,
    );
  else if (o.balancing.resistance !== null && o.balancing.count > 0)
    notes.push(groups ? "Fit one balancing resistor across each group (R-g1 …)." : "Fit one balancing resistor across each cell (R-s1-c1 …).");
  if (o.discharge.bleeder)
    notes.push(
      o.discharge.bleeder.switched
        ? "Fit the switched discharge circuit across the terminals; its resistor must absorb the energy above."
        : "Fit the bleeder resistor across the terminals, with the clearance its dissipation needs.",
    );
  notes.push(`Label the bank with ${f.orderNumber}, its working voltage and the hazard label before it leaves the bench.`);
  for (const w of o.warnings) notes.push(w);
  return notes;
}

/** The acceptance test steps of one bank, each with its limit from the frozen specification. */
export function testSteps(limits: TestLimits, technology: PricedOption["cell"]["technology"]): TestStep[] {
  const l = limits;
  const first = l.positions[0] ?? "g1";
  const last = l.positions.at(-1) ?? first;
  return [
    { step: "Capacitance (constant-current discharge between two voltages)", limit: `${q(l.capacitance.min, "F")} to ${q(l.capacitance.max, "F")}` },
    { step: "ESR (current step or 1 kHz, at the terminals)", limit: `at most ${q(l.esr.max, "Ω")}` },
    { step: `Charge to ${q(l.testVoltage, "V")} and hold`, limit: `at least ${l.minHoldMinutes} min` },
    { step: "Leakage current at the end of the hold", limit: `at most ${q(l.leakage.max, "A")}` },
    {
      step: `Each position's voltage at the end of the hold (${first} … ${last}, ${l.positions.length} in all)`,
      limit: `${q(l.positionVoltage.min, "V")} to ${q(l.positionVoltage.max, "V")}`,
    },
    {
      step: mayBeShorted(technology)
        ? "Discharge below the safe voltage, fit the shorting link"
        : "Set the shipping voltage; cover the terminals (never short)",
      limit: "done and signed",
    },
  ];
}

export function travelerDocument(f: OrderFacts): TravelerDocument {
  const o = f.arrangement;
  const limits = testLimitsOf(o, f.requirement);
  const groups = o.topology === "series-of-parallel-groups";
  return {
    title: `Build traveler ${f.orderNumber}`,
    header: [
      { label: "Order", value: f.orderNumber },
      { label: "Quote", value: `${f.quoteNumber}, revision ${f.revision}` },
      { label: "Customer", value: `${f.customerName} (${f.customerEmail})` },
      { label: "Banks to build", value: String(f.quantity) },
      { label: "Due", value: f.dueDate },
    ],
    arrangement: describeArrangement(f),
    positionsIntro: groups
      ? `Positions as the bank diagram numbers them: g1 … g${o.seriesCount} are the groups in series from the negative terminal; gN-cM is cell M of group N.`
      : `Positions as the bank diagram numbers them: s1 … s${o.parallelCount} are the strings in parallel; sN-cM is cell M of string N, c1 at the negative terminal.`,
    positions: positionRows(o),
    resistors: describeResistors(o),
    assembly: assemblyNotes(f),
    tests: testSteps(limits, o.cell.technology),
    safety: [
      ...handlingRules({ technology: o.cell.technology, maxVoltage: f.requirement.maxVoltage, safeVoltage: f.safeVoltage, storedEnergy: o.storedEnergy }),
      // the option's own cautions (shock, burn and arc), less what the handling rules above already say
      // about discharging and shorting (and never a shorting caution where the cells must never be shorted)
      ...o.cautions.filter((c) => !/short|discharg|engineering estimate/i.test(c)),
    ],
  };
}

// ---- the test certificate -------------------------------------------------------------------------

export interface CertificateBank {
  bank: number;
  testedOn: string;
  testedBy: string;
  passed: boolean;
  checks: TestCheck[];
  holdMinutes: number;
}

export interface CertificateDocument {
  title: string;
  header: LabelledValue[];
  specification: LabelledValue[];
  banks: CertificateBank[];
  /** how each limit was derived, in words */
  basis: string[];
  safety: string[];
}

export function certificateDocument(
  f: OrderFacts,
  tests: { bank: number; createdAt: Date; testedBy: string | null; isPassed: boolean; checks: TestCheck[]; measured: TestMeasurement }[],
  issuedOn: string,
): CertificateDocument {
  const o = f.arrangement;
  return {
    title: `Test certificate ${f.orderNumber}`,
    header: [
      { label: "Order", value: f.orderNumber },
      { label: "Quote", value: `${f.quoteNumber}, revision ${f.revision}` },
      { label: "Customer", value: f.customerName },
      { label: "Banks", value: String(f.quantity) },
      { label: "Issued", value: issuedOn },
    ],
    specification: describeArrangement(f),
    banks: tests.map((t) => ({
      bank: t.bank,
      testedOn: t.createdAt.toISOString().slice(0, 10),
      testedBy: t.testedBy ?? "—",
      passed: t.isPassed,
      checks: t.checks,
      holdMinutes: t.measured.holdMinutes,
    })),
    basis: [
      `Capacitance within the cell's tolerance (−${pct(o.cell.toleranceMinus)}/+${pct(o.cell.tolerancePlus)}) of the bank's nominal ${q(o.capacitance.nominal, "F")}.`,
      `ESR at most the new bank's ${q(o.esr.new, "Ω")} (the cell maker's ESR × cells in series ÷ cells in parallel) plus ${Math.round(ESR_ALLOWANCE * 100)} % for interconnects and measurement.`,
      "Leakage at the working voltage after the hold: at most the cells' rated leakage plus the current the balancing resistors and bleeder draw.",
      `Each series position within the spread that cells graded to the shop's matching tolerance may show (the quote's worst-case cell voltage), never narrower than ±${Math.round(MEASUREMENT_ALLOWANCE * 100)} %.`,
    ],
    safety: handlingRules({ technology: o.cell.technology, maxVoltage: f.requirement.maxVoltage, safeVoltage: f.safeVoltage, storedEnergy: o.storedEnergy }),
  };
}
