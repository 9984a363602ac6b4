import { buildOpenApiDocument } from "@/lib/api/document";
import { openApiDescription as contract } from "@/lib/api/contracts/description";
import { env } from "@/lib/env";

let cached: { origin: string; document: ReturnType<typeof buildOpenApiDocument> } | null = null;

/** GET /api/v1/openapi.json — the OpenAPI 3.1 description of every route, generated from the contracts (lib/api/contracts). */
export async function GET(_request: Request) {
  const origin = new URL(env.APP_URL).origin;
  if (cached?.origin !== origin) cached = { origin, document: buildOpenApiDocument({ origin }) };
  // zod-openapi types the document with its own interfaces; the tests check it against the contract
  return contract.answer(cached.document as unknown as Parameters<typeof contract.answer>[0], { headers: { "cache-control": "public, max-age=300" } });
}
