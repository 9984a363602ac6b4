import { describe, expect, it } from "vitest";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { diffRevisions, revisionFacts, summarizeDiff, type FrozenRevision } from "@/lib/quoting/revision-diff";
import { buildSheet, type ExtraLineInput } from "@/lib/quoting/revision-sheet";
import { SAMPLE_CATALOG } from "./sample-quote";

// An invented quote: the sample catalog's options for one requirement, priced by the default rules.
const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 };
const found = searchPricedOptions(SAMPLE_CATALOG, requirement);
const first = found.options[0]!;
const second = found.options[1]!;
const firstPrice = found.records[0]!.price!;
const secondPrice = found.records[1]!.price!;

const freight: ExtraLineInput = { kind: "freight", description: "Pallet freight", quantity: "1", unit: "lot", unitPrice: "85.00" };
const enclosure: ExtraLineInput = { kind: "enclosure", description: "Steel cabinet", quantity: "1", unit: "pc", unitPrice: "240.00" };

function revision(
  n: number,
  over: {
    option?: typeof first;
    price?: typeof firstPrice;
    extras?: ExtraLineInput[];
    discount?: { kind: "percent" | "amount"; value: string; reason: string } | null;
    validUntil?: string;
    bankOverride?: string;
  } = {},
): FrozenRevision {
  const option = over.option ?? first;
  const price = over.price ?? firstPrice;
  const sheet = buildSheet({
    currency: price.currency,
    taxPct: price.taxPct,
    quantity: 2,
    bankDescription: `Capacitor bank, ${option.seriesCount} S × ${option.parallelCount} P`,
    bankUnitPrice: price.unitPrice,
    bankBreakPct: price.discountPct,
    bankOverride: over.bankOverride ? { unitPrice: over.bankOverride, reason: "match a competitor" } : null,
    extras: over.extras ?? [],
    discount: over.discount ?? null,
  });
  return { revision: n, requirement, arrangement: option, design: { source: "customer-choice" }, sheet, validUntil: over.validUntil ?? "2026-06-30" };
}

const facts = (r: FrozenRevision) => revisionFacts(r);

describe("the diff between two revisions", () => {
  it("finds nothing between a revision and itself", () => {
    const d = diffRevisions(facts(revision(1)), facts(revision(2)));
    expect(d).toMatchObject({ from: 1, to: 2, arrangement: [], lines: [], totals: [], same: true });
  });

  it("shows an added line, the new totals and the discount with its reason", () => {
    const d = diffRevisions(facts(revision(1)), facts(revision(2, { extras: [freight], discount: { kind: "percent", value: "5", reason: "Repeat order" } })));
    expect(d.same).toBe(false);
    expect(d.arrangement).toEqual([]);
    expect(d.lines).toEqual([{ kind: "added", line: expect.objectContaining({ description: "Pallet freight", amount: "€85.00" }) }]);
    expect(d.totals.map((c) => c.label)).toEqual(["Lines", "Discount (Repeat order)", "Subtotal", "Tax (20 %)", "Total"]);
    expect(d.totals.find((c) => c.label === "Discount (Repeat order)")?.from).toBeNull();
  });

  it("shows a removed line and a changed one field by field, and reads the same either way round", () => {
    const a = facts(revision(1, { extras: [enclosure, freight] }));
    const b = facts(revision(2, { extras: [{ ...freight, unitPrice: "120.00" }], bankOverride: "900.00" }));
    const d = diffRevisions(a, b);
    expect(d.lines).toEqual([
      {
        kind: "changed",
        description: expect.stringMatching(/^Capacitor bank/),
        changes: [expect.objectContaining({ label: "Unit price", to: "€900.00" }), expect.objectContaining({ label: "Amount", to: "€1,800.00" })],
      },
      {
        kind: "changed",
        description: "Pallet freight",
        changes: [
          { label: "Unit price", from: "€85.00", to: "€120.00" },
          { label: "Amount", from: "€85.00", to: "€120.00" },
        ],
      },
      { kind: "removed", line: expect.objectContaining({ description: "Steel cabinet" }) },
    ]);
    const back = diffRevisions(b, a);
    expect(back.lines.map((l) => l.kind)).toEqual(["changed", "added", "changed"]);
  });

  it("shows a different arrangement and validity", () => {
    const d = diffRevisions(facts(revision(1)), facts(revision(2, { option: second, price: secondPrice, validUntil: "2026-07-31" })));
    const labels = d.arrangement.map((c) => c.label);
    expect(labels).toContain("Arrangement");
    expect(d.totals.find((c) => c.label === "Valid until")).toEqual({ label: "Valid until", from: "2026-06-30", to: "2026-07-31" });
  });

  it("sums up for an e-mail: the total first, and no more than it is given room for", () => {
    const d = diffRevisions(facts(revision(1, { extras: [enclosure] })), facts(revision(2, { option: second, price: secondPrice, extras: [freight] })));
    const lines = summarizeDiff(d, 4);
    expect(lines).toHaveLength(4);
    expect(lines[0]).toMatch(/^Total: €[\d,.]+ → €[\d,.]+$/);
    expect(lines[3]).toMatch(/more on the quote page$/);
  });
});
