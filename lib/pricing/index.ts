export type {
  BankBill,
  BankPrice,
  ExtraLine,
  ExtraLineInput,
  PriceBankResult,
  PriceLine,
  PriceLineCode,
  PriceLineKind,
  PricingErrorCode,
  PricingIssue,
  PricingRules,
} from "./types";
export { DEFAULT_PRICING_RULES, readPricingRules } from "./defaults";
export { ISO_4217_MINOR_UNITS, formatMoney, fromMinorUnits, isKnownCurrency, minorUnits, moneyString, roundMoney, toMinorUnits } from "./currency";
export { PricingError, priceBank, quickPrice, selectDiscountPct, selectEnclosure, tryPriceBank } from "./price-bank";
export {
  LINE_QUANTITY_DECIMALS,
  MAX_LINE_QUANTITY,
  MAX_SHEET_LINES,
  priceSheet,
  tryPriceSheet,
  validatePriceSheet,
  type PriceSheet,
  type PriceSheetInput,
  type SheetDiscountInput,
  type SheetLine,
  type SheetLineInput,
} from "./price-sheet";
export { validateBankBill, validateExtraLines, validatePricingRules } from "./validate";
