/**
 * Currencies and amounts as the stand-in checks them. Amounts are integers in the currency's
 * minor unit from ISO 4217 (the same table the app prices with, lib/pricing). The real service
 * treats a few currencies differently from ISO 4217 (for example HUF and TWD, which it charges in
 * whole units although ISO gives them two decimals — recalled from Stripe's currency docs); the
 * demo shops price in EUR and GBP, where the two agree.
 */
import { formatMoney, fromMinorUnits, isKnownCurrency } from "../../lib/pricing/currency";

/** Largest amount Stripe takes in one payment: 99,999,999 minor units (eight digits), from memory. */
export const MAX_AMOUNT = 99_999_999;

/**
 * Minimum amount of a payment in minor units, from Stripe's table of minimum charge amounts
 * (recalled from its docs, not from a published file). Currencies not listed need at least one
 * minor unit here.
 */
const MINIMUM_AMOUNT: Readonly<Record<string, number>> = {
  usd: 50,
  aud: 50,
  brl: 50,
  cad: 50,
  chf: 50,
  eur: 50,
  inr: 50,
  nzd: 50,
  sgd: 50,
  gbp: 30,
  aed: 200,
  bgn: 100,
  czk: 1500,
  dkk: 250,
  hkd: 400,
  huf: 17500,
  jpy: 50,
  mxn: 1000,
  myr: 200,
  nok: 300,
  pln: 200,
  ron: 200,
  sek: 300,
  thb: 1000,
};

export function isSupportedCurrency(code: string): boolean {
  return /^[a-z]{3}$/.test(code) && isKnownCurrency(code.toUpperCase());
}

export function minimumAmount(currency: string): number {
  return MINIMUM_AMOUNT[currency] ?? 1;
}

/** An integer count of minor units as an exact decimal string: (1234, "eur") → "12.34". */
export function minorToDecimal(amount: number, currency: string): string {
  return fromMinorUnits(amount, currency.toUpperCase());
}

/** For people: (1234, "eur") → "€12.34", with exactly the currency's minor digits. */
export function formatMinor(amount: number, currency: string): string {
  return formatMoney(minorToDecimal(amount, currency), currency.toUpperCase());
}
