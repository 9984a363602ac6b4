import type { PricingRules } from "./types";

/**
 * Plausible starting rules for a new shop (invented figures, EUR). Every shop edits its own.
 * Enclosure volumes are inner volumes in m³ (2 L, 8 L, 30 L, 120 L).
 */
export const DEFAULT_PRICING_RULES: Readonly<PricingRules> = Object.freeze({
  currency: "EUR",
  labourRatePerHour: "68.00",
  setupMinutes: 90,
  minutesPerCell: 6,
  testMinutes: 45,
  overheadPct: "12",
  marginPct: "28",
  taxRatePct: "20",
  interconnectCostPerCell: "1.80",
  balancingBoardCost: "18.50",
  terminalSetCost: "24.00",
  enclosures: [
    { name: "Enclosure S, 2 L", maxVolumeM3: 0.002, cost: "38.00" },
    { name: "Enclosure M, 8 L", maxVolumeM3: 0.008, cost: "72.00" },
    { name: "Enclosure L, 30 L", maxVolumeM3: 0.03, cost: "145.00" },
    { name: "Cabinet XL, 120 L", maxVolumeM3: 0.12, cost: "390.00" },
  ],
  enclosurePackingFactor: 1.6,
  quantityBreaks: [
    { minQuantity: 5, discountPct: "4" },
    { minQuantity: 10, discountPct: "7" },
    { minQuantity: 25, discountPct: "10" },
  ],
  quoteValidityDays: 30,
  depositPercent: 0,
});

/**
 * Rules as stored, read the way they are used today: a rule set saved before a field existed gets
 * that field's meaning of "nothing" (no deposit). Pure; db/queries reads every stored rule set
 * through it.
 */
export function readPricingRules(stored: Omit<PricingRules, "depositPercent"> & { depositPercent?: number }): PricingRules {
  return { ...stored, depositPercent: stored.depositPercent ?? 0 };
}
