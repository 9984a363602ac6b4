import { z } from "zod";
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject, type ZodOpenApiResponsesObject } from "zod-openapi";
import { API_KEY_SCOPE_LABELS, API_KEY_SCOPES } from "@/lib/auth/api-key-scopes";
import { API_TAGS, type ApiExample, type RefusalContract, type RouteContract } from "./contract";
import { CONTRACTS } from "./contracts";
import { EXAMPLE_SHOP } from "./contracts/shared";
import { apiErrorSchema } from "./errors";
import { webhookEventSchema } from "@/lib/validation/webhooks";
import { SHOP_EVENT_LABELS, SHOP_EVENT_TYPES } from "@/lib/vocabulary";
import { WEBHOOK_HEADERS } from "@/lib/webhooks/signature";

/** The origin examples use when the caller names none (the local `npm start`). */
export const DEFAULT_API_ORIGIN = "http://127.0.0.1:3000";

/** The name of the session cookie sign-in sets over plain HTTP (over HTTPS it is prefixed `__Secure-`). */
const SESSION_COOKIE = "better-auth.session_token";
const EXAMPLE_SIGN_IN = { email: "ottilie.brandvold@kestrel-bank-works.example", password: "faradsmith-demo-2026" };

const shellQuote = (s: string) => `'${s.replace(/'/g, `'\\''`)}'`;

function exampleUrl(origin: string, contract: RouteContract, example: ApiExample): string {
  const path = contract.path.replace(/\{([^}]+)\}/g, (_, name: string) => encodeURIComponent(example.params?.[name] ?? `{${name}}`));
  const query = example.query ? `?${new URLSearchParams(example.query).toString()}` : "";
  return `${origin}${path}${query}`;
}

/** An example as one curl command (the reference page shows it; the browser tests run it). */
export function curlCommand(origin: string, contract: RouteContract, example: ApiExample): string {
  const parts = [`curl -s${contract.method !== "GET" ? ` -X ${contract.method}` : ""} ${shellQuote(exampleUrl(origin, contract, example))}`];
  if (contract.access !== "public") parts.push("-b cookies.txt");
  if (example.json !== undefined) parts.push("-H 'content-type: application/json'", `-d ${shellQuote(JSON.stringify(example.json))}`);
  if (example.text !== undefined)
    parts.push(`-H ${shellQuote(`content-type: ${contract.body?.text?.[0] ?? "text/plain"}`)}`, `--data-binary ${shellQuote(example.text)}`);
  for (const [name, value] of Object.entries(example.form ?? {})) parts.push(`-F ${shellQuote(`${name}=${value}`)}`);
  if (example.output) parts.push(`-o ${shellQuote(example.output)}`);
  return parts.join(" \\\n  ");
}

/** How a program signs in for the member routes: the session cookie lands in cookies.txt. */
export function signInCommand(origin: string, email = EXAMPLE_SIGN_IN.email): string {
  return [
    "curl -s -c cookies.txt",
    shellQuote(`${origin}/api/auth/sign-in/email`),
    "-H 'content-type: application/json'",
    `-d ${shellQuote(JSON.stringify({ ...EXAMPLE_SIGN_IN, email }))}`,
  ].join(" \\\n  ");
}

function overview(origin: string): string {
  return [
    "Faradsmith's engine, a shop's arrangements and its quotes, for a shop's own systems and for design tools. Every answer is JSON unless it is a file; every number is in SI units (F, V, Ω, A, J, W, s, kg, m³) and every amount of money a decimal string in the shop's currency.",
    "",
    "**Errors.** A refusal is `{ error, issues? }` with an honest status: 400 for bad input (`issues` names each field, e.g. `network.children[0].capacitance`), 401 signed out, 403 not allowed (or a write sent by a page of another site), 404 not found (another shop's or another customer's record is not found, never forbidden), 409 conflict, 429 too many requests with `Retry-After`.",
    "",
    `**Signing in.** The engine and arrangement routes are open to anyone and rate-limited per client. Shop routes need a member's session: sign in once and send the cookie (\`${SESSION_COOKIE}\`) with every call.`,
    "",
    "```sh",
    signInCommand(origin),
    "```",
    "",
    `**API keys.** A shop's own systems can instead send a key the shop's manager creates on the desk (API keys), shown once: \`Authorization: Bearer <key>\`. A key belongs to one shop and carries scopes (${API_KEY_SCOPES.map((s) => `\`${s}\``).join(", ")}); each route below that takes a key names the scope it needs, and the others do not take one. An unknown or revoked key is a 401, a key without the scope a 403, and each key has its own rate limit (429 with \`Retry-After\`). Every call with a key is in the shop's audit log.`,
    "",
    "```sh",
    `curl -s ${shellQuote(`${origin}/api/v1/shops/${EXAMPLE_SHOP}/cells`)} \\\n  -H "authorization: Bearer $FARADSMITH_API_KEY"`,
    "```",
    "",
    "**Outbound webhooks.** A shop's manager registers endpoints on the desk (Webhooks) and picks the events each hears of; every delivery is a signed POST described under Webhooks below, and how to check the signature is in the Webhooks section at the foot of this page.",
  ].join("\n");
}

function description(contract: RouteContract, origin: string): string {
  const lines = [contract.description];
  if (contract.access === "member")
    lines.push(
      "",
      contract.apiKey
        ? `Needs a member's session (see Signing in), or a shop API key with the scope \`${contract.apiKey}\` (${API_KEY_SCOPE_LABELS[contract.apiKey].toLowerCase()}).`
        : "Needs a member's session (see Signing in); an API key cannot call it.",
    );
  if (contract.access === "open") lines.push("", "Open to anyone; a member's session, when sent, may see more (see Signing in).");
  for (const example of contract.examples ?? []) lines.push("", `**Example: ${example.title}**`, "", "```sh", curlCommand(origin, contract, example), "```");
  return lines.join("\n");
}

/** The refusals a key adds to a route that takes one (a bad key, a missing scope, the key's own rate limit). */
function withKeyRefusals(contract: RouteContract): [string, RefusalContract][] {
  const errors: Partial<Record<string, RefusalContract>> = { ...contract.errors };
  if (contract.apiKey) {
    const add = (status: string, sentence: string) => {
      const was = errors[status];
      errors[status] =
        was === undefined ? sentence : typeof was === "string" ? `${was} ${sentence}` : { ...was, description: `${was.description} ${sentence}` };
    };
    add("401", "With a key: the key is unknown or has been revoked.");
    add("403", `With a key: the key does not hold \`${contract.apiKey}\`.`);
    add("429", "With a key: too many calls with this key this minute; Retry-After says when to try again.");
  }
  return Object.entries(errors).filter((e): e is [string, RefusalContract] => e[1] !== undefined);
}

function responses(contract: RouteContract): ZodOpenApiResponsesObject {
  const out: ZodOpenApiResponsesObject = {};
  const ok = contract.ok;
  out[String(ok.status) as "200"] = ok.json
    ? { description: ok.description, content: { "application/json": { schema: ok.json } } }
    : ok.file
      ? {
          description: ok.description,
          content: Object.fromEntries(ok.file.map((type) => [type, { schema: { type: "string", contentMediaType: type } }])),
        }
      : { description: ok.description };
  if (contract.pending) out["202"] = { description: contract.pending.description, content: { "application/json": { schema: contract.pending.json } } };
  for (const [status, refusal] of withKeyRefusals(contract)) {
    out[status as "400"] = {
      description: typeof refusal === "string" ? refusal : refusal.description,
      content: { "application/json": { schema: typeof refusal === "string" ? apiErrorSchema : refusal.json } },
      ...(status === "429" ? { headers: z.object({ "retry-after": z.string().meta({ description: "seconds to wait" }) }) } : {}),
    };
  }
  return out;
}

/** Who may call: nobody signed in, a session optionally, or a session (or a key with its scope). */
function security(contract: RouteContract): Record<string, string[]>[] {
  if (contract.access === "public") return [];
  if (contract.access === "open") return [{}, { session: [] }];
  return [{ session: [] }, ...(contract.apiKey ? [{ apiKey: [contract.apiKey] }] : [])];
}

function operation(contract: RouteContract, origin: string): ZodOpenApiOperationObject {
  const firstJson = contract.examples?.find((e) => e.json !== undefined)?.json;
  return {
    operationId: contract.operationId,
    tags: [contract.tag],
    summary: contract.summary,
    description: description(contract, origin),
    security: security(contract),
    ...(contract.params || contract.query
      ? { requestParams: { ...(contract.params ? { path: contract.params } : {}), ...(contract.query ? { query: contract.query } : {}) } }
      : {}),
    ...(contract.body?.json
      ? {
          requestBody: {
            required: true,
            content: { "application/json": { schema: contract.body.json, ...(firstJson !== undefined ? { example: firstJson } : {}) } },
          },
        }
      : contract.body?.multipart
        ? { requestBody: { required: true, content: { "multipart/form-data": { schema: contract.body.multipart } } } }
        : contract.body?.text
          ? {
              requestBody: {
                required: true,
                content: Object.fromEntries(contract.body.text.map((type) => [type, { schema: { type: "string", contentMediaType: type } }])),
              },
            }
          : {}),
    responses: responses(contract),
    "x-codeSamples": (contract.examples ?? []).map((example) => ({ lang: "curl", label: example.title, source: curlCommand(origin, contract, example) })),
  };
}

/** One outbound event as OpenAPI 3.1 describes a webhook: the POST a shop's endpoint receives. */
function webhookOperation(type: (typeof SHOP_EVENT_TYPES)[number]): ZodOpenApiOperationObject {
  return {
    operationId: `webhook.${type}`,
    summary: `${type}: ${SHOP_EVENT_LABELS[type]}`,
    description:
      "Sent to every active endpoint that takes this event, at least once: answer 2xx within 10 s, and dedupe on the event id. Verify the signature over the raw body before trusting it.",
    requestParams: {
      header: z.object({
        [WEBHOOK_HEADERS.eventId]: z.uuid().meta({ description: "the event's stable id (also `id` in the body)" }),
        [WEBHOOK_HEADERS.eventType]: z.literal(type),
        [WEBHOOK_HEADERS.deliveryId]: z.uuid().meta({ description: "this delivery; a replay is a new delivery of the same event" }),
        [WEBHOOK_HEADERS.timestamp]: z.string().meta({ description: "Unix time in seconds of this attempt" }),
        [WEBHOOK_HEADERS.signature]: z
          .string()
          .meta({ description: "`v1=` and the hex HMAC-SHA256 of `<timestamp>.<raw body>` with the endpoint's signing secret" }),
      }),
    },
    requestBody: { required: true, content: { "application/json": { schema: webhookEventSchema } } },
    responses: { 200: { description: "Any 2xx: delivered. Anything else, a timeout or a redirect is tried again with back-off." } },
  };
}

/**
 * The OpenAPI 3.1 description of every route in CONTRACTS, with `origin` in its server and curl
 * examples. Pure: no environment read; GET /api/v1/openapi.json passes the app's own origin.
 */
export function buildOpenApiDocument({ origin = DEFAULT_API_ORIGIN }: { origin?: string } = {}) {
  const paths: ZodOpenApiPathsObject = {};
  for (const contract of CONTRACTS) {
    const item = (paths[contract.path] ??= {});
    item[contract.method.toLowerCase() as "get"] = operation(contract, origin);
  }
  return createDocument({
    openapi: "3.1.0",
    info: { title: "Faradsmith API", version: "1", description: overview(origin) },
    servers: [{ url: origin }],
    tags: API_TAGS.map((t) => ({ ...t })),
    paths,
    webhooks: Object.fromEntries(SHOP_EVENT_TYPES.map((type) => [type, { post: webhookOperation(type) }])),
    components: {
      securitySchemes: {
        session: {
          type: "apiKey",
          in: "cookie",
          name: SESSION_COOKIE,
          description: `A member's session, from POST /api/auth/sign-in/email (shop ${EXAMPLE_SHOP}'s demo manager in the examples).`,
        },
        apiKey: {
          type: "http",
          scheme: "bearer",
          description: `A shop API key its manager created on the desk, sent as \`Authorization: Bearer <key>\`. The scopes a route asks for are the key's scopes: ${API_KEY_SCOPES.map((s) => `\`${s}\` (${API_KEY_SCOPE_LABELS[s].toLowerCase()})`).join(", ")}.`,
        },
      },
    },
  });
}

export type OpenApiDocument = ReturnType<typeof buildOpenApiDocument>;
