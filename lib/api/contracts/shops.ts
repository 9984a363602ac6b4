import { z } from "zod";
import { defineRoute } from "@/lib/api/contract";
import { MAX_ATTACHMENT_SIZE_TEXT } from "@/lib/validation/limits";
import { arrangementAnswerSchema, arrangementRequestSchema } from "@/lib/validation/bank";
import { attachmentUploadSchema, storedAttachmentSchema } from "@/lib/validation/attachments";
import { memberList, memberPageSchema, quoteList, quotePageSchema } from "@/lib/validation/lists";
import { ALLOWED_ATTACHMENT_TYPES } from "@/lib/attachments/content-type";
import { EXAMPLE_SHOP, REFUSED, shopParams } from "./shared";

export const searchArrangements = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/arrangements",
  operationId: "searchArrangements",
  tag: "Arrangements",
  summary: "Buildable arrangements for a requirement",
  description:
    "A requirement in SI units (maximum voltage, and at least one of capacitance, usable energy or a constant-power backup) in; the best dozen arrangements the shop can build from its active catalog out, each with its electrical figures, balancing and safe-discharge sizing, cautions and sell price, ranked by price with the Pareto set over price, mass and volume marked. When nothing fits, `options` is empty and `reasons` says why. Open to anyone, rate-limited per client.",
  access: "public",
  params: shopParams,
  body: { json: arrangementRequestSchema },
  ok: { status: 200, description: "The shop's design factors and the ranked options.", json: arrangementAnswerSchema },
  errors: {
    400: "A field is wrong or missing (e.g. none of capacitance, energy or backup): `issues` names it.",
    404: REFUSED.noShop,
    429: REFUSED.rateLimited,
  },
  examples: [{ title: "48 V down to 24 V with 20 kJ usable", params: { shop: EXAMPLE_SHOP }, json: { maxVoltage: 48, minVoltage: 24, energy: 20000 } }],
});

export const listQuotes = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/quotes",
  operationId: "listQuotes",
  tag: "Quotes",
  summary: "The quotes a member may see",
  description:
    "A page of quotes: a customer's own, or all of the shop's for its staff. Searches the number and the customer; filters by status; sorts by any column. A value the list does not take is a 400 naming it.",
  access: "member",
  apiKey: "quotes:read",
  params: shopParams,
  query: quoteList.querySchema,
  ok: { status: 200, description: "A page of quotes.", json: quotePageSchema },
  errors: { 400: "A query value the list does not take: `issues` names it.", 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: REFUSED.noShop },
  examples: [{ title: "Sent quotes, largest total first", params: { shop: EXAMPLE_SHOP }, query: { status: "sent", sort: "total" } }],
});

export const quotePdf = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/quotes/{number}/pdf",
  operationId: "getQuotePdf",
  tag: "Quotes",
  summary: "A quote's current revision as a PDF",
  description:
    "The PDF the customer receives, for the customer the quote is for and for the shop's staff. Another customer's quote, or a number the shop does not have, is not found.",
  access: "member",
  apiKey: "quotes:read",
  params: shopParams.extend({ number: z.string().meta({ description: "the quote number", example: "Q-2026-0001" }) }),
  ok: { status: 200, description: "The PDF (Content-Disposition names the file).", file: ["application/pdf"] },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: "No such shop, or no such quote this member may see." },
});

export const listMembers = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/members",
  operationId: "listMembers",
  tag: "Team",
  summary: "The shop's members",
  description: "A page of the shop's members with their roles, for its managers. Searches names and e-mail addresses; filters by role.",
  access: "member",
  params: shopParams,
  query: memberList.querySchema,
  ok: { status: 200, description: "A page of members.", json: memberPageSchema },
  errors: { 400: "A query value the list does not take: `issues` names it.", 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: REFUSED.noShop },
  examples: [{ title: "Estimators", params: { shop: EXAMPLE_SHOP }, query: { role: "estimator" } }],
});

export const uploadAttachment = defineRoute({
  method: "POST",
  path: "/api/v1/shops/{shop}/attachments",
  operationId: "uploadAttachment",
  tag: "Requests",
  summary: "Attach a drawing or specification",
  description: `One file in a multipart field named \`file\`: PDF, PNG, JPEG or DXF, judged by its content (not its name), at most ${MAX_ATTACHMENT_SIZE_TEXT}. For the shop's customers; the answer's \`id\` goes in a request's attachments.`,
  access: "member",
  params: shopParams,
  body: { multipart: attachmentUploadSchema },
  ok: { status: 201, description: "The stored file.", json: storedAttachmentSchema },
  errors: {
    400: "Not multipart, no file, too large, or not one of the accepted kinds: `issues` names `file`.",
    401: REFUSED.signedOut,
    403: `${REFUSED.notMember} ${REFUSED.crossSite}`,
    404: REFUSED.noShop,
    413: "The person's or the shop's storage quota would be exceeded, or the person has too many files not yet sent with a request.",
    429: "Too many uploads by this person, or by the shop's people together, lately: `Retry-After` says when to try again.",
  },
  examples: [{ title: "Attach drawing.pdf (signed in as a customer)", params: { shop: EXAMPLE_SHOP }, form: { file: "@drawing.pdf" }, as: "customer" }],
});

export const downloadAttachment = defineRoute({
  method: "GET",
  path: "/api/v1/shops/{shop}/attachments/{id}",
  operationId: "downloadAttachment",
  tag: "Requests",
  summary: "An attached file",
  description: "The file, to the customer who uploaded it and to the shop's staff; anyone else in the shop gets 404, so ids cannot be probed.",
  access: "member",
  apiKey: "quotes:read",
  params: shopParams.extend({ id: z.string().meta({ description: "the attachment's id (a UUID)" }) }),
  ok: { status: 200, description: "The file as uploaded.", file: ALLOWED_ATTACHMENT_TYPES },
  errors: { 401: REFUSED.signedOut, 403: REFUSED.notMember, 404: "No such shop, or no such file this member may see." },
});
