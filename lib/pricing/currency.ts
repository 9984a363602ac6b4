import { Dec, Decimal, parseDecimal } from "./decimal";

/**
 * Minor units (decimal places) of the current currencies, from ISO 4217 list one
 * ("Current currency & funds code list", column "Minor unit"), as published by the ISO 4217
 * maintenance agency on 2026-01-01. Codes whose minor unit is "N.A." in the standard
 * (precious metals, SDR, bond-market units, XTS, XXX) are left out: nobody is quoted in them.
 * Withdrawn codes (e.g. HRK, BGN, ANG, SLL, CUC) are left out as well.
 */
const MINOR_UNITS_BY_DIGITS: Record<0 | 2 | 3 | 4, readonly string[]> = {
  0: ["BIF", "CLP", "DJF", "GNF", "ISK", "JPY", "KMF", "KRW", "PYG", "RWF", "UGX", "UYI", "VND", "VUV", "XAF", "XOF", "XPF"],
  2: [
    "AED",
    "AFN",
    "ALL",
    "AMD",
    "AOA",
    "ARS",
    "AUD",
    "AWG",
    "AZN",
    "BAM",
    "BBD",
    "BDT",
    "BMD",
    "BND",
    "BOB",
    "BOV",
    "BRL",
    "BSD",
    "BTN",
    "BWP",
    "BYN",
    "BZD",
    "CAD",
    "CDF",
    "CHE",
    "CHF",
    "CHW",
    "CNY",
    "COP",
    "COU",
    "CRC",
    "CUP",
    "CVE",
    "CZK",
    "DKK",
    "DOP",
    "DZD",
    "EGP",
    "ERN",
    "ETB",
    "EUR",
    "FJD",
    "FKP",
    "GBP",
    "GEL",
    "GHS",
    "GIP",
    "GMD",
    "GTQ",
    "GYD",
    "HKD",
    "HNL",
    "HTG",
    "HUF",
    "IDR",
    "ILS",
    "INR",
    "IRR",
    "JMD",
    "KES",
    "KGS",
    "KHR",
    "KPW",
    "KYD",
    "KZT",
    "LAK",
    "LBP",
    "LKR",
    "LRD",
    "LSL",
    "MAD",
    "MDL",
    "MGA",
    "MKD",
    "MMK",
    "MNT",
    "MOP",
    "MRU",
    "MUR",
    "MVR",
    "MWK",
    "MXN",
    "MXV",
    "MYR",
    "MZN",
    "NAD",
    "NGN",
    "NIO",
    "NOK",
    "NPR",
    "NZD",
    "PAB",
    "PEN",
    "PGK",
    "PHP",
    "PKR",
    "PLN",
    "QAR",
    "RON",
    "RSD",
    "RUB",
    "SAR",
    "SBD",
    "SCR",
    "SDG",
    "SEK",
    "SGD",
    "SHP",
    "SLE",
    "SOS",
    "SRD",
    "SSP",
    "STN",
    "SVC",
    "SYP",
    "SZL",
    "THB",
    "TJS",
    "TMT",
    "TOP",
    "TRY",
    "TTD",
    "TWD",
    "TZS",
    "UAH",
    "USD",
    "USN",
    "UYU",
    "UZS",
    "VED",
    "VES",
    "WST",
    "XCD",
    "XCG",
    "YER",
    "ZAR",
    "ZMW",
    "ZWG",
  ],
  3: ["BHD", "IQD", "JOD", "KWD", "LYD", "OMR", "TND"],
  4: ["CLF", "UYW"],
};

/** ISO 4217 alphabetic code → number of minor-unit digits. */
export const ISO_4217_MINOR_UNITS: Readonly<Record<string, number>> = Object.freeze(
  Object.fromEntries(
    (Object.entries(MINOR_UNITS_BY_DIGITS) as [string, readonly string[]][]).flatMap(([digits, codes]) => codes.map((code) => [code, Number(digits)] as const)),
  ),
);

export function isKnownCurrency(code: string): boolean {
  return Object.prototype.hasOwnProperty.call(ISO_4217_MINOR_UNITS, code);
}

/** Minor-unit digits of an ISO 4217 currency (JPY 0, EUR 2, KWD 3). Unknown code → throws. */
export function minorUnits(code: string): number {
  const digits = isKnownCurrency(code) ? ISO_4217_MINOR_UNITS[code] : undefined;
  if (digits === undefined) {
    const hint = typeof code === "string" && isKnownCurrency(code.toUpperCase()) ? ` (codes are upper case: "${code.toUpperCase()}")` : "";
    throw new Error(`Unknown currency code ${JSON.stringify(code)}: expected an ISO 4217 alphabetic code such as "EUR"${hint}`);
  }
  return digits;
}

function toDec(value: Decimal | string, what: string): Decimal {
  if (typeof value === "string") return parseDecimal(value, what);
  if (!Decimal.isDecimal(value) || !value.isFinite()) {
    throw new Error(`${what} must be a finite Decimal or a decimal string`);
  }
  return new Dec(value);
}

/**
 * Rounds to the currency's minor unit, half away from zero (ROUND_HALF_UP in decimal.js:
 * 0.005 → 0.01, −0.005 → −0.01). Half-up is common practice for commercial prices and
 * invoices; no bankers' rounding.
 */
export function roundMoney(value: Decimal | string, code: string): Decimal {
  const digits = minorUnits(code);
  const rounded = toDec(value, "amount").toDecimalPlaces(digits, Decimal.ROUND_HALF_UP);
  return rounded.isZero() ? new Dec(0) : rounded; // never "-0.00"
}

/** The money string for a value: rounded half-up, with exactly the currency's minor digits. */
export function moneyString(value: Decimal | string, code: string): string {
  return roundMoney(value, code).toFixed(minorUnits(code));
}

/**
 * Formats an amount for people, e.g. formatMoney("1234.5", "EUR") → "€1,234.50".
 * The number of decimals is always the ISO 4217 minor unit (some locale data show fewer,
 * e.g. IQD with none); the amount is rounded half-up first and passed to Intl as an exact
 * decimal string, so large amounts keep every digit.
 */
export function formatMoney(amount: string, code: string, locale = "en-GB"): string {
  const digits = minorUnits(code);
  const exact = moneyString(amount, code) as `${number}`;
  return new Intl.NumberFormat(locale, {
    style: "currency",
    currency: code,
    minimumFractionDigits: digits,
    maximumFractionDigits: digits,
  }).format(exact);
}

/**
 * The amount as an integer count of minor units, as payment providers take it
 * ("12.34" USD → 1234, "1200" JPY → 1200, "12.345" KWD → 12345).
 * Throws when the amount has more decimals than the currency allows (a charge must equal the
 * displayed total, so it is never rounded silently here) or is beyond the safe integer range.
 */
export function toMinorUnits(amount: Decimal | string, code: string): number {
  const digits = minorUnits(code);
  const value = toDec(amount, "amount");
  if (value.decimalPlaces() > digits) {
    throw new Error(`Amount ${value.toString()} has more decimals than ${code} allows (${digits}); round it first`);
  }
  const minor = value.times(new Dec(10).pow(digits));
  if (minor.abs().greaterThan(Number.MAX_SAFE_INTEGER)) {
    throw new Error(`Amount ${value.toString()} ${code} is too large to send as minor units`);
  }
  const result = minor.toNumber();
  return result === 0 ? 0 : result;
}

/**
 * An integer count of minor units as an exact decimal string with the currency's minor digits,
 * the inverse of toMinorUnits: (1234, "EUR") → "12.34", (1200, "JPY") → "1200", (12345, "KWD") → "12.345".
 */
export function fromMinorUnits(minor: number, code: string): string {
  if (!Number.isSafeInteger(minor)) throw new Error(`Minor units must be a safe integer, got ${minor}`);
  const digits = minorUnits(code);
  const value = new Dec(minor).dividedBy(new Dec(10).pow(digits));
  return (value.isZero() ? new Dec(0) : value).toFixed(digits);
}
