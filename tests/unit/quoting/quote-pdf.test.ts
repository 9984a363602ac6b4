import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { pdfText, quotePdfFileName, renderQuotePdfLayout } from "@/lib/quoting/quote-pdf-layout";
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

  it("prints Ω as Ohm, which the shipped Latin font can draw", () => {
    expect(pdfText("290 µΩ")).toBe("290 µOhm");
  });

  it("names the file by number and revision", () => {
    expect(quotePdfFileName("Q-2026-0001", 1)).toBe("Q-2026-0001-r1.pdf");
  });
});
