import type { RevisionWithLines } from "@/db/queries/quotes";
import { formatMoney, type PriceSheet } from "@/lib/pricing";
import { formatQuantity } from "@/lib/quantities";
import { requirementFacts, TECHNOLOGY_LABELS, TOPOLOGY_LABELS, type LabelledValue } from "@/lib/vocabulary";
import { partsOf } from "./custom-bank";
import { NOT_COMPUTED_FOR_CUSTOM, NOT_RECORDED, toQuoteEngineering, type QuoteEngineering } from "./quote-engineering";
import { revisionSheet } from "./revision-sheet";
import type { FrozenCell, PricedOption, RevisionDesign } from "./types";

export type { LabelledValue };

export interface QuoteDocumentLine {
  position: number;
  description: string;
  quantity: string;
  unit: string;
  unitPrice: string;
  amount: string;
}

/**
 * Everything a quote shows its customer, already worded and formatted, from one frozen revision.
 * The quote page, the PDF and the e-mail render this, so they say the same thing. Prices are sell
 * prices only (lib/pricing/sell.ts): the bank as one line, extra lines, the quantity discount, tax
 * and the total; the shop's costs are in cost-build-up.ts, for the desk. Pure: no database, no framework.
 */
export interface QuoteDocument {
  shopName: string;
  number: string;
  revision: number;
  issuedOn: string;
  validUntil: string;
  customerName: string;
  customerEmail: string;
  currency: string;
  quantity: number;
  requirement: LabelledValue[];
  arrangement: LabelledValue[];
  cell: LabelledValue[];
  figures: LabelledValue[];
  /** sell lines: the bank, then any extra lines */
  lines: QuoteDocumentLine[];
  /** below the lines: the quantity discount (if any), subtotal, tax and total */
  totals: LabelledValue[];
  /** the order total, formatted (the last row of totals) */
  total: string;
  cautions: string[];
  notes: string[];
  /** the frozen option, for the diagram on the page */
  option: PricedOption;
  /** how the bank was arrived at (a custom bank's tree is drawn from it) */
  design: RevisionDesign;
  /** the shop's note with this revision ("" when none) */
  note: string;
  /** one failed cell, tolerance yield, temperature and life, handling (quote-engineering.ts) */
  engineering: QuoteEngineering;
}

const q = (value: number, unit: string) => formatQuantity(value, unit);
const pct = (fraction: number) => `${String(Math.round(fraction * 1000) / 10)} %`;

function describeArrangement(o: PricedOption): LabelledValue[] {
  const rows: LabelledValue[] = [
    { label: "Topology", value: TOPOLOGY_LABELS[o.topology] ?? o.topology },
    { label: "Cells in series", value: String(o.seriesCount) },
    { label: "Cells in parallel", value: String(o.parallelCount) },
    { label: "Cells per bank", value: String(o.cellCount) },
  ];
  const b = o.balancing;
  if (b.activeBoard) rows.push({ label: "Balancing", value: `${b.activeBoard.count} × active board ${b.activeBoard.sku}` });
  else if (b.resistance !== null && b.count > 0)
    rows.push({ label: "Balancing", value: `${b.count} × ${q(b.resistance, "ohm")} resistor${b.powerRating ? `, ${q(b.powerRating, "W")} rated` : ""}` });
  else rows.push({ label: "Balancing", value: "None needed" });
  const bl = o.discharge.bleeder;
  rows.push({
    label: "Bleeder",
    value: bl ? `${q(bl.resistance, "ohm")}${bl.powerRating ? `, ${q(bl.powerRating, "W")} rated` : ""}${bl.switched ? ", switched" : ""}` : "None",
  });
  return rows;
}

/** A custom bank's shape: its parts and its longest series path; balancing is fitted as a line, when the estimator fits it. */
function describeCustomArrangement(o: PricedOption, design: Extract<RevisionDesign, { source: "custom" }>): LabelledValue[] {
  const rows = describeArrangement(o).filter((r) => r.label === "Bleeder");
  return [
    { label: "Built as", value: "Custom bank of series and parallel groups" },
    {
      label: "Parts",
      value: partsOf(design.network)
        .map((p) => `${p.count} × ${p.sku}`)
        .join(", "),
    },
    { label: "Cells per bank", value: String(o.cellCount) },
    { label: "Cells along the longest series path", value: String(o.seriesCount) },
    { label: "Balancing", value: "Not sized for a custom bank; fitted and priced as a line where needed" },
    ...rows,
  ];
}

function describeFigures(o: PricedOption): LabelledValue[] {
  const rows: LabelledValue[] = [
    { label: "Rated voltage", value: q(o.maxVoltage, "V") },
    { label: "Capacitance (nominal)", value: q(o.capacitance.nominal, "F") },
    { label: "Capacitance (end of life, worst case)", value: q(o.capacitance.design, "F") },
    { label: "Stored energy at rating", value: q(o.storedEnergy, "J") },
    { label: "Usable energy (end of life)", value: q(o.usableEnergy, "J") },
    { label: "ESR (new / end of life)", value: `${q(o.esr.new, "ohm")} / ${q(o.esr.endOfLife, "ohm")}` },
  ];
  if (o.peakDrop !== null) rows.push({ label: "Drop at peak current", value: q(o.peakDrop, "V") });
  if (o.backupSeconds !== undefined) rows.push({ label: "Backup time (end of life)", value: q(o.backupSeconds, "s") });
  rows.push(
    { label: "Worst-case cell voltage while charging", value: q(o.worstCellVoltage, "V") },
    { label: "Time to safe voltage (worst case)", value: o.discharge.secondsToSafe > 0 ? q(o.discharge.secondsToSafe, "s") : "Works below the safe voltage" },
    { label: "Mass", value: q(o.mass, "kg") },
    { label: "Cell volume", value: q(o.volume, "m³") },
    { label: "Lead time", value: o.leadTimeDays === 0 ? "from stock" : `${o.leadTimeDays} ${o.leadTimeDays === 1 ? "day" : "days"}` },
  );
  return rows;
}

function describeCell(cell: FrozenCell, o: PricedOption): LabelledValue[] {
  const c = o.cell;
  return [
    { label: "Part", value: c.sku },
    { label: "Maker and series", value: `${cell.manufacturer ?? ""} ${cell.series ?? ""}`.trim() || "—" },
    { label: "Technology", value: TECHNOLOGY_LABELS[c.technology] ?? c.technology },
    { label: "Capacitance", value: `${q(c.capacitance, "F")} (−${pct(c.toleranceMinus)} / +${pct(c.tolerancePlus)})` },
    { label: "Rated / surge voltage", value: `${q(c.ratedVoltage, "V")} / ${q(c.surgeVoltage, "V")}` },
    { label: "ESR", value: q(c.esr, "ohm") },
    { label: "Leakage current", value: q(c.leakageCurrent, "A") },
    { label: "Mass", value: q(c.mass, "kg") },
  ];
}

export { bankLineDescription } from "./revision-sheet";

/** The sell totals: the lines, the quantity break, a discount with its reason, tax and the total. */
function describeTotals(s: PriceSheet): LabelledValue[] {
  const m = (a: string) => formatMoney(a, s.currency);
  const rows: LabelledValue[] = [];
  const reductions = Number(s.breakDiscount) > 0 || s.discount !== null;
  if (reductions) rows.push({ label: "Lines", value: m(s.lineTotal) });
  const breakLine = s.lines.find((l) => Number(l.breakDiscount) > 0);
  if (breakLine) rows.push({ label: `Quantity discount (${breakLine.breakPct ?? "0"} %)`, value: `−${m(s.breakDiscount)}` });
  if (s.discount) rows.push({ label: `Discount: ${s.discount.reason}`, value: `−${m(s.discount.amount)}` });
  rows.push({ label: "Subtotal", value: m(s.subtotal) }, { label: `Tax (${s.taxPct} %)`, value: m(s.tax) }, { label: "Total", value: m(s.total) });
  return rows;
}

/** The worded quote from a revision and its lines as stored. */
export function toQuoteDocument(rev: RevisionWithLines): QuoteDocument {
  const r = rev.revision;
  const option = r.arrangement;
  const sheet = revisionSheet(r);
  const money = (a: string) => formatMoney(a, r.currency);
  const totals = describeTotals(sheet);
  return {
    shopName: rev.shopName,
    number: rev.quoteNumber,
    revision: r.revision,
    issuedOn: r.createdAt.toISOString().slice(0, 10),
    validUntil: r.validUntil,
    customerName: rev.customerName,
    customerEmail: rev.customerEmail,
    currency: r.currency,
    quantity: r.quantity,
    requirement: requirementFacts(r.requirement),
    arrangement: r.design?.source === "custom" ? describeCustomArrangement(option, r.design) : describeArrangement(option),
    cell: describeCell(r.cell, option),
    figures: describeFigures(option),
    // what the customer pays for: the bank as one line and the lines the shop added (sell prices)
    lines: sheet.lines.map((l, i) => ({
      position: i + 1,
      description: l.description,
      quantity: String(Number(l.quantity)),
      unit: l.unit,
      unitPrice: money(l.unitPrice),
      amount: money(l.amount),
    })),
    totals,
    total: money(r.total),
    cautions: option.cautions ?? [],
    notes: option.warnings ?? [],
    option,
    design: r.design ?? { source: "customer-choice" },
    note: r.note,
    engineering: toQuoteEngineering(r.requirement, option, r.design?.source === "custom" ? NOT_COMPUTED_FOR_CUSTOM : NOT_RECORDED),
  };
}
