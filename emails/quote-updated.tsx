import { Section, Text } from "@react-email/components";
import { SAFETY_LINE } from "./quote-ready";
import { factBox, factLabel, factRow, mailText, QuoteMailShell, quoted } from "./shell";

export interface QuoteUpdatedEmailProps {
  shopName: string;
  quoteNumber: string;
  revision: number;
  /** the new total, formatted in the shop's currency, and the one it replaces */
  total: string;
  previousTotal: string | null;
  quantity: number;
  /** the last day the revision holds, formatted for people */
  validUntil: string;
  /** the shop's note with the revision ("" when none) */
  note: string;
  /** what changed, one short line each ("Freight added", "Cells: 18 S × 4 P → 19 S × 4 P") */
  changes: string[];
  quoteUrl: string;
}

/** "Your quote has been updated": sent when the shop issues revision 2 or later; the new PDF goes with it. */
export function QuoteUpdatedEmail(p: QuoteUpdatedEmailProps) {
  return (
    <QuoteMailShell
      shopName={p.shopName}
      preview={`${p.shopName}: quote ${p.quoteNumber} updated to revision ${p.revision}, ${p.total}`}
      heading={`Quote ${p.quoteNumber} has been updated`}
      action={{ label: "See what changed", href: p.quoteUrl }}
      footer={SAFETY_LINE}
    >
      <Text style={mailText}>
        {p.shopName} has issued revision {p.revision} of your quote. It replaces the earlier revision, which can no longer be accepted; the new PDF is attached.
      </Text>
      {p.note ? <Text style={quoted}>{p.note}</Text> : null}
      <Section style={factBox}>
        <Text style={factRow}>
          <span style={factLabel}>Quote</span> {p.quoteNumber}, revision {p.revision}
        </Text>
        <Text style={factRow}>
          <span style={factLabel}>Quantity</span> {p.quantity} {p.quantity === 1 ? "bank" : "banks"}
        </Text>
        <Text style={{ ...factRow, fontSize: 17, fontWeight: 600 }}>
          <span style={factLabel}>Total</span> {p.total}
          {p.previousTotal && p.previousTotal !== p.total ? ` (was ${p.previousTotal})` : ""}
        </Text>
        <Text style={factRow}>
          <span style={factLabel}>Valid until</span> {p.validUntil}
        </Text>
      </Section>
      {p.changes.length > 0 ? (
        <Section style={{ margin: "16px 0 0" }}>
          <Text style={{ ...mailText, margin: "0 0 4px", fontWeight: 600 }}>What changed</Text>
          {p.changes.map((c) => (
            <Text key={c} style={{ ...factRow, fontSize: 14 }}>
              • {c}
            </Text>
          ))}
        </Section>
      ) : null}
    </QuoteMailShell>
  );
}

export default QuoteUpdatedEmail;
