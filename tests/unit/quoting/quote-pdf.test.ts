import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { NOT_RECORDED, toQuoteEngineering } from "@/lib/quoting/quote-engineering";
import { pdfText, quotePdfFileName, renderQuotePdfLayout } from "@/lib/quoting/quote-pdf-layout";
import type { PricedOption } from "@/lib/quoting/types";
import { sampleQuoteDocument } from "./sample-quote";

/** Text of a PDF as poppler's pdftotext (an independent PDF reader) extracts it. */
function pdfToText(buffer: Buffer): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quote-pdf-"));
  const file = path.join(dir, "quote.pdf");
  fs.writeFileSync(file, buffer);
  try {
    return execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

describe("quote PDF", () => {
  it("is a PDF whose text, read by pdftotext, holds the number, revision, total and cautions", async () => {
    const doc = sampleQuoteDocument();
    const buffer = await renderQuotePdfLayout(doc);
    expect(buffer.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const text = pdfToText(buffer);
    expect(text).toContain("Q-2026-0042");
    expect(text).toContain("revision 1");
    expect(text).toContain(doc.total);
    expect(text).toContain("valid until 2026-03-02");
    expect(text).toMatch(/discharge it and short its terminals/);
    expect(text).toMatch(/engineering estimate/);
    for (const line of doc.lines) expect(text).toContain(line.amount);
  });

  it("holds the engineering sections as pdftotext reads them: one failed cell, tolerance yield, temperature and life, shipping", async () => {
    const doc = sampleQuoteDocument();
    const text = pdfToText(await renderQuotePdfLayout(doc)).replace(/\s+/g, " ");
    expect(text).toContain("How the bank fails and how long it lasts");
    // the frozen option's own verdicts, word for word
    expect(text).toContain(doc.option.failures.short.text);
    expect(text).toContain(doc.option.failures.open.text);
    expect(text).toContain("Tolerance yield");
    expect(text).toMatch(/10,000, seed 2026/);
    expect(text).toContain("Temperature and expected life");
    expect(text).toContain("Life doubles for each 10 °C below the rated 65 °C (common practice).");
    expect(text).toContain("UN 3499");
  });

  it("says so when a revision was frozen before these figures existed", async () => {
    const doc = sampleQuoteDocument();
    const { failures: _f, life: _l, handling: _h, yieldBasis: _y, ...old } = doc.option;
    const engineering = toQuoteEngineering({ maxVoltage: 48, minVoltage: 24, energy: 20_000 }, old as unknown as PricedOption);
    expect(engineering.failures).toBeNull();
    expect(engineering.tolerance).toBeNull();
    expect(engineering.lifeNote).toBe(NOT_RECORDED);
    const text = pdfToText(await renderQuotePdfLayout({ ...doc, engineering })).replace(/\s+/g, " ");
    expect(text).toContain(`One-cell failures: ${NOT_RECORDED}.`);
  });

  it("prints Ω itself, from the face's Greek file, and the Ohm sign U+2126 as its canonical equivalent Ω (Unicode NFC)", async () => {
    expect(pdfText("290 µ\u2126")).toBe("290 µΩ");
    expect(pdfText("290 µ\u2126")).toBe("290 µ\u2126".normalize("NFC"));
    const doc = sampleQuoteDocument();
    const text = pdfToText(await renderQuotePdfLayout(doc));
    // pdftotext reads the glyphs back through the fonts' own character maps
    expect(text).toMatch(/\d Ω/);
    expect(text).not.toMatch(/Ohm/);
  });

  it("names the file by number and revision", () => {
    expect(quotePdfFileName("Q-2026-0001", 1)).toBe("Q-2026-0001-r1.pdf");
  });
});
