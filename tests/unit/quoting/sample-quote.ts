/**
 * A worded quote built the way the app builds one — the engine's search over one invented cell,
 * priced by the default rules — but without a database, for the PDF test and benchmark.
 * The cell, its maker "Brightwater Cells" and the shop are invented.
 */
import type { RevisionWithLines } from "@/db/queries/quotes";
import { DEFAULT_DESIGN_FACTORS, searchArrangements, type BalancingBoard, type EngineCell } from "@/lib/bank";
import type { PricedOption } from "@/lib/quoting/arrangements";
import { toQuoteDocument, type QuoteDocument } from "@/lib/quoting/quote-document";
import { DEFAULT_PRICING_RULES, priceBank } from "@/lib/pricing";

export const SAMPLE_CELL: EngineCell = {
  id: "00000000-0000-4000-8000-000000000001",
  sku: "BWC-3000-27",
  technology: "edlc",
  capacitance: 3000,
  toleranceMinus: 0,
  tolerancePlus: 0.2,
  ratedVoltage: 2.7,
  surgeVoltage: 2.85,
  esr: 0.00029,
  leakageCurrent: 0.0052,
  continuousCurrent: 130,
  peakCurrent: 1900,
  mass: 0.51,
  volume: 60.7 * 60.7 * 138 * 1e-9,
  unitCost: 38.5,
  stock: 400,
  leadTimeDays: 10,
};

export const SAMPLE_BOARD: BalancingBoard = { id: "00000000-0000-4000-8000-000000000004", sku: "BWC-BAL6", channels: 6, maxCellVoltage: 2.7, unitCost: 21.4, leadTimeDays: 7 };

export function sampleQuoteDocument(quantity = 2): QuoteDocument {
  const requirement = { maxVoltage: 48, minVoltage: 24, energy: 20_000, quantity };
  const found = searchArrangements({ requirement, cells: [SAMPLE_CELL], factors: DEFAULT_DESIGN_FACTORS, balancingBoards: [SAMPLE_BOARD] });
  const first = found.options[0];
  if (!first) throw new Error("the sample requirement found no option");
  const { cellId: _cellId, ...rest } = first;
  const price = priceBank(
    {
      cell: { sku: SAMPLE_CELL.sku, description: "Brightwater Cells BW-K", unitCost: "38.50" },
      cellCount: first.cellCount,
      balancingResistors: first.balancing.resistance !== null && first.balancing.count > 0 ? { count: first.balancing.count, resistance: first.balancing.resistance, powerRating: first.balancing.powerRating ?? 0.25 } : null,
      bleeder: first.discharge.bleeder ? { resistance: first.discharge.bleeder.resistance, power: first.discharge.bleeder.powerRating ?? first.discharge.bleeder.power } : null,
      activeBoards: first.balancing.activeBoard ? { sku: first.balancing.activeBoard.sku, count: first.balancing.activeBoard.count, unitCost: "21.40" } : null,
      volumeM3: first.volume,
      quantity,
    },
    DEFAULT_PRICING_RULES,
  );
  const option: PricedOption = { ...rest, price: { amount: price.total, currency: price.currency, perBank: price.unitPrice, quantity, tax: price.tax, subtotal: price.subtotal } };
  const rev = {
    revision: {
      id: "00000000-0000-4000-8000-000000000002",
      shopId: "shop-sample",
      quoteId: "00000000-0000-4000-8000-000000000003",
      revision: 1,
      requirement,
      arrangement: option as unknown as Record<string, unknown>,
      cell: { sku: SAMPLE_CELL.sku, manufacturer: "Brightwater Cells", series: "BW-K" },
      pricing: price as unknown as Record<string, unknown>,
      currency: price.currency,
      quantity,
      subtotal: price.subtotal,
      tax: price.tax,
      total: price.total,
      validUntil: "2026-03-02",
      createdByUserId: null,
      createdAt: new Date("2026-01-31T10:00:00Z"),
    },
    quoteNumber: "Q-2026-0042",
    quoteStatus: "issued" as const,
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
