import { render } from "@react-email/render";
import { createElement } from "react";
import { describe, expect, it } from "vitest";
import { QuoteReadyEmail, SAFETY_LINE, type QuoteReadyEmailProps } from "@/emails/quote-ready";
import { formatValidity, outboxMessageId, quotePageUrl, senderDomain, shopSenderAddress } from "@/lib/mail/format";
import addressparser from "nodemailer/lib/addressparser";

// Invented shop and quote.
const props: QuoteReadyEmailProps = {
  shopName: "Kestrel Bank Works",
  quoteNumber: "Q-2026-0042",
  revision: 1,
  total: "€12,345.60",
  quantity: 2,
  validUntil: "14 August 2026",
  quoteUrl: "http://127.0.0.1:3000/s/kestrel-bank-works/quotes/Q-2026-0042",
};

describe("quote-ready e-mail", () => {
  it("says which shop, which quote and revision, the total, the quantity and how long it holds", async () => {
    const html = await render(createElement(QuoteReadyEmail, props));
    expect(html).toContain("Kestrel Bank Works");
    // React separates adjacent text with empty comments; the reader sees one sentence
    expect(html.replace(/<!-- -->/g, "")).toContain("Your quote Q-2026-0042 is ready");
    const text = await render(createElement(QuoteReadyEmail, props), { plainText: true });
    expect(text).toContain("Q-2026-0042, revision 1");
    expect(text).toContain("€12,345.60");
    expect(text).toContain("2 banks");
    expect(text).toContain("14 August 2026");
  });

  it("links the quote page, in the button and written out", async () => {
    const html = await render(createElement(QuoteReadyEmail, props));
    const hrefs = [...html.matchAll(/href="([^"]+)"/g)].map((m) => m[1]);
    expect(hrefs.filter((h) => h === props.quoteUrl)).toHaveLength(2);
    const text = await render(createElement(QuoteReadyEmail, props), { plainText: true });
    expect(text).toContain(props.quoteUrl);
  });

  it("carries the safety line: an engineering estimate, codes and licensed practice decide", async () => {
    const text = await render(createElement(QuoteReadyEmail, props), { plainText: true });
    expect(text.replace(/\s+/g, " ")).toContain(SAFETY_LINE);
    expect(SAFETY_LINE).toMatch(/engineering estimate/);
    expect(SAFETY_LINE).toMatch(/Local electrical codes and licensed practice decide/);
  });

  it("lists the sell lines and the tax above the total", async () => {
    const text = await render(
      createElement(QuoteReadyEmail, {
        ...props,
        lines: [{ description: "Supercapacitor (EDLC) bank 48 V, 23.1 F", quantity: "2", unit: "banks", unitPrice: "€5,400.00", amount: "€10,800.00" }],
        totals: [
          { label: "Subtotal", value: "€10,800.00" },
          { label: "Tax (19 %)", value: "€2,052.00" },
        ],
      }),
      { plainText: true },
    );
    expect(text).toContain("Supercapacitor (EDLC) bank 48 V, 23.1 F: 2 banks × €5,400.00 = €10,800.00");
    expect(text.indexOf("Tax (19 %)")).toBeLessThan(text.indexOf("€12,345.60"));
  });

  it("says bank, not banks, for one", async () => {
    const text = await render(createElement(QuoteReadyEmail, { ...props, quantity: 1 }), { plainText: true });
    expect(text).toContain("1 bank");
    expect(text).not.toContain("1 banks");
  });

  it("escapes a shop name with markup instead of rendering it", async () => {
    const html = await render(createElement(QuoteReadyEmail, { ...props, shopName: "Volt & <b>Ohm</b> Works" }));
    expect(html).toContain("Volt &amp; &lt;b&gt;Ohm&lt;/b&gt; Works");
    expect(html).not.toContain("<b>Ohm</b>");
  });
});

describe("message details", () => {
  it("Message-ID is stable per outbox row and shaped as RFC 5322 §3.6.4 msg-id: <id-left@id-right>", () => {
    const id = "0b6f3a0e-8d5c-4c39-9a57-2f1f4a0d9e11";
    const a = outboxMessageId(id, "Faradsmith <quotes@faradsmith.example>");
    expect(a).toBe(`<outbox-${id}@faradsmith.example>`);
    expect(outboxMessageId(id, "Faradsmith <quotes@faradsmith.example>")).toBe(a);
    expect(a).toMatch(/^<[^<>@\s]+@[^<>@\s]+>$/);
    expect(senderDomain("quotes@shop.example")).toBe("shop.example");
    expect(senderDomain("no address")).toBe("faradsmith.invalid");
  });

  // read back with nodemailer's own RFC 5322 address parser (nodemailer/lib/addressparser)
  it.each([
    ["Kestrel Bank Works", "Faradsmith <quotes@faradsmith.example>", "Kestrel Bank Works via Faradsmith"],
    ["Marlow Pulse Ltd.", "Faradsmith <quotes@faradsmith.example>", "Marlow Pulse Ltd. via Faradsmith"],
    ['Smith "& Sons", Coils', '"Quotes Desk" <q@x.example>', "Smith & Sons, Coils via Quotes Desk"],
    ["Kestrel Bank Works", "quotes@faradsmith.example", "Kestrel Bank Works via Faradsmith"],
  ])("a shop's mail is sent as %j through the product's address", (shop, from, name) => {
    const [parsed] = addressparser(shopSenderAddress(shop, from)) as { name: string; address: string }[];
    expect(parsed).toEqual({ name, address: /<([^>]+)>/.exec(from)?.[1] ?? from });
  });

  it("validity dates read as stored, whatever the server's time zone", () => {
    expect(formatValidity("2026-08-14")).toBe("14 August 2026");
    expect(formatValidity("2026-01-01")).toBe("1 January 2026");
    expect(formatValidity("not a date")).toBe("not a date");
  });

  it("the quote page address has the shop and the number, one slash after the host", () => {
    expect(quotePageUrl("http://127.0.0.1:3000/", "kestrel-bank-works", "Q-2026-0042")).toBe("http://127.0.0.1:3000/s/kestrel-bank-works/quotes/Q-2026-0042");
  });
});
