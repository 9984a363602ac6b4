import { Body, Button, Container, Head, Heading, Hr, Html, Preview, Section, Text } from "@react-email/components";
import { COPPER, INK_100, INK_600, INK_900, PAPER } from "./theme";

/** The frame of every e-mail the product sends: the preview line, the page and the card with the copper rule. */
export function MailFrame({ preview, children }: { preview: string; children: React.ReactNode }) {
  return (
    <Html lang="en">
      <Head />
      <Preview>{preview}</Preview>
      <Body style={{ backgroundColor: PAPER, color: INK_900, fontFamily: "'IBM Plex Sans', Arial, Helvetica, sans-serif", margin: 0, padding: "24px 0" }}>
        <Container
          style={{
            backgroundColor: "#ffffff",
            border: `1px solid ${INK_100}`,
            borderTop: `4px solid ${COPPER}`,
            borderRadius: 6,
            maxWidth: 560,
            padding: "28px 32px",
          }}
        >
          {children}
        </Container>
      </Body>
    </Html>
  );
}

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
    <MailFrame preview={preview}>
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
    </MailFrame>
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
