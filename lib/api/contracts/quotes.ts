import { z } from "zod";
import { defineRoute } from "@/lib/api/contract";
import { createQuoteRequestSchema, quoteCreatedResponseSchema, quoteInReviewResponseSchema, quoteRevisionResponseSchema } from "@/lib/validation/quote-api";
import { EXAMPLE_SHOP, REFUSED, shopParams } from "./shared";

const quoteParams = shopParams.extend({ number: z.string().meta({ description: "the quote number", example: "Q-2026-0001" }) });
const revisionParams = quoteParams.extend({ n: z.string().meta({ description: "the revision number, from 1", example: "2" }) });

export const createQuote = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/quotes",
  operationId: "createQuote",
  tag: "Quotes",
  summary: "Ask for a quote of one arrangement",
  description:
    "A requirement and the option chosen from it (as the arrangements endpoint lists it: cell SKU, topology, series and parallel counts) in. A signed-in customer asks for themselves; the shop's staff (or an API key with `quotes:write`) name the customer by `customerEmail`. Within the shop's auto-quote limits the quote is issued at once (201); beyond them, or when the option can no longer be priced, the request waits for the shop's estimators (202). The same `idempotencyKey` with the same body answers the same again (header `Idempotent-Replayed: true`); the key with another body is a 409. Rate-limited per client.",
  access: "member",
  apiKey: "quotes:write",
  params: shopParams,
  body: { json: createQuoteRequestSchema },
  ok: { status: 201, description: "The quote was issued: its number, revision and total.", json: quoteCreatedResponseSchema },
  pending: {
    status: 202,
    description: "The request waits for the shop's estimators, who are e-mailed; the customer hears by e-mail.",
    json: quoteInReviewResponseSchema,
  },
  errors: {
    400: "The body is wrong, the chosen option is not among the requirement's options, or staff named no customer of this shop: `issues` names the field.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notMember} A customer may not name another customer. ${REFUSED.crossSite}`,
    404: REFUSED.noShop,
    409: "This idempotency key was used with another body.",
    429: REFUSED.rateLimited,
  },
  examples: [
    {
      title: "A 48 V bank of 20 cells in series, for a named customer",
      params: { shop: EXAMPLE_SHOP },
      json: {
        requirement: { maxVoltage: 48, minVoltage: 24, energy: 20000 },
        choice: { sku: "QFS-0650R27", topology: "series-of-parallel-groups", seriesCount: 20, parallelCount: 1 },
        idempotencyKey: "erp-order-4711",
        customerEmail: "renske.haddow@tollmere-tramways.example",
      },
    },
  ],
});

const readDescription =
  "arrangement (a custom bank's tree of groups and parts included), the sell-price lines, totals (the quantity break, an estimator's discount with its reason, tax), its state and the quote's, validity and every revision's state. The quote's own customer and the shop's staff (or an API key with `quotes:read`); any other member of the shop gets 404.";

export const getQuote = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/quotes/{number}",
  operationId: "getQuote",
  tag: "Quotes",
  summary: "A quote's latest revision",
  description: `The latest revision of the quote: ${readDescription}`,
  access: "member",
  apiKey: "quotes:read",
  params: quoteParams,
  ok: { status: 200, description: "The latest revision.", json: quoteRevisionResponseSchema },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: "No such shop, or no such quote this member may see." },
});

export const getQuoteRevision = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/quotes/{number}/revisions/{n}",
  operationId: "getQuoteRevision",
  tag: "Quotes",
  summary: "One revision of a quote",
  description: `Revision \`n\` of the quote, as it was issued (revisions never change): ${readDescription}`,
  access: "member",
  apiKey: "quotes:read",
  params: revisionParams,
  ok: { status: 200, description: "The revision.", json: quoteRevisionResponseSchema },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: "No such shop, quote this member may see, or revision." },
});
