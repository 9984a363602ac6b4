/**
 * The local Stripe stand-in: a node:http server on loopback that answers the Stripe API calls the
 * app makes, with Stripe's shapes and rules, serves the hosted payment page, delivers signed
 * webhooks, and offers `/_standin/…` control endpoints for scripts and tests. See README.md here.
 */
import http from "node:http";
import type { AddressInfo } from "node:net";
import { z } from "zod";
import { checkoutPage, closedPage } from "./checkout-page";
import { errorJson, paramError, StripeApiError, type ErrorBody } from "./errors";
import { applyExpand, applyExpandToList, checkExpand, type Kind } from "./expand";
import { canonical, decodeForm, FormError, type FormTree } from "./form";
import { newId } from "./ids";
import { IdempotencyStore, MAX_KEY_LENGTH } from "./idempotency";
import { pageJson, paginate } from "./lists";
import { StripeModel, type Cause } from "./model";
import type { JsonObject } from "./objects";
import { assertImplementedInSchema, checkImplemented, coerce, type Implemented, type Params } from "./params";
import { loadOperationSchemas, SPEC_API_VERSION, type Schema } from "./spec";
import { WEBHOOK_LIMITS, WebhookDispatcher, type WebhookConfig } from "./webhooks";

export const MAX_BODY_BYTES = 1024 * 1024;

export interface StandinOptions {
  /** Always loopback unless a test says otherwise. */
  host?: string;
  /** 0 picks a free port. */
  port: number;
  /** The one API key accepted (must start with sk_test_). */
  secretKey: string;
  /** Signs webhooks (whsec_…). */
  webhookSecret: string;
  webhook?: Partial<Omit<WebhookConfig, "retry">> & { retry?: Partial<WebhookConfig["retry"]> };
  idempotency?: { ttlMs?: number; maxKeys?: number };
  /** How often open sessions past `expires_at` are expired. */
  sweepIntervalMs?: number;
  log?: (line: string) => void;
  /**
   * Called with every API answer as sent (for contract tests: the operation in Stripe's
   * description, e.g. "get /v1/refunds/{refund}", or null for an address the API does not have).
   */
  onApiAnswer?: (answer: { op: string | null; status: number; body: string }) => void;
}

export interface Standin {
  url: string;
  port: number;
  model: StripeModel;
  webhooks: WebhookDispatcher;
  close(): Promise<void>;
}

/** Stripe's defaults as recalled: keys kept 24 h. The bound on keys is ours. */
export const DEFAULT_IDEMPOTENCY = { ttlMs: 24 * 60 * 60 * 1000, maxKeys: 10_000 };
/** About four minutes of retries in all: enough for the app to restart; the reconciliation job covers longer outages. */
export const DEFAULT_RETRY = { maxAttempts: 8, initialDelayMs: 1_000, maxDelayMs: 120_000, timeoutMs: 10_000 };

// ---- the API routes --------------------------------------------------------------------------

interface Ctx {
  params: Params;
  path: Record<string, string>;
  cause: Cause;
}

interface Route {
  method: "GET" | "POST";
  pattern: RegExp;
  /** Names of the path parameters, as in Stripe's description ({session}, {intent}, …). */
  names: string[];
  /** `"post /v1/checkout/sessions"`: the operation in Stripe's description. */
  op: string;
  implemented: Implemented;
  kind: Kind;
  list: boolean;
  run(model: StripeModel, ctx: Ctx): JsonObject;
}

const listParams = { limit: true, starting_after: true, ending_before: true, expand: true } as const;
const productData = { name: true, description: true, images: true, metadata: true } as const;

function route(method: Route["method"], template: string, rest: Omit<Route, "method" | "pattern" | "names" | "op">): Route {
  const names: string[] = [];
  const pattern = new RegExp(
    `^${template.replace(/\{(\w+)\}/g, (_, name: string) => {
      names.push(name);
      return "([^/]+)";
    })}$`,
  );
  return { method, pattern, names, op: `${method.toLowerCase()} ${template}`, ...rest };
}

const ROUTES: Route[] = [
  route("POST", "/v1/checkout/sessions", {
    kind: "checkout.session",
    list: false,
    implemented: {
      mode: true,
      line_items: { quantity: true, price_data: { currency: true, unit_amount: true, product_data: productData } },
      success_url: true,
      cancel_url: true,
      client_reference_id: true,
      customer_email: true,
      metadata: true,
      expires_at: true,
      locale: true,
      submit_type: true,
      payment_method_types: true,
      ui_mode: true,
      currency: true,
      payment_intent_data: { description: true, metadata: true, receipt_email: true },
      expand: true,
    },
    run: (m, { params }) => m.sessionJson(m.createSession(params)),
  }),
  route("GET", "/v1/checkout/sessions/{session}", {
    kind: "checkout.session",
    list: false,
    implemented: { expand: true },
    run: (m, { path }) => m.sessionJson(m.getSession(path.session as string)),
  }),
  route("POST", "/v1/checkout/sessions/{session}/expire", {
    kind: "checkout.session",
    list: false,
    implemented: { expand: true },
    run: (m, { path, cause }) => m.sessionJson(m.expireSession(path.session as string, cause)),
  }),
  route("GET", "/v1/checkout/sessions/{session}/line_items", {
    kind: "item",
    list: true,
    implemented: listParams,
    run: (m, { path, params }) => {
      const s = m.getSession(path.session as string);
      const items = m.lineItemJsons(s);
      return pageJson(paginate(items as (JsonObject & { id: string })[], params, "line_item"), (x) => x, `/v1/checkout/sessions/${s.id}/line_items`);
    },
  }),
  route("GET", "/v1/payment_intents/{intent}", {
    kind: "payment_intent",
    list: false,
    implemented: { expand: true },
    run: (m, { path }) => m.paymentIntentJson(m.getPaymentIntent(path.intent as string)),
  }),
  route("POST", "/v1/refunds", {
    kind: "refund",
    list: false,
    implemented: { payment_intent: true, charge: true, amount: true, reason: true, metadata: true, expand: true },
    run: (m, { params, cause }) => m.refundJson(m.createRefund(params, cause)),
  }),
  route("GET", "/v1/refunds", {
    kind: "refund",
    list: true,
    implemented: { ...listParams, payment_intent: true, charge: true, created: true },
    run: (m, { params }) => pageJson(paginate(m.listRefunds(params), params, "refund"), (r) => m.refundJson(r), "/v1/refunds"),
  }),
  route("GET", "/v1/refunds/{refund}", {
    kind: "refund",
    list: false,
    implemented: { expand: true },
    run: (m, { path }) => m.refundJson(m.getRefund(path.refund as string)),
  }),
  route("GET", "/v1/events", {
    kind: "event",
    list: true,
    implemented: { ...listParams, type: true, types: true, created: true, delivery_success: true },
    run: (m, { params }) => pageJson(paginate(m.listEvents(params), params, "event"), (e) => m.eventJson(e), "/v1/events"),
  }),
  route("GET", "/v1/events/{id}", {
    kind: "event",
    list: false,
    implemented: { expand: true },
    run: (m, { path }) => m.eventJson(m.getEvent(path.id as string)),
  }),
];

/** The parameter schemas of every route, from Stripe's description; checked against `implemented` at load. */
function loadSchemas(): Map<string, Schema> {
  const ops = loadOperationSchemas(ROUTES.map((r) => r.op));
  const out = new Map<string, Schema>();
  for (const r of ROUTES) {
    const schema = (ops.get(r.op) as { schema: Schema }).schema;
    assertImplementedInSchema(r.implemented, schema, []);
    out.set(r.op, schema);
  }
  return out;
}

// ---- helpers ---------------------------------------------------------------------------------

class BodyTooLarge extends Error {}

function readBody(req: http.IncomingMessage, limit = MAX_BODY_BYTES): Promise<string> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (chunk: Buffer) => {
      size += chunk.length;
      if (size > limit) {
        reject(new BodyTooLarge());
        req.destroy();
        return;
      }
      chunks.push(chunk);
    });
    req.on("end", () => resolve(Buffer.concat(chunks).toString("utf8")));
    req.on("error", reject);
  });
}

function apiKeyOf(req: http.IncomingMessage): string | null {
  const h = req.headers.authorization;
  if (!h) return null;
  const bearer = /^Bearer\s+(\S+)$/i.exec(h);
  if (bearer) return bearer[1] ?? null;
  const basic = /^Basic\s+(\S+)$/i.exec(h);
  if (basic)
    return (
      Buffer.from(basic[1] ?? "", "base64")
        .toString("utf8")
        .split(":")[0] ?? null
    );
  return null;
}

function maskKey(key: string): string {
  return key.length > 12 ? `${key.slice(0, 8)}${"*".repeat(Math.min(key.length - 12, 20))}${key.slice(-4)}` : "****";
}

interface Reply {
  status: number;
  body: string;
  headers?: Record<string, string>;
  /** The API operation that answered, when one did. */
  op?: string;
}

function jsonReply(status: number, value: unknown): Reply {
  return { status, body: JSON.stringify(value, null, 2) };
}

function errorReply(e: StripeApiError): Reply {
  return { status: e.status, body: errorJson(e.body) };
}

function send(res: http.ServerResponse, reply: Reply, type = "application/json"): void {
  const headers: Record<string, string> = { "content-type": type, ...reply.headers };
  // The SDK retries 409 and 5xx on its own; no 4xx of ours gets better by sending it again.
  if (reply.status >= 400 && reply.status < 500) headers["stripe-should-retry"] = "false";
  res.writeHead(reply.status, headers);
  res.end(reply.body);
}

// ---- control endpoint bodies -----------------------------------------------------------------

const orderSchema = z.enum(["created", "reverse", "shuffle"]);
const webhookPatchSchema = z
  .object({
    url: z
      .string()
      .url()
      .refine((u) => /^https?:\/\//.test(u), "must be an http(s) URL")
      .nullable()
      .optional(),
    hold: z.boolean().optional(),
    duplicates: z.number().int().min(WEBHOOK_LIMITS.duplicates.min).max(WEBHOOK_LIMITS.duplicates.max).optional(),
    order: orderSchema.optional(),
    retry: z
      .object({
        maxAttempts: z.number().int().min(WEBHOOK_LIMITS.maxAttempts.min).max(WEBHOOK_LIMITS.maxAttempts.max).optional(),
        initialDelayMs: z.number().int().min(WEBHOOK_LIMITS.initialDelayMs.min).max(WEBHOOK_LIMITS.initialDelayMs.max).optional(),
        maxDelayMs: z.number().int().min(WEBHOOK_LIMITS.maxDelayMs.min).max(WEBHOOK_LIMITS.maxDelayMs.max).optional(),
        timeoutMs: z.number().int().min(WEBHOOK_LIMITS.timeoutMs.min).max(WEBHOOK_LIMITS.timeoutMs.max).optional(),
      })
      .strict()
      .optional(),
  })
  .strict();
const flushSchema = z.object({ order: orderSchema.optional() }).strict();
const paySchema = z.object({ card: z.enum(["success", "decline"]), email: z.string().max(512).optional(), name: z.string().max(512).optional() }).strict();
/** Up to a year at a time. */
const clockSchema = z
  .object({
    advanceSeconds: z
      .number()
      .int()
      .min(0)
      .max(366 * 24 * 3600),
  })
  .strict();

function controlError(status: number, message: string): Reply {
  return jsonReply(status, { error: { message } });
}

function parseJson<T>(text: string, schema: z.ZodType<T>): { ok: true; value: T } | { ok: false; reply: Reply } {
  let raw: unknown = {};
  if (text.trim() !== "") {
    try {
      raw = JSON.parse(text);
    } catch {
      return { ok: false, reply: controlError(400, "The body is not valid JSON.") };
    }
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    return { ok: false, reply: controlError(400, parsed.error.issues.map((i) => `${i.path.join(".") || "body"}: ${i.message}`).join("; ")) };
  }
  return { ok: true, value: parsed.data };
}

// ---- the server ------------------------------------------------------------------------------

export async function startStandin(options: StandinOptions): Promise<Standin> {
  if (!options.secretKey.startsWith("sk_test_")) throw new Error("the stand-in accepts a test key (sk_test_…) only");
  const host = options.host ?? "127.0.0.1";
  const log = options.log ?? (() => undefined);
  const schemas = loadSchemas();
  const idem = new IdempotencyStore(options.idempotency?.ttlMs ?? DEFAULT_IDEMPOTENCY.ttlMs, options.idempotency?.maxKeys ?? DEFAULT_IDEMPOTENCY.maxKeys);
  let base = "";
  const initialWebhook: WebhookConfig = {
    url: options.webhook?.url ?? null,
    hold: options.webhook?.hold ?? false,
    duplicates: options.webhook?.duplicates ?? 0,
    order: options.webhook?.order ?? "created",
    retry: { ...DEFAULT_RETRY, ...options.webhook?.retry },
  };
  let webhooks: WebhookDispatcher | null = null;
  const model = new StripeModel(
    () => base,
    () => Boolean(webhooks?.config.url),
  );
  webhooks = new WebhookDispatcher(options.webhookSecret, initialWebhook, (e) => model.eventJson(e));
  const hooks = webhooks;
  const dispatch = () => hooks.enqueue(model.takeBatch());

  function api(req: http.IncomingMessage, url: URL, bodyText: string, requestId: string): Reply {
    const method = req.method ?? "GET";
    const key = apiKeyOf(req);
    if (!key) {
      return errorReply(
        new StripeApiError(401, {
          type: "invalid_request_error",
          message:
            "You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. 'Authorization: Bearer YOUR_SECRET_KEY').",
        }),
      );
    }
    if (key !== options.secretKey) {
      const live = key.startsWith("sk_live_") ? " The local stand-in never takes live keys." : "";
      return errorReply(new StripeApiError(401, { type: "invalid_request_error", message: `Invalid API Key provided: ${maskKey(key)}.${live}` }));
    }
    let match: { route: Route; path: Record<string, string> } | null = null;
    for (const r of ROUTES) {
      const m = r.method === method ? r.pattern.exec(url.pathname) : null;
      if (m) {
        match = { route: r, path: Object.fromEntries(r.names.map((n, i) => [n, decodeURIComponent(m[i + 1] ?? "")])) };
        break;
      }
    }
    if (!match) {
      return errorReply(new StripeApiError(404, { type: "invalid_request_error", message: `Unrecognized request URL (${method}: ${url.pathname}).` }));
    }
    return { ...answerRoute(req, url, bodyText, requestId, key, match.route, match.path), op: match.route.op };
  }

  /** One matched API call: parameters, idempotency, the operation itself, expansion. */
  function answerRoute(req: http.IncomingMessage, url: URL, bodyText: string, requestId: string, key: string, r: Route, path: Record<string, string>): Reply {
    const method = r.method;

    let tree: FormTree;
    try {
      const query = url.search.length > 1 ? url.search.slice(1) : "";
      tree = decodeForm(method === "POST" ? [bodyText, query].filter(Boolean).join("&") : query);
    } catch (e) {
      if (e instanceof FormError) return errorReply(paramError(e.message, e.param ?? undefined));
      throw e;
    }

    const idemKey = method === "POST" ? (req.headers["idempotency-key"] as string | undefined) : undefined;
    const endpoint = `${method} ${url.pathname}`;
    const fingerprint = canonical(tree);
    if (idemKey !== undefined) {
      if (idemKey.length === 0 || idemKey.length > MAX_KEY_LENGTH) {
        return errorReply(paramError(`Idempotency keys must be between 1 and ${MAX_KEY_LENGTH} characters long.`, undefined));
      }
      const stored = idem.get(key, idemKey);
      if (stored) {
        const retryHint = `Try using a key other than '${idemKey}' if you meant to execute a different request.`;
        if (stored.endpoint !== endpoint) {
          return errorReply(
            new StripeApiError(400, {
              type: "idempotency_error",
              message: `Keys for idempotent requests can only be used for the same endpoint they were first used for ('${stored.endpoint}' vs '${endpoint}'). ${retryHint}`,
            }),
          );
        }
        if (stored.fingerprint !== fingerprint) {
          return errorReply(
            new StripeApiError(400, {
              type: "idempotency_error",
              message: `Keys for idempotent requests can only be used with the same parameters they were first used with. ${retryHint}`,
            }),
          );
        }
        return {
          status: stored.status,
          body: stored.body,
          headers: { "idempotent-replayed": "true", "original-request": stored.requestId, "idempotency-key": idemKey },
        };
      }
    }

    let reply: Reply;
    let executed = false;
    try {
      const params = coerce(tree, schemas.get(r.op) as Schema, []) as Params;
      checkImplemented(params, r.implemented, []);
      const expandTree = checkExpand(r.kind, (params.expand as string[] | undefined) ?? [], r.list);
      executed = true;
      const json = r.run(model, { params, path, cause: { id: requestId, idempotency_key: idemKey ?? null } });
      const expanded = r.list ? applyExpandToList(json, r.kind, expandTree, model.resolver) : applyExpand(json, r.kind, expandTree, model.resolver);
      reply = jsonReply(200, expanded);
    } catch (e) {
      if (!(e instanceof StripeApiError)) throw e;
      if (e.beforeExecution) executed = false;
      reply = errorReply(e);
    } finally {
      dispatch();
    }
    if (idemKey !== undefined) {
      reply.headers = { ...reply.headers, "idempotency-key": idemKey };
      if (executed) idem.set(key, idemKey, { endpoint, fingerprint, status: reply.status, body: reply.body, requestId });
    }
    return reply;
  }

  async function control(req: http.IncomingMessage, url: URL, bodyText: string): Promise<Reply> {
    const method = req.method ?? "GET";
    const p = url.pathname.replace(/\/+$/, "");
    const webhookState = () => ({ ...hooks.config, ...hooks.counts });
    if (p === "/_standin" && method === "GET") {
      return jsonReply(200, { ok: true, apiVersion: SPEC_API_VERSION, now: model.now(), clockOffsetSeconds: model.clockOffsetS, webhooks: webhookState() });
    }
    if (p === "/_standin/reset" && method === "POST") {
      hooks.reset();
      model.reset();
      idem.clear();
      return jsonReply(200, { ok: true, webhooks: webhookState() });
    }
    if (p === "/_standin/webhooks" && method === "GET") return jsonReply(200, webhookState());
    if (p === "/_standin/webhooks" && method === "POST") {
      const body = parseJson(bodyText, webhookPatchSchema);
      if (!body.ok) return body.reply;
      const { retry, ...rest } = body.value;
      const next: WebhookConfig = { ...hooks.config, ...rest, retry: { ...hooks.config.retry, ...retry } };
      hooks.config = next;
      // Turning hold off sends what was held, in creation order unless the order switch says otherwise.
      if (rest.hold === false) hooks.flush();
      return jsonReply(200, webhookState());
    }
    if (p === "/_standin/webhooks/flush" && method === "POST") {
      const body = parseJson(bodyText, flushSchema);
      if (!body.ok) return body.reply;
      const flushed = hooks.flush(body.value.order);
      return jsonReply(200, { flushed, ...hooks.counts });
    }
    if (p === "/_standin/webhooks/deliveries" && method === "GET") {
      const wait = url.searchParams.get("wait");
      let settled = hooks.counts.pending === 0;
      if (wait === "1" || wait === "true") {
        const limit = Math.min(Math.max(Number(url.searchParams.get("limitMs") ?? 15_000) || 15_000, 0), 60_000);
        settled = await hooks.idle(limit);
      }
      const event = url.searchParams.get("event");
      const deliveries = hooks.log.filter((d) => !event || d.eventId === event);
      return jsonReply(200, { settled, ...hooks.counts, deliveries });
    }
    const pay = /^\/_standin\/checkout\/sessions\/([^/]+)\/pay$/.exec(p);
    if (pay && method === "POST") {
      const body = parseJson(bodyText, paySchema);
      if (!body.ok) return body.reply;
      const id = decodeURIComponent(pay[1] ?? "");
      try {
        const s = model.pay(id, body.value.card, { email: body.value.email, name: body.value.name });
        return jsonReply(200, { session: model.sessionJson(s), redirectUrl: model.successRedirect(s) });
      } catch (e) {
        if (e instanceof StripeApiError) return errorReply(e);
        throw e;
      } finally {
        dispatch();
      }
    }
    if (p === "/_standin/clock" && method === "POST") {
      const body = parseJson(bodyText, clockSchema);
      if (!body.ok) return body.reply;
      model.clockOffsetS += body.value.advanceSeconds;
      model.sweepExpired();
      dispatch();
      return jsonReply(200, { now: model.now(), clockOffsetSeconds: model.clockOffsetS });
    }
    return controlError(404, `No control endpoint ${method} ${p}.`);
  }

  function page(req: http.IncomingMessage, url: URL, bodyText: string): { status: number; html: string; location?: string } {
    const m = /^\/checkout\/([^/]+)$/.exec(url.pathname);
    const id = decodeURIComponent(m?.[1] ?? "");
    const s = id ? model.sessions.get(id) : undefined;
    if (!s) return { status: 404, html: closedPage("missing", null) };
    model.getSession(id); // expires it if its time has passed
    dispatch();
    if (s.status !== "open") {
      return s.status === "complete"
        ? { status: 200, html: closedPage("complete", model.successRedirect(s)) }
        : { status: 410, html: closedPage("expired", s.cancelUrl) };
    }
    if (req.method !== "POST") return { status: 200, html: checkoutPage(s, (p) => model.unitAmount(p)) };
    const form = new URLSearchParams(bodyText);
    const card = form.get("card");
    const email = form.get("email")?.slice(0, 512) ?? "";
    const name = form.get("name")?.slice(0, 512) ?? "";
    if (card !== "success" && card !== "decline") {
      return { status: 400, html: checkoutPage(s, (p) => model.unitAmount(p), { error: "Choose one of the two test cards.", email, name }) };
    }
    try {
      model.pay(id, card, { email, name });
      return { status: 303, html: "", location: model.successRedirect(s) };
    } catch (e) {
      if (!(e instanceof StripeApiError)) throw e;
      const message =
        e.status === 402 ? "The declining test card was declined by the bank. Nothing was charged: pay with the approving card or cancel." : e.body.message;
      return { status: e.status, html: checkoutPage(s, (p) => model.unitAmount(p), { error: message, email, name }) };
    } finally {
      dispatch();
    }
  }

  const server = http.createServer((req, res) => {
    const requestId = newId.request();
    res.setHeader("request-id", requestId);
    const url = new URL(req.url ?? "/", "http://stand-in");
    const isApi = url.pathname.startsWith("/v1/");
    const isPage = url.pathname.startsWith("/checkout/");
    if (isApi) res.setHeader("stripe-version", SPEC_API_VERSION);
    readBody(req)
      .then(async (bodyText) => {
        if (isApi) {
          const reply = api(req, url, bodyText, requestId);
          options.onApiAnswer?.({ op: reply.op ?? null, status: reply.status, body: reply.body });
          return send(res, reply);
        }
        if (url.pathname === "/_standin" || url.pathname.startsWith("/_standin/")) return send(res, await control(req, url, bodyText));
        if (isPage) {
          const out = page(req, url, bodyText);
          res.setHeader("content-security-policy", "default-src 'none'; style-src 'unsafe-inline'; base-uri 'none'; frame-ancestors 'none'");
          res.setHeader("x-content-type-options", "nosniff");
          res.setHeader("referrer-policy", "no-referrer");
          res.setHeader("cache-control", "no-store");
          if (out.location) {
            res.writeHead(303, { location: out.location });
            return res.end();
          }
          return send(res, { status: out.status, body: out.html }, "text/html; charset=utf-8");
        }
        return send(res, controlError(404, "Not found. The stand-in answers /v1/…, /checkout/… and /_standin/…."));
      })
      .catch((e: unknown) => {
        if (res.headersSent) return res.destroy();
        if (e instanceof BodyTooLarge)
          return send(res, errorReply(paramError(`The request body is larger than ${MAX_BODY_BYTES / 1024 / 1024} MB.`, undefined)));
        log(`error answering ${req.method} ${url.pathname}: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
        const body: ErrorBody = { type: "api_error", message: "The stand-in failed to answer this request; see its log." };
        send(res, { status: 500, body: errorJson(body) });
      });
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  base = `http://${host}:${port}`;

  const sweep = setInterval(() => {
    model.sweepExpired();
    dispatch();
  }, options.sweepIntervalMs ?? 5_000);
  sweep.unref();

  return {
    url: base,
    port,
    model,
    webhooks: hooks,
    close: () =>
      new Promise<void>((resolve) => {
        clearInterval(sweep);
        hooks.stop();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
