import type { BankBill } from "@/lib/pricing";

/** An invented six-cell bank (invented part number) that the pricing tests work by hand. */
export const sixCellBill: BankBill = {
  cell: { sku: "QX-350F-2V7", description: "EDLC cell 350 F 2.7 V", unitCost: "6.40" },
  cellCount: 6,
  // resistor unit costs as the catalog's 0.25 W part and 2 W part carry them (invented)
  balancingResistors: { count: 6, resistance: 1000, powerRating: 0.25, sku: "RS-0W25", unitCost: "0.35" },
  bleeder: { resistance: 330, power: 2, sku: "RS-2W", unitCost: "1.80" },
  activeBoards: null,
  volumeM3: 0.000528,
  quantity: 10,
};
