export type { BankBill, BankPrice, PriceBankResult, PriceLine, PriceLineCode, PriceLineKind, PricingErrorCode, PricingIssue, PricingRules } from "./types";
export { DEFAULT_PRICING_RULES } from "./defaults";
export { ISO_4217_MINOR_UNITS, formatMoney, fromMinorUnits, isKnownCurrency, minorUnits, moneyString, roundMoney, toMinorUnits } from "./currency";
export { PricingError, priceBank, quickPrice, selectDiscountPct, selectEnclosure, tryPriceBank } from "./price-bank";
export { validateBankBill, validatePricingRules } from "./validate";
