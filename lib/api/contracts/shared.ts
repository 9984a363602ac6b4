import { z } from "zod";

/** The shop a route works in, by the address name in its storefront URL (`/s/{shop}`). */
export const shopParams = z.object({
  shop: z.string().min(1).meta({ description: "the shop's address name, as in its storefront URL /s/{shop}", example: "kestrel-bank-works" }),
});

/** The demo shop the examples use. */
export const EXAMPLE_SHOP = "kestrel-bank-works";

/** The refusal texts routes share. */
export const REFUSED = {
  signedOut: "Not signed in (no session cookie, or it has expired).",
  notMember: "Signed in, but not a member of this shop, or the role may not do this.",
  noShop: "No shop has this address.",
  rateLimited: "Too many requests from this client this minute; the Retry-After header says when to try again.",
  crossSite: "A write sent by a page of another site (Origin or Sec-Fetch-Site names another site) is refused here too.",
  /** staff routes (`{ outsiders: "not-found" }`): a customer is refused, another shop's member is not told the shop exists */
  notStaff: "Signed in, but not the shop's staff (a customer), or the role may not do this.",
  noShopForOutsiders: "No such shop, or the caller is not one of its members (another shop's staff are told the same).",
} as const;
