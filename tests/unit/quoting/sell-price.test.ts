/**
 * What a customer is shown of a price: sell prices only — the bank as one line, extra lines, the
 * quantity discount, tax and total — and never a cost, the overhead, labour or the margin, on the
 * quote page's document, in the PDF (as pdftotext reads it) or in the e-mail's lines.
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { DEFAULT_PRICING_RULES, priceBank, type BankBill } from "@/lib/pricing";
import { sellPresentation } from "@/lib/pricing/sell";
import { toCostBuildUp } from "@/lib/quoting/cost-build-up";
import { renderQuotePdfLayout } from "@/lib/quoting/quote-pdf-layout";
import { sampleQuoteDocument } from "./sample-quote";

const bill: BankBill = {
  cell: { sku: "QX-350F-2V7", description: "Quillon QX", unitCost: "6.40" },
  cellCount: 6,
  balancingResistors: { count: 6, resistance: 1000, powerRating: 0.25, sku: "RS-0W25", unitCost: "0.35" },
  bleeder: null,
  activeBoards: null,
  volumeM3: 0.000528,
  quantity: 10,
};

describe("sellPresentation", () => {
  it("shows the bank as one line at its price per bank, the break, tax and total of the frozen price", () => {
    const p = priceBank(bill, DEFAULT_PRICING_RULES);
    const s = sellPresentation(p, "EDLC bank 16 V, assembled and tested");
    expect(s.lines).toEqual([
      { description: "EDLC bank 16 V, assembled and tested", quantity: 10, unit: "banks", unitPrice: p.unitPrice, amount: expect.any(String) },
    ]);
    // 10 banks take the 7 % break of the default rules
    expect(s.discount).toEqual({ pct: "7", amount: p.discount });
    // the customer's arithmetic closes: Σ lines − discount = subtotal; subtotal + tax = total (cents, exact)
    const cents = (x: string) => Math.round(Number(x) * 100);
    expect(cents(s.lines[0]!.amount) - cents(p.discount)).toBe(cents(s.subtotal));
    expect(cents(s.subtotal) + cents(s.tax)).toBe(cents(s.total));
    expect(s.total).toBe(p.total);
  });

  it("adds the estimator's extra lines after the bank, at their own prices", () => {
    const p = priceBank(bill, DEFAULT_PRICING_RULES, [{ description: "Spare cell kit", quantity: 2, unit: "set", unitPrice: "35.50" }]);
    const s = sellPresentation(p, "Bank");
    expect(s.lines.map((l) => [l.description, l.amount])).toEqual([
      ["Bank", expect.any(String)],
      ["Spare cell kit", "71.00"],
    ]);
    const cents = (x: string) => Math.round(Number(x) * 100);
    expect(s.lines.reduce((a, l) => a + cents(l.amount), 0) - cents(p.discount)).toBe(cents(s.subtotal));
  });

  it("reads a price frozen before extra lines existed, with no break", () => {
    const { extras: _none, ...old } = priceBank({ ...bill, quantity: 1 }, DEFAULT_PRICING_RULES);
    const s = sellPresentation(old, "Bank");
    expect(s.lines).toHaveLength(1);
    expect(s.discount).toBeNull();
    expect(s.lines[0]!.amount).toBe(old.unitPrice);
  });
});

describe("the customer's quote never shows the shop's costs", () => {
  const doc = sampleQuoteDocument(2);
  // the sample's own cost figures, which must appear on the staff build-up and nowhere else
  const { option: _option, ...shown } = doc;
  const words = JSON.stringify(shown);

  it("the document has one bank line and no cost, overhead, labour or margin", () => {
    expect(doc.lines).toHaveLength(1);
    expect(doc.lines[0]!.description).toMatch(/^Supercapacitor \(EDLC\) bank rated 54 V, 150 F: 20 S × 1 P of BWC-3000-27 .*assembled and tested$/);
    for (const word of ["Overhead", "overhead", "Setup", "Assembly", "Labour", "labour", "interconnect", "Terminal set", "margin", "Margin", "38.50"])
      expect(words, word).not.toContain(word);
  });

  it("the PDF, read by pdftotext, has no cost line either", async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sell-pdf-"));
    const file = path.join(dir, "q.pdf");
    fs.writeFileSync(file, await renderQuotePdfLayout(doc));
    const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
    fs.rmSync(dir, { recursive: true, force: true });
    expect(text).toContain(doc.total);
    for (const word of ["Overhead", "Setup,", "Labour", "Cell interconnects", "Terminal set", "Margin"]) expect(text, word).not.toContain(word);
  });

  it("the staff build-up shows the costs and the margin in money: price − cost per bank", () => {
    const p = priceBank(bill, DEFAULT_PRICING_RULES);
    const b = toCostBuildUp(p);
    expect(b.lines.map((l) => l.description)).toContain("Cell interconnects");
    // price 448.21-style arithmetic by hand is in price-bank.test.ts; here: margin = unit price − cost
    const cents = (x: string) => Math.round(Number(x.replace(/[^\d.]/g, "")) * 100);
    expect(cents(b.marginPerBank)).toBe(cents(b.unitPrice) - cents(b.cost));
  });
});
