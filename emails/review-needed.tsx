import { Section, Text } from "@react-email/components";
import { factBox, factLabel, factRow, mailText, QuoteMailShell, quoted } from "./shell";

export interface ReviewNeededEmailProps {
  shopName: string;
  customerName: string;
  /** the whole requirement in one line (lib/vocabulary describeRequirement) */
  requirement: string;
  /** why the engine did not quote it */
  reasons: string[];
  /** the customer's notes, shortened ("" when none) */
  notes: string;
  attachments: number;
  workbenchUrl: string;
}

/** To the shop's staff: a request waits for an estimator. */
export function ReviewNeededEmail(p: ReviewNeededEmailProps) {
  return (
    <QuoteMailShell
      shopName={p.shopName}
      preview={`${p.customerName}: ${p.requirement}`}
      heading={`A request from ${p.customerName} needs review`}
      action={{ label: "Open it in the workbench", href: p.workbenchUrl }}
    >
      <Text style={mailText}>The engine did not quote this request on its own; it waits for an estimator.</Text>
      <Section style={factBox}>
        <Text style={factRow}>
          <span style={factLabel}>Requirement</span> {p.requirement}
        </Text>
        <Text style={factRow}>
          <span style={factLabel}>Attachments</span> {p.attachments === 0 ? "none" : `${p.attachments} file${p.attachments === 1 ? "" : "s"}`}
        </Text>
      </Section>
      {p.reasons.map((r) => (
        <Text key={r} style={{ ...factRow, fontSize: 14 }}>
          • {r}
        </Text>
      ))}
      {p.notes ? <Text style={{ ...quoted, marginTop: 16 }}>{p.notes}</Text> : null}
    </QuoteMailShell>
  );
}

export default ReviewNeededEmail;
