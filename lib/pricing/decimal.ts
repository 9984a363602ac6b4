import Decimal from "decimal.js";

/**
 * The Decimal constructor used inside lib/pricing: 50 significant digits, so that a division
 * (price = cost / (1 − margin)) is never rounded twice before the final rounding to the
 * currency's minor unit. Instances are ordinary decimal.js values.
 */
export const Dec = Decimal.clone({ precision: 50, rounding: Decimal.ROUND_HALF_UP });

/** Plain decimal notation only: optional sign, digits, optional fraction. No exponents, no hex. */
const DECIMAL_STRING = /^[+-]?\d+(\.\d+)?$/;

export function isDecimalString(value: unknown): value is string {
  return typeof value === "string" && DECIMAL_STRING.test(value);
}

/** Parses a decimal string; throws a clear Error when it is not one. */
export function parseDecimal(value: string, what = "value"): Decimal {
  if (!isDecimalString(value)) {
    throw new Error(`${what} must be a decimal string like "12.50", got ${JSON.stringify(value)}`);
  }
  return new Dec(value);
}

export { Decimal };
