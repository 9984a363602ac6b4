import { Text } from "@react-email/components";
import { mailText, QuoteMailShell, quoted } from "./shell";

export interface QuoteMessageEmailProps {
  shopName: string;
  quoteNumber: string;
  /** who reads it: the customer (from the shop) or the shop's staff (from the customer) */
  to: "customer" | "shop";
  authorName: string;
  /** what the message is, in a few words: "asks for a change", "declined revision 2", "wrote" */
  what: string;
  body: string;
  quoteUrl: string;
}

/** A message in a quote's thread, e-mailed to the other side once. */
export function QuoteMessageEmail(p: QuoteMessageEmailProps) {
  const heading = p.to === "shop" ? `${p.authorName} ${p.what} on ${p.quoteNumber}` : `${p.shopName} ${p.what} on your quote ${p.quoteNumber}`;
  return (
    <QuoteMailShell
      shopName={p.shopName}
      preview={`${heading}: ${p.body.slice(0, 80)}`}
      heading={heading}
      action={{ label: p.to === "shop" ? "Open the quote on the desk" : "Reply on the quote page", href: p.quoteUrl }}
    >
      <Text style={mailText}>{p.to === "shop" ? `From ${p.authorName}, the customer:` : `From ${p.authorName} at ${p.shopName}:`}</Text>
      <Text style={quoted}>{p.body}</Text>
      <Text style={{ ...mailText, fontSize: 13 }}>Replies go on the quote page, so the whole conversation stays with the quote.</Text>
    </QuoteMailShell>
  );
}

export default QuoteMessageEmail;
