import { Button, Heading, Hr, Section, Text } from "@react-email/components";
import { COPPER, INK_100, INK_600, INK_900, PAPER } from "./theme";
import { EmailFrame } from "./email-frame";

export interface QuoteReadyEmailProps {
  shopName: string;
  quoteNumber: string;
  revision: number;
  /** the total for the quoted quantity, already formatted in the shop's currency */
  total: string;
  quantity: number;
  /** the last day the quote holds, formatted for people (e.g. "14 August 2026") */
  validUntil: string;
  /** the quote page on the storefront */
  quoteUrl: string;
  /** the sell lines (the bank, then any extra lines), formatted; never a cost */
  lines?: { description: string; quantity: string; unit: string; unitPrice: string; amount: string }[];
  /** below the lines and above the total: quantity discount, subtotal, tax (formatted) */
  totals?: { label: string; value: string }[];
}

export const SAFETY_LINE =
  "The figures in this quote are an engineering estimate. Local electrical codes and licensed practice decide how the bank is installed and used. A charged bank holds its energy after the supply is gone: discharge it and short its terminals before handling.";

/** "Your quote is ready": sent when a quote revision is issued; the quote's PDF goes with it. */
export function QuoteReadyEmail({ shopName, quoteNumber, revision, total, quantity, validUntil, quoteUrl, lines = [], totals = [] }: QuoteReadyEmailProps) {
  return (
    <EmailFrame preview={`${shopName}: quote ${quoteNumber} is ready, ${total}, valid until ${validUntil}`}>
      <Text style={{ color: COPPER, fontSize: 13, fontWeight: 600, letterSpacing: "0.06em", margin: 0, textTransform: "uppercase" }}>{shopName}</Text>
      <Heading as="h1" style={{ fontSize: 22, lineHeight: "30px", margin: "8px 0 16px" }}>
        Your quote {quoteNumber} is ready
      </Heading>
      <Text style={{ fontSize: 15, lineHeight: "22px", margin: "0 0 16px" }}>
        Thank you for your request. {shopName} has priced the bank you chose; the quote is attached as a PDF and is on your quotes page.
      </Text>
      <Section style={{ backgroundColor: PAPER, borderRadius: 4, padding: "12px 16px" }}>
        <Text style={row}>
          <span style={label}>Quote</span> {quoteNumber}, revision {revision}
        </Text>
        <Text style={row}>
          <span style={label}>Quantity</span> {quantity} {quantity === 1 ? "bank" : "banks"}
        </Text>
        {lines.map((l) => (
          <Text key={l.description} style={{ ...row, fontSize: 14 }}>
            {l.description}: {l.quantity} {l.unit} × {l.unitPrice} = {l.amount}
          </Text>
        ))}
        {totals.map((t) => (
          <Text key={t.label} style={row}>
            <span style={label}>{t.label}</span> {t.value}
          </Text>
        ))}
        <Text style={{ ...row, fontSize: 17, fontWeight: 600 }}>
          <span style={label}>Total</span> {total}
        </Text>
        <Text style={row}>
          <span style={label}>Valid until</span> {validUntil}
        </Text>
      </Section>
      <Section style={{ margin: "24px 0" }}>
        <Button href={quoteUrl} style={{ backgroundColor: INK_900, borderRadius: 4, color: "#ffffff", fontSize: 15, fontWeight: 600, padding: "12px 20px" }}>
          View the quote
        </Button>
      </Section>
      <Text style={{ color: INK_600, fontSize: 13, lineHeight: "20px", margin: "0 0 8px" }}>
        Or open this address:{" "}
        <a href={quoteUrl} style={{ color: COPPER }}>
          {quoteUrl}
        </a>
      </Text>
      <Hr style={{ borderColor: INK_100, margin: "20px 0" }} />
      <Text style={{ color: INK_600, fontSize: 12, lineHeight: "18px", margin: 0 }}>{SAFETY_LINE}</Text>
    </EmailFrame>
  );
}

const row = { fontSize: 15, lineHeight: "22px", margin: "2px 0" } as const;
const label = { color: INK_600, display: "inline-block", fontSize: 13, width: 96 } as const;

export default QuoteReadyEmail;
