import { render } from "@react-email/render";
import { createElement } from "react";
import { describe, expect, it } from "vitest";
import { SAFETY_LINE } from "@/emails/quote-ready";
import { QuoteMessageEmail } from "@/emails/quote-message";
import { QuoteUpdatedEmail } from "@/emails/quote-updated";
import { ReviewNeededEmail } from "@/emails/review-needed";

// Invented shop, people and quote.
const quoteUrl = "http://127.0.0.1:3000/s/kestrel-bank-works/quotes/Q-2026-0042";
const text = async (el: React.ReactElement) => (await render(el, { plainText: true })).replace(/\s+/g, " ");
/** the HTML as a reader sees it: React's empty comments between text pieces removed */
const html = async (el: React.ReactElement) => (await render(el)).replace(/<!-- -->/g, "");
const hrefs = async (el: React.ReactElement) => [...(await render(el)).matchAll(/href="([^"]+)"/g)].map((m) => m[1]);

describe("quote-updated e-mail", () => {
  const props = {
    shopName: "Kestrel Bank Works",
    quoteNumber: "Q-2026-0042",
    revision: 2,
    total: "€11,950.00",
    previousTotal: "€12,345.60",
    quantity: 2,
    validUntil: "14 August 2026",
    note: "Freight added; a 5 % discount for the repeat order.",
    changes: ["Total: €12,345.60 → €11,950.00", "Added: Pallet freight (€85.00)"],
    quoteUrl,
  };
  it("says which revision replaces which, the new total beside the old, the note, what changed, and links the page", async () => {
    const t = await text(createElement(QuoteUpdatedEmail, props));
    expect(await html(createElement(QuoteUpdatedEmail, props))).toContain("Quote Q-2026-0042 has been updated");
    expect(t).toContain("revision 2");
    expect(t).toContain("€11,950.00 (was €12,345.60)");
    expect(t).toContain(props.note);
    for (const c of props.changes) expect(t).toContain(c);
    expect(t).toContain(SAFETY_LINE);
    expect((await hrefs(createElement(QuoteUpdatedEmail, props))).filter((h) => h === quoteUrl)).toHaveLength(2);
  });
  it("leaves out the old total when it did not change, and the note when there is none", async () => {
    const t = await text(createElement(QuoteUpdatedEmail, { ...props, previousTotal: props.total, note: "", changes: [] }));
    expect(t).not.toContain("(was");
    expect(t).not.toContain("What changed");
  });
});

describe("quote-message e-mail", () => {
  const base = {
    shopName: "Kestrel Bank Works",
    quoteNumber: "Q-2026-0042",
    authorName: "Renske Haddow",
    body: "Could it fit 30 L?\nThe cabinet is small.",
    quoteUrl,
  };
  it("tells the shop what the customer wrote, with the message as written, and links the desk", async () => {
    const el = createElement(QuoteMessageEmail, {
      ...base,
      to: "shop",
      what: "asks for a change",
      quoteUrl: "http://127.0.0.1:3000/desk/kestrel-bank-works/quotes/Q-2026-0042",
    });
    const t = await text(el);
    expect(await html(el)).toContain("Renske Haddow asks for a change on Q-2026-0042");
    expect(t).toContain("Could it fit 30 L? The cabinet is small.");
    expect(await hrefs(el)).toContain("http://127.0.0.1:3000/desk/kestrel-bank-works/quotes/Q-2026-0042");
  });
  it("shows markup a customer typed as text, never as markup", async () => {
    const html = await render(
      createElement(QuoteMessageEmail, { ...base, to: "customer", authorName: "Casimir", what: "wrote", body: "<script>alert(1)</script>" }),
    );
    expect(html).not.toContain("<script>alert(1)</script>");
    expect(html).toContain("&lt;script&gt;");
  });
});

describe("review-needed e-mail", () => {
  it("gives the staff the whole requirement, why it came to review, the notes and the number of files, and links the workbench", async () => {
    const el = createElement(ReviewNeededEmail, {
      shopName: "Kestrel Bank Works",
      customerName: "Tobin Searle",
      requirement: "20 kV, 1 F, 1 bank",
      reasons: ["Voltage 20 kV is above the 1 kV this shop quotes automatically."],
      notes: "Outdoor cabinet, see drawing.",
      attachments: 1,
      workbenchUrl: "http://127.0.0.1:3000/desk/kestrel-bank-works/requests/0b6f3a0e-8d5c-4c39-9a57-2f1f4a0d9e11",
    });
    const t = await text(el);
    expect(await html(el)).toContain("A request from Tobin Searle needs review");
    expect(t).toContain("20 kV, 1 F, 1 bank");
    expect(t).toContain("Voltage 20 kV is above");
    expect(t).toContain("Outdoor cabinet, see drawing.");
    expect(t).toContain("1 file");
    expect(await hrefs(el)).toContain("http://127.0.0.1:3000/desk/kestrel-bank-works/requests/0b6f3a0e-8d5c-4c39-9a57-2f1f4a0d9e11");
  });
});
