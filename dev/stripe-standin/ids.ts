import { randomBytes } from "node:crypto";

const ALPHABET = "0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz";

/** Random base-62 characters, as in Stripe's ids. */
function randomChars(n: number): string {
  const bytes = randomBytes(n * 2);
  let out = "";
  for (let i = 0; i < n; i++) out += ALPHABET[((bytes[2 * i] as number) * 256 + (bytes[2 * i + 1] as number)) % 62];
  return out;
}

/**
 * Ids with Stripe's prefixes and lengths (lengths as seen in test-mode objects): checkout sessions
 * `cs_test_` + 58, most objects prefix + 24, products `prod_` + 14, requests `req_` + 14.
 */
export const newId = {
  checkoutSession: () => `cs_test_${randomChars(58)}`,
  paymentIntent: () => `pi_${randomChars(24)}`,
  charge: () => `ch_${randomChars(24)}`,
  refund: () => `re_${randomChars(24)}`,
  event: () => `evt_${randomChars(24)}`,
  lineItem: () => `li_${randomChars(24)}`,
  price: () => `price_${randomChars(24)}`,
  product: () => `prod_${randomChars(14)}`,
  paymentMethod: () => `pm_${randomChars(24)}`,
  request: () => `req_${randomChars(14)}`,
  secret: () => randomChars(25),
};
