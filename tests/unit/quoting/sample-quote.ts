/**
 * A worded quote built the way the app builds one — an in-memory catalog searched and priced by
 * searchPricedOptions with the default design factors and pricing rules, the first option frozen
 * as a revision — but without a database, for the PDF test and benchmark.
 * The cell, its maker "Brightwater Cells", the board and the shop are invented.
 */
import type { RevisionWithLines } from "@/db/queries/quotes";
import { DEFAULT_DESIGN_FACTORS, DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank";
import { DEFAULT_PRICING_RULES } from "@/lib/pricing";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { searchPricedOptions } from "@/lib/quoting/priced-search";
import { toQuoteDocument, type QuoteDocument } from "@/lib/quoting/quote-document";
import type { CatalogCell, CatalogComponent, ShopCatalog } from "@/lib/quoting/types";

export const SAMPLE_CELL: CatalogCell = {
  id: "00000000-0000-4000-8000-000000000001",
  sku: "BWC-3000-27",
  manufacturer: "Brightwater Cells",
  series: "BW-K",
  technology: "edlc",
  capacitanceF: 3000,
  toleranceMinusPct: 0,
  tolerancePlusPct: 20,
  ratedVoltageV: 2.7,
  surgeVoltageV: 2.85,
  esrOhm: 0.00029,
  leakageCurrentA: 0.0052,
  continuousCurrentA: 130,
  peakCurrentA: 1900,
  massKg: 0.51,
  shape: "cylinder",
  diameterMm: 60.7,
  lengthMm: null,
  widthMm: null,
  heightMm: 138,
  unitCost: "38.5000",
  stock: 400,
  leadTimeDays: 10,
  minVoltageV: null,
  ratedLifeHours: 1500,
  ratedLifeTemperatureC: 65,
  minTemperatureC: -40,
  maxTemperatureC: 65,
  thermalResistanceKPerW: 3.2,
  coldCapacitanceFactor: 0.9,
  coldEsrFactor: 2,
};

export const SAMPLE_BOARD: CatalogComponent = {
  id: "00000000-0000-4000-8000-000000000004",
  kind: "balancing-board",
  sku: "BWC-BAL6",
  name: "Balancing board, 6 channels",
  unitCost: "21.4000",
  specs: { channels: 6, maxCellVoltage: 2.7 },
  leadTimeDays: 7,
};

/** Resistors of four power classes (invented parts), priced by class. */
export const SAMPLE_RESISTORS: CatalogComponent[] = [
  ["BWC-R0W25", 0.25, "0.3500"],
  ["BWC-R1W", 1, "0.6000"],
  ["BWC-R5W", 5, "1.9000"],
  ["BWC-R25W", 25, "6.5000"],
].map(([sku, w, cost], i) => ({
  id: `00000000-0000-4000-8000-00000000010${i}`,
  kind: "resistor",
  sku: String(sku),
  name: `Resistor ${String(w)} W`,
  unitCost: String(cost),
  specs: { powerRatingW: Number(w) },
  leadTimeDays: 2,
}));

export const SAMPLE_CATALOG: ShopCatalog = {
  factors: DEFAULT_DESIGN_FACTORS,
  rules: DEFAULT_PRICING_RULES,
  autoQuoteLimits: DEFAULT_AUTO_QUOTE_LIMITS,
  reliability: DEFAULT_RELIABILITY_SETTINGS,
  cells: [SAMPLE_CELL],
  components: [SAMPLE_BOARD, ...SAMPLE_RESISTORS],
};

export function sampleQuoteDocument(quantity = 2): QuoteDocument {
  const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity };
  const found = searchPricedOptions(SAMPLE_CATALOG, requirement);
  const option = found.options[0];
  const record = found.records[0];
  if (!option || !record?.price) throw new Error("the sample requirement found no priced option");
  const price = record.price;
  const rev = {
    revision: {
      id: "00000000-0000-4000-8000-000000000002",
      shopId: "shop-sample",
      quoteId: "00000000-0000-4000-8000-000000000003",
      revision: 1,
      requirement,
      arrangement: option,
      cell: record.cell,
      pricing: price,
      currency: price.currency,
      quantity,
      subtotal: price.subtotal,
      tax: price.tax,
      total: price.total,
      sheet: null,
      design: null,
      note: "",
      validUntil: "2026-03-02",
      createdByUserId: null,
      createdAt: new Date("2026-01-31T10:00:00Z"),
    },
    quoteNumber: "Q-2026-0042",
    quoteStatus: "sent" as const,
    customerUserId: "user-sample",
    customerName: "Ysolde Karminski",
    customerEmail: "ysolde.karminski@harrow-lift.example",
    shopName: "Ferrowick Bank Works",
    shopSlug: "ferrowick-bank-works",
    lines: price.lines.map((l, i) => ({
      id: `line-${i}`,
      shopId: "shop-sample",
      revisionId: "00000000-0000-4000-8000-000000000002",
      position: i + 1,
      code: l.code,
      kind: l.kind,
      description: l.description,
      quantity: String(l.quantity),
      unit: l.unit,
      unitPrice: l.unitPrice,
      amount: l.amount,
    })),
  } satisfies RevisionWithLines;
  return toQuoteDocument(rev);
}
