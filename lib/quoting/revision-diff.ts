/**
 * What changed between two revisions of a quote, as people read it: the arrangement (how the bank
 * is built and its figures), the lines (added, removed, changed) and the totals. Pure: it works on
 * the frozen records, worded once (`revisionFacts`), so the quote page and the e-mail say the same.
 */
import type { QuoteRevisionRow } from "@/db/schema";
import type { Requirement } from "@/lib/bank";
import { formatMoney, type PriceSheet } from "@/lib/pricing";
import { formatQuantity } from "@/lib/quantities";
import { arrangementLabel, describeRequirement, TOPOLOGY_LABELS, type LabelledValue } from "@/lib/vocabulary";
import { partsOf } from "./custom-bank";
import { revisionSheet } from "./revision-sheet";
import type { PricedOption, RevisionDesign } from "./types";

/** What a revision froze, as the diff reads it. */
export interface FrozenRevision {
  revision: number;
  requirement: Requirement;
  arrangement: PricedOption;
  design: RevisionDesign;
  sheet: PriceSheet;
  validUntil: string;
}

export interface FactLine {
  /** stable key: the line's code and, for several of one code, its description */
  key: string;
  description: string;
  quantity: string;
  unit: string;
  unitPrice: string;
  amount: string;
}

/** One revision worded: its arrangement, its lines and its totals. */
export interface RevisionFacts {
  revision: number;
  arrangement: LabelledValue[];
  lines: FactLine[];
  totals: LabelledValue[];
}

export interface Change {
  label: string;
  /** null when the fact is new in the later revision */
  from: string | null;
  /** null when the later revision no longer has it */
  to: string | null;
}

export type LineChange = { kind: "added"; line: FactLine } | { kind: "removed"; line: FactLine } | { kind: "changed"; description: string; changes: Change[] };

export interface RevisionDiff {
  from: number;
  to: number;
  arrangement: Change[];
  lines: LineChange[];
  totals: Change[];
  /** nothing differs */
  same: boolean;
}

const q = formatQuantity;

function designFacts(design: RevisionDesign): LabelledValue[] {
  if (design.source === "custom") {
    return [
      { label: "Built as", value: "Custom bank from the shop's network editor" },
      {
        label: "Parts",
        value: partsOf(design.network)
          .map((p) => `${p.count} × ${p.sku}`)
          .join(", "),
      },
      { label: "Weakest cell", value: `${design.figures.weakest.id} (${design.figures.weakest.sku})` },
      ...design.notes.map((n) => ({ label: n.label, value: n.to })),
    ];
  }
  if (design.source === "engine") {
    return [{ label: "Built as", value: "Engine option chosen by the shop" }, ...design.notes.map((n) => ({ label: n.label, value: n.to }))];
  }
  return [{ label: "Built as", value: "The arrangement the customer chose" }];
}

/** The facts of one revision, worded for a comparison. */
export function revisionFacts(r: FrozenRevision): RevisionFacts {
  const o = r.arrangement;
  const money = (a: string) => formatMoney(a, r.sheet.currency);
  const arrangement: LabelledValue[] = [
    { label: "Requirement", value: describeRequirement(r.requirement) },
    ...designFacts(r.design),
    ...(r.design.source === "custom"
      ? []
      : [
          { label: "Topology", value: TOPOLOGY_LABELS[o.topology] },
          { label: "Arrangement", value: `${arrangementLabel(o)} of ${o.cell.sku}` },
        ]),
    { label: "Cells per bank", value: String(o.cellCount) },
    { label: "Capacitance (nominal)", value: q(o.capacitance.nominal, "F") },
    { label: "Rated voltage", value: q(o.maxVoltage, "V") },
    { label: "Stored energy", value: q(o.storedEnergy, "J") },
    { label: "ESR (new)", value: q(o.esr.new, "ohm") },
    { label: "Worst-case cell voltage", value: q(o.worstCellVoltage, "V") },
    { label: "Mass", value: q(o.mass, "kg") },
    { label: "Lead time", value: `${o.leadTimeDays} days` },
  ];
  const seen = new Map<string, number>();
  const lines = r.sheet.lines.map((l): FactLine => {
    const base = l.code === "bank" ? "bank" : `${l.code}|${l.description}`;
    const n = (seen.get(base) ?? 0) + 1;
    seen.set(base, n);
    return {
      key: n === 1 ? base : `${base}#${n}`,
      description: l.description,
      quantity: String(Number(l.quantity)),
      unit: l.unit,
      unitPrice: money(l.unitPrice),
      amount: money(l.amount),
    };
  });
  const s = r.sheet;
  const totals: LabelledValue[] = [{ label: "Lines", value: money(s.lineTotal) }];
  if (Number(s.breakDiscount) > 0) totals.push({ label: "Quantity discount", value: `−${money(s.breakDiscount)}` });
  if (s.discount) totals.push({ label: `Discount (${s.discount.reason})`, value: `−${money(s.discount.amount)}` });
  totals.push(
    { label: "Subtotal", value: money(s.subtotal) },
    { label: `Tax (${s.taxPct} %)`, value: money(s.tax) },
    { label: "Total", value: money(s.total) },
    { label: "Valid until", value: r.validUntil },
  );
  return { revision: r.revision, arrangement, lines, totals };
}

/** Facts that differ, by label, in the order of the later revision (then those it dropped). */
function diffFacts(a: readonly LabelledValue[], b: readonly LabelledValue[]): Change[] {
  const before = new Map(a.map((f) => [f.label, f.value]));
  const after = new Map(b.map((f) => [f.label, f.value]));
  const out: Change[] = [];
  for (const f of b) {
    const from = before.get(f.label) ?? null;
    if (from !== f.value) out.push({ label: f.label, from, to: f.value });
  }
  for (const f of a) if (!after.has(f.label)) out.push({ label: f.label, from: f.value, to: null });
  return out;
}

const LINE_FIELDS = [
  ["quantity", "Quantity"],
  ["unit", "Unit"],
  ["unitPrice", "Unit price"],
  ["amount", "Amount"],
] as const;

/** What changed from one revision to another (either order; `from` is the first argument). */
export function diffRevisions(a: RevisionFacts, b: RevisionFacts): RevisionDiff {
  const arrangement = diffFacts(a.arrangement, b.arrangement);
  const totals = diffFacts(a.totals, b.totals);
  const before = new Map(a.lines.map((l) => [l.key, l]));
  const afterKeys = new Set(b.lines.map((l) => l.key));
  const lines: LineChange[] = [];
  for (const line of b.lines) {
    const old = before.get(line.key);
    if (!old) {
      lines.push({ kind: "added", line });
      continue;
    }
    const changes: Change[] = [];
    if (old.description !== line.description) changes.push({ label: "Description", from: old.description, to: line.description });
    for (const [field, label] of LINE_FIELDS) if (old[field] !== line[field]) changes.push({ label, from: old[field], to: line[field] });
    if (changes.length > 0) lines.push({ kind: "changed", description: line.description, changes });
  }
  for (const line of a.lines) if (!afterKeys.has(line.key)) lines.push({ kind: "removed", line });
  return { from: a.revision, to: b.revision, arrangement, lines, totals, same: arrangement.length === 0 && lines.length === 0 && totals.length === 0 };
}

/** A stored revision as the diff reads it (revisions frozen before sheets and designs were kept read as the customer's own choice). */
export function frozenRevisionOf(
  row: Pick<QuoteRevisionRow, "revision" | "requirement" | "arrangement" | "design" | "sheet" | "pricing" | "validUntil">,
): FrozenRevision {
  return {
    revision: row.revision,
    requirement: row.requirement,
    arrangement: row.arrangement,
    design: row.design ?? { source: "customer-choice" },
    sheet: revisionSheet(row),
    validUntil: row.validUntil,
  };
}

const arrow = (c: Change) => (c.from === null ? `${c.label}: ${c.to}` : c.to === null ? `${c.label}: no longer ${c.from}` : `${c.label}: ${c.from} → ${c.to}`);

/** A diff in a few short lines for an e-mail: totals first, then lines, then the arrangement. */
export function summarizeDiff(diff: RevisionDiff, max = 8): string[] {
  const out: string[] = [];
  const total = diff.totals.find((c) => c.label === "Total");
  if (total) out.push(arrow(total));
  for (const l of diff.lines) {
    if (l.kind === "added") out.push(`Added: ${l.line.description} (${l.line.amount})`);
    else if (l.kind === "removed") out.push(`Removed: ${l.line.description}`);
    else out.push(`${l.description}: ${l.changes.map((c) => `${c.label.toLowerCase()} ${c.from ?? "—"} → ${c.to ?? "—"}`).join(", ")}`);
  }
  for (const c of diff.totals) if (c.label !== "Total" && c.label !== "Lines" && c.label !== "Subtotal" && !c.label.startsWith("Tax")) out.push(arrow(c));
  for (const c of diff.arrangement) out.push(arrow(c));
  return out.length > max ? [...out.slice(0, max - 1), `…and ${out.length - max + 1} more on the quote page`] : out;
}
