import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { certificateDocument, positionRows, travelerDocument, type OrderFacts } from "@/lib/orders/order-document";
import { renderCertificatePdf, renderTravelerPdf } from "@/lib/orders/order-pdf";
import { judgeTest, testLimitsOf } from "@/lib/orders/test-limits";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { SAMPLE_CATALOG } from "../quoting/sample-quote";

/** Text of a PDF as poppler's pdftotext (an independent PDF reader) extracts it. */
function pdfToText(buffer: Buffer): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "order-pdf-"));
  const file = path.join(dir, "order.pdf");
  fs.writeFileSync(file, buffer);
  try {
    return execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

function facts(): OrderFacts {
  const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity: 2 };
  const found = searchPricedOptions(SAMPLE_CATALOG, requirement);
  const option = found.options[0];
  const record = found.records[0];
  if (!option || !record) throw new Error("the sample requirement found no option");
  return {
    shopName: "Kestrel Bank Works",
    orderNumber: "O-2026-0007",
    quoteNumber: "Q-2026-0042",
    revision: 1,
    customerName: "Renske Haddow",
    customerEmail: "renske.haddow@tollmere-tramways.example",
    quantity: 2,
    dueDate: "2026-08-14",
    requirement,
    arrangement: option,
    cell: record.cell,
    safeVoltage: 60,
  };
}

describe("build traveler", () => {
  it("holds every position as the bank diagram numbers them, the resistors, the test limits and the safety block", async () => {
    const f = facts();
    const doc = travelerDocument(f);
    const text = pdfToText(await renderTravelerPdf(doc, f.shopName));
    expect(text).toContain("Build traveler O-2026-0007");
    const o = f.arrangement;
    const prefix = o.topology === "series-of-parallel-groups" ? "g" : "s";
    const rows = o.topology === "series-of-parallel-groups" ? o.seriesCount : o.parallelCount;
    for (let i = 1; i <= Math.min(rows, 20); i++) expect(text).toMatch(new RegExp(`\\b${prefix}${i}-c1\\b`));
    const limits = testLimitsOf(o, f.requirement);
    for (const step of doc.tests) expect(text.replace(/\s+/g, " ")).toContain(step.limit);
    expect(limits.positions.length).toBeGreaterThan(1);
    expect(text).toMatch(/short the terminals before touching/);
    expect(text).toMatch(/shorting link/);
    expect(text).toMatch(/local electrical codes and licensed practice decide/);
  });

  it("says hybrid cells are never shorted and ship partly charged", () => {
    const f = facts();
    const hybrid = { ...f, arrangement: { ...f.arrangement, cell: { ...f.arrangement.cell, technology: "hybrid" as const } } };
    const doc = travelerDocument(hybrid);
    expect(doc.safety.join(" ")).toMatch(/never shorted/);
    expect(doc.safety.join(" ")).toMatch(/partly charged/);
    expect(doc.safety.join(" ")).not.toMatch(/shorting link fitted/);
    expect(doc.tests.at(-1)?.step).toMatch(/never short/);
  });

  it("shortens a long position table in the middle and keeps the last positions", () => {
    const rows = positionRows({
      topology: "series-of-parallel-groups",
      seriesCount: 500,
      parallelCount: 40,
      balancing: { resistance: 1000, count: 500, activeBoard: null } as never,
    });
    expect(rows).toHaveLength(40);
    expect(rows[36]).toMatchObject({ position: "g37" });
    expect(rows[37]).toEqual({ gap: 461 });
    expect(rows.at(-1)).toMatchObject({ position: "g500", cells: "g500-c1, g500-c2, g500-c3 … g500-c40 (40 cells)" });
  });
});

describe("test certificate", () => {
  it("shows each bank's checks against their limits and how the limits were set", async () => {
    const f = facts();
    const limits = testLimitsOf(f.arrangement, f.requirement);
    const measured = {
      capacitance: limits.capacitance.nominal,
      esr: limits.esr.new,
      leakageCurrent: 0,
      holdMinutes: 90,
      positionVoltages: limits.positions.map(() => limits.positionVoltage.nominal),
    };
    const { checks, passed } = judgeTest(measured, limits);
    const tests = [1, 2].map((bank) => ({
      bank,
      createdAt: new Date("2026-08-10T09:00:00Z"),
      testedBy: "Ottilie Brandvold",
      isPassed: passed,
      checks,
      measured,
    }));
    const text = pdfToText(await renderCertificatePdf(certificateDocument(f, tests, "2026-08-11"), f.shopName));
    expect(text).toContain("Test certificate O-2026-0007");
    expect(text).toMatch(/Bank 1: PASSED/);
    expect(text).toMatch(/Bank 2: PASSED/);
    expect(text).toContain("How the limits were set");
    expect(text).toMatch(/within the cell's tolerance/);
  });
});
