import { defineRoute } from "@/lib/api/contract";
import { pricingRulesResponseSchema, putPricingRulesSchema } from "@/lib/validation/pricing";
import { EXAMPLE_SHOP, REFUSED, shopParams } from "./shared";

export const getPricingRules = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/pricing-rules",
  operationId: "getPricingRules",
  tag: "Pricing",
  summary: "The pricing rules in force",
  description:
    "The shop's whole rule set (labour rate and minutes, overhead and margin, quantity breaks, enclosures, tax, currency, quote validity, deposit), money as decimal strings and percentages as numbers, with the `version` it is (0: never changed since the shop opened), why it was saved and when. For the shop's staff.",
  access: "member",
  apiKey: "catalog:read",
  params: shopParams,
  ok: { status: 200, description: "The rules in force.", json: pricingRulesResponseSchema },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notStaff, 404: REFUSED.noShopForOutsiders },
  examples: [{ title: "The rules in force", params: { shop: EXAMPLE_SHOP } }],
});

export const putPricingRules = defineRoute({
  method: "PUT",
  path: "/api/v1/shops/{shop}/pricing-rules",
  operationId: "putPricingRules",
  tag: "Pricing",
  summary: "Save a new version of the pricing rules",
  description:
    "The whole rule set and the `reason` it changes, saved as a new version with who and when (the desk shows each version's changes field by field). New quotes price by it; issued quotes keep their prices. With `version` (from a GET), rules someone saved since are refused with 409 and nothing is written. For the shop's managers.",
  access: "member",
  apiKey: "catalog:write",
  params: shopParams,
  body: { json: putPricingRulesSchema },
  ok: { status: 200, description: "The rules in force now.", json: pricingRulesResponseSchema },
  errors: {
    400: "A rule is wrong or out of its bounds, or the reason is missing: `issues` names each field.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notStaff} ${REFUSED.crossSite}`,
    404: REFUSED.noShopForOutsiders,
    409: "The rules changed since the `version` sent: fetch them again and reapply the change.",
  },
});
