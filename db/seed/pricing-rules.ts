import type { PricingRules } from "@/lib/pricing/types";
import type { DemoShopSlug } from "./people";

/**
 * Each demo shop's own pricing rules (invented figures): Kestrel builds many low-voltage modules
 * from stock, Marlow fewer high-voltage banks that take longer to assemble and test. Enclosures are
 * each shop's own catalog enclosures (db/seed/catalog-*.ts), with their inner volumes.
 */
export const demoPricingRules: Record<DemoShopSlug, PricingRules> = {
  "kestrel-bank-works": {
    currency: "EUR",
    labourRatePerHour: "64.00",
    setupMinutes: 75,
    minutesPerCell: 5,
    testMinutes: 40,
    overheadPct: "10",
    marginPct: "26",
    taxRatePct: "19",
    interconnectCostPerCell: "1.95",
    balancingBoardCost: "38.00",
    terminalSetCost: "18.90",
    enclosures: [
      { name: "Extruded aluminium case, 4 L", maxVolumeM3: 0.004, cost: "45.00" },
      { name: "Extruded aluminium case, 20 L", maxVolumeM3: 0.02, cost: "118.00" },
      { name: "Sheet-steel module case, 60 L", maxVolumeM3: 0.06, cost: "265.00" },
      { name: "Sheet-steel rack enclosure, 200 L", maxVolumeM3: 0.2, cost: "610.00" },
    ],
    enclosurePackingFactor: 1.5,
    quantityBreaks: [
      { minQuantity: 5, discountPct: "3" },
      { minQuantity: 10, discountPct: "6" },
      { minQuantity: 25, discountPct: "9" },
      { minQuantity: 50, discountPct: "12" },
    ],
    quoteValidityDays: 30,
    depositPercent: 30,
  },
  "marlow-pulse": {
    currency: "GBP",
    labourRatePerHour: "58.00",
    setupMinutes: 120,
    minutesPerCell: 9,
    testMinutes: 90,
    overheadPct: "15",
    marginPct: "32",
    taxRatePct: "20",
    interconnectCostPerCell: "2.35",
    balancingBoardCost: "45.00",
    terminalSetCost: "37.50",
    enclosures: [
      { name: "Insulated steel case, 10 L", maxVolumeM3: 0.01, cost: "72.00" },
      { name: "Insulated steel case, 40 L", maxVolumeM3: 0.04, cost: "158.00" },
      { name: "Insulated steel cabinet, 120 L", maxVolumeM3: 0.12, cost: "395.00" },
      { name: "Floor-standing steel cabinet with interlocked door, 400 L", maxVolumeM3: 0.4, cost: "1240.00" },
    ],
    // high-voltage banks need clearance around every cell (common practice)
    enclosurePackingFactor: 1.8,
    quantityBreaks: [
      { minQuantity: 3, discountPct: "2" },
      { minQuantity: 10, discountPct: "5" },
    ],
    quoteValidityDays: 21,
    depositPercent: 40,
  },
};
