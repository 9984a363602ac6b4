import { render } from "@react-email/render";
import { createElement, type ReactElement } from "react";
import { describe, expect, it } from "vitest";
import { OrderConfirmedEmail, orderConfirmedSubject } from "@/emails/order-confirmed";
import { OrderDeliveredEmail } from "@/emails/order-delivered";
import { OrderReadyEmail } from "@/emails/order-ready";
import { OrderShippedEmail, orderShippedSubject } from "@/emails/order-shipped";
import { orderUrls } from "@/lib/orders/messages";
import { shippingNote } from "@/lib/orders/safety";

// Invented shop, order and carrier.
const urls = orderUrls("http://127.0.0.1:3000/", "kestrel-bank-works", "O-2026-0007");
const common = { shopName: "Kestrel Bank Works", orderNumber: "O-2026-0007", quoteNumber: "Q-2026-0042", orderUrl: urls.page };

const text = (e: ReactElement) => render(e, { plainText: true });

describe("order e-mails", () => {
  it("links the order page and the certificate where they are", () => {
    expect(urls.page).toBe("http://127.0.0.1:3000/s/kestrel-bank-works/orders/O-2026-0007");
    expect(urls.certificate).toBe("http://127.0.0.1:3000/api/v1/shops/kestrel-bank-works/orders/O-2026-0007/certificate");
  });

  it("confirms the order with what was received, the quote's total and the due date", async () => {
    const e = createElement(OrderConfirmedEmail, { ...common, paid: "€362.49", total: "€1,208.30", dueDate: "14 August 2026", quantity: 2 });
    const t = await text(e);
    expect(orderConfirmedSubject(common)).toBe("Order O-2026-0007 confirmed: payment received for quote Q-2026-0042");
    for (const s of ["O-2026-0007", "Q-2026-0042", "€362.49", "€1,208.30", "14 August 2026", "2 banks", urls.page]) expect(t).toContain(s);
    const html = await render(e);
    expect([...html.matchAll(/href="([^"]+)"/g)].filter((m) => m[1] === urls.page)).toHaveLength(2);
  });

  it("says the banks passed their tests and links the certificate", async () => {
    const t = await text(createElement(OrderReadyEmail, { ...common, quantity: 3, certificateUrl: urls.certificate }));
    expect(t).toContain("All 3 banks have passed the acceptance test");
    expect(t).toContain(urls.certificate);
  });

  it.each([
    ["edlc", /shorting link across its terminals/],
    ["film", /shorting link across its terminals/],
    ["hybrid", /must never be shorted/],
  ] as const)("ships a %s bank with the carrier, the tracking reference and how it travels", async (technology, travels) => {
    const t = await text(
      createElement(OrderShippedEmail, { ...common, carrier: "Tollway Freight", trackingReference: "TW-55812-KB", shippingNote: shippingNote(technology) }),
    );
    expect(orderShippedSubject({ orderNumber: "O-2026-0007", carrier: "Tollway Freight" })).toBe("Order O-2026-0007 has shipped with Tollway Freight");
    expect(t).toContain("TW-55812-KB");
    expect(t).toContain("Tollway Freight");
    expect(t).toMatch(travels);
  });

  it("says the order was delivered and carries the safety line", async () => {
    const t = await text(createElement(OrderDeliveredEmail, { ...common, certificateUrl: urls.certificate }));
    expect(t).toMatch(/Order O-2026-0007 was delivered/i);
    expect(t).toMatch(/local electrical codes and licensed practice decide/i);
  });
});
