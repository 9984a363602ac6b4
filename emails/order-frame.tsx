import { Button, Heading, Hr, Section, Text } from "@react-email/components";
import { EmailFrame } from "./email-frame";
import { SAFETY_LINE } from "./quote-ready";
import { COPPER, INK_100, INK_600, INK_900, PAPER } from "./theme";

/** What every order message says around its own words: the shop, the heading, the order's facts, a link to the order page. */
export interface OrderFrameProps {
  shopName: string;
  preview: string;
  heading: string;
  children: React.ReactNode;
  /** labelled facts (order number, quote, amounts, carrier…) */
  facts: { label: string; value: string }[];
  orderUrl: string;
}

/** The frame of the order messages (confirmed, ready, shipped, delivered): one look, one safety line. */
export function OrderFrame({ shopName, preview, heading, children, facts, orderUrl }: OrderFrameProps) {
  return (
    <EmailFrame preview={preview}>
      <Text style={{ color: COPPER, fontSize: 13, fontWeight: 600, letterSpacing: "0.06em", margin: 0, textTransform: "uppercase" }}>{shopName}</Text>
      <Heading as="h1" style={{ fontSize: 22, lineHeight: "30px", margin: "8px 0 16px" }}>
        {heading}
      </Heading>
      {children}
      <Section style={{ backgroundColor: PAPER, borderRadius: 4, padding: "12px 16px" }}>
        {facts.map((f) => (
          <Text key={f.label} style={{ fontSize: 15, lineHeight: "22px", margin: "2px 0" }}>
            <span style={{ color: INK_600, display: "inline-block", fontSize: 13, width: 120 }}>{f.label}</span> {f.value}
          </Text>
        ))}
      </Section>
      <Section style={{ margin: "24px 0" }}>
        <Button href={orderUrl} style={{ backgroundColor: INK_900, borderRadius: 4, color: "#ffffff", fontSize: 15, fontWeight: 600, padding: "12px 20px" }}>
          Follow the order
        </Button>
      </Section>
      <Text style={{ color: INK_600, fontSize: 13, lineHeight: "20px", margin: "0 0 8px" }}>
        Or open this address:{" "}
        <a href={orderUrl} style={{ color: COPPER }}>
          {orderUrl}
        </a>
      </Text>
      <Hr style={{ borderColor: INK_100, margin: "20px 0" }} />
      <Text style={{ color: INK_600, fontSize: 12, lineHeight: "18px", margin: 0 }}>{SAFETY_LINE}</Text>
    </EmailFrame>
  );
}

export const paragraph = { fontSize: 15, lineHeight: "22px", margin: "0 0 16px" } as const;
