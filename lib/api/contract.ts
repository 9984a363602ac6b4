import type { z } from "zod";
import type { ApiKeyScope } from "@/lib/auth/api-key-scopes";

/**
 * One route's contract, declared once beside the handler's area (lib/api/contracts/<area>.ts):
 * method, path, who may call it, its parameters and body as the zod schemas that validate them,
 * its answer as the zod schema that shapes it, and the refusals it can give. The OpenAPI
 * description (lib/api/document.ts), the reference page, the typed client and the drift checks
 * of the integration tests are all generated from these objects.
 */

/**
 * The refusals a route may answer, each with the one error body `{ error, issues? }` unless the
 * contract gives the status a body of its own (a CSV import's 422 lists its rows' errors).
 */
export const ERROR_STATUSES = [400, 401, 403, 404, 409, 413, 415, 422, 429] as const;
export type ErrorStatus = (typeof ERROR_STATUSES)[number];

/** When a route gives a refusal: a sentence (the body is the error body), or the sentence and the body's own schema. */
export type RefusalContract = string | { description: string; json: z.ZodType };

export type HttpMethod = "GET" | "POST" | "PUT" | "PATCH" | "DELETE";

/**
 * Who may call a route: anyone (rate-limited per client); anyone, with a member's session seeing
 * more (`open`); or a signed-in member of the shop (or a shop API key, when the contract names
 * the key's scope).
 */
export type RouteAccess = "public" | "open" | "member";

/** The reference page's sections, in their order. */
export const API_TAGS = [
  { name: "Engine", description: "Series/parallel networks: evaluation, one-cell failures, tolerance yield. Open to anyone, no shop." },
  { name: "Arrangements", description: "Buildable, priced arrangements from a shop's own catalog for a requirement." },
  { name: "Catalog", description: "A shop's cells: one at a time, as CSV (export, template, import with a dry run), and each cell's datasheet." },
  { name: "Pricing", description: "A shop's pricing rules: the set in force, and a new version with the reason it changes." },
  { name: "Quotes", description: "A shop's quotes: the list, asking for one, each quote's revisions as JSON, and its PDF." },
  { name: "Orders", description: "Paying for an accepted quote, and the orders it makes: their stages, history, traveler and test certificate." },
  { name: "Requests", description: "Drawings and specifications a customer attaches to a request." },
  { name: "Team", description: "The shop's members." },
  { name: "Description", description: "This description itself." },
] as const;
export type ApiTag = (typeof API_TAGS)[number]["name"];

/** A request the reference page shows as a curl command, and that the tests run. */
export interface ApiExample {
  title: string;
  /** path parameters, e.g. `{ shop: "kestrel-bank-works" }` */
  params?: Record<string, string>;
  query?: Record<string, string>;
  /** a JSON body */
  json?: unknown;
  /** a text body (sent as the first content type the contract's `body.text` lists, e.g. text/csv) */
  text?: string;
  /** multipart fields: a value starting with "@" is a file to upload, as curl reads it */
  form?: Record<string, string>;
  /** where curl writes a file answer */
  output?: string;
  /** the demo account the example is run as (the shop's manager unless it says otherwise) */
  as?: "manager" | "customer";
}

/** What a route answers when it succeeds: JSON shaped by a schema, a file of the given types, or nothing (204). */
type Success<S extends z.ZodType> =
  | { status: 200 | 201; description: string; json: S; file?: never }
  | { status: 200; description: string; file: readonly string[]; json?: never }
  | { status: 204; description: string; json?: never; file?: never };

export interface RouteContract<S extends z.ZodType = z.ZodType> {
  method: HttpMethod;
  /** OpenAPI path template: `/api/v1/shops/{shop}/quotes`; the handler lives in the same folders with `[shop]` */
  path: `/api/v1/${string}`;
  operationId: string;
  tag: ApiTag;
  summary: string;
  /** Markdown: what it does, its bounds, who may call it */
  description: string;
  access: RouteAccess;
  /** the scope a shop API key (`Authorization: Bearer …`) needs for this route; absent: no key may call it */
  apiKey?: ApiKeyScope;
  params?: z.ZodObject;
  query?: z.ZodObject;
  /** a JSON body, a multipart form (file fields are `z.file()`), or text of the listed content types (e.g. text/csv) */
  body?:
    | { json: z.ZodType; multipart?: never; text?: never }
    | { multipart: z.ZodObject; json?: never; text?: never }
    | { text: readonly string[]; json?: never; multipart?: never };
  ok: Success<S>;
  /** a second success: 202, the request was taken and waits (e.g. for the shop's estimators); sent with `Response.json(body, { status: 202 })` */
  pending?: { status: 202; description: string; json: z.ZodType };
  /** every refusal the route can give, with when it gives it */
  errors: Partial<Record<ErrorStatus, RefusalContract>>;
  examples?: readonly ApiExample[];
}

/**
 * A value the handler may send where the schema expects `T`: the same shape, with any string
 * also given as a Date (Response.json writes it as an ISO string) and arrays read-only.
 */
export type Sendable<T> = T extends string
  ? T | Date
  : T extends readonly (infer U)[]
    ? readonly Sendable<U>[]
    : T extends object
      ? { [K in keyof T]: Sendable<T[K]> }
      : T;

export interface DefinedRoute<S extends z.ZodType> extends RouteContract<S> {
  /** The success answer, typed by the contract's schema (the tests check the value itself). */
  answer(body: Sendable<z.input<S>>, init?: ResponseInit): Response;
}

/** Declares a route's contract; `answer` sends its success body with the declared status. */
export function defineRoute<S extends z.ZodType = z.ZodNever>(contract: RouteContract<S>): DefinedRoute<S> {
  return {
    ...contract,
    answer: (body, init = {}) => Response.json(body, { ...init, status: contract.ok.status }),
  };
}

/** `/api/v1/shops/{shop}/quotes` → `app/api/v1/shops/[shop]/quotes/route.ts` */
export function routeFileOf(path: string): string {
  return `app${path.replace(/\{([^}]+)\}/g, "[$1]")}/route.ts`;
}
