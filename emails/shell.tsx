import { Button, Heading, Hr, Section, Text } from "@react-email/components";
import { EmailFrame } from "./email-frame";
import { COPPER, INK_100, INK_600, INK_900, PAPER } from "./theme";

/** The frame every notice about a quote shares: the shop's name, a heading, the body, a button to the page and the address written out. */
export function QuoteMailShell({
  shopName,
  preview,
  heading,
  action,
  footer,
  children,
}: {
  shopName: string;
  preview: string;
  heading: string;
  action: { label: string; href: string };
  /** small print under the rule (the safety line, for customers) */
  footer?: string;
  children: React.ReactNode;
}) {
  return (
    <EmailFrame preview={preview}>
      <Text style={{ color: COPPER, fontSize: 13, fontWeight: 600, letterSpacing: "0.06em", margin: 0, textTransform: "uppercase" }}>{shopName}</Text>
      <Heading as="h1" style={{ fontSize: 22, lineHeight: "30px", margin: "8px 0 16px" }}>
        {heading}
      </Heading>
      {children}
      <Section style={{ margin: "24px 0" }}>
        <Button href={action.href} style={{ backgroundColor: INK_900, borderRadius: 4, color: "#ffffff", fontSize: 15, fontWeight: 600, padding: "12px 20px" }}>
          {action.label}
        </Button>
      </Section>
      <Text style={{ color: INK_600, fontSize: 13, lineHeight: "20px", margin: "0 0 8px" }}>
        Or open this address:{" "}
        <a href={action.href} style={{ color: COPPER }}>
          {action.href}
        </a>
      </Text>
      {footer ? (
        <>
          <Hr style={{ borderColor: INK_100, margin: "20px 0" }} />
          <Text style={{ color: INK_600, fontSize: 12, lineHeight: "18px", margin: 0 }}>{footer}</Text>
        </>
      ) : null}
    </EmailFrame>
  );
}

export const mailText = { fontSize: 15, lineHeight: "22px", margin: "0 0 16px" } as const;
export const factBox = { backgroundColor: PAPER, borderRadius: 4, padding: "12px 16px" } as const;
export const factRow = { fontSize: 15, lineHeight: "22px", margin: "2px 0" } as const;
export const factLabel = { color: INK_600, display: "inline-block", fontSize: 13, width: 112 } as const;
/** A message as written: line breaks kept, markup shown as text (React escapes it). */
export const quoted = {
  borderLeft: `3px solid ${INK_100}`,
  color: INK_900,
  fontSize: 15,
  lineHeight: "22px",
  margin: "0 0 16px",
  padding: "4px 0 4px 12px",
  whiteSpace: "pre-wrap",
} as const;
