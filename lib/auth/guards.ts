import "server-only";
import { headers } from "next/headers";
import { forbidden, notFound, redirect } from "next/navigation";
import type { z } from "zod";
import { env } from "@/lib/env";
import { jsonError } from "@/lib/http/json-error";
import { limits, tooManyRequests } from "@/lib/http/limits";
import { crossOriginRefusal } from "@/lib/http/origin";
import { getShopBySlug } from "@/db/queries/shops";
import { keyAllows } from "./api-key-scopes";
import { bearerToken, recordKeyCall, resolveApiKey } from "./api-keys";
import { NUL_MESSAGE, findNul } from "@/lib/validation/text";
import { getShopContext, resolveShopContext, type ContextResult, type ShopContext } from "./context";
import { can, type Permission, type Role } from "./permissions";

/**
 * The guard family: pages (`requireShopPage`), server actions (`shopAction`) and route handlers
 * (`withShopApi`) resolve the same context, check the same permission table and answer every
 * refusal through the one mapping below.
 */

/** What a guard asks of the member: one permission, or any one of several. */
type Access = Permission | readonly Permission[];

/** Why a request is refused before any handler runs. */
type Refusal = "no-shop" | "signed-out" | "not-member" | "not-allowed";

type ActionCode = "unauthenticated" | "forbidden" | "not-found" | "invalid" | "conflict" | "rate-limited";

export type ActionResult<T> = { ok: true; data: T } | { ok: false; code: ActionCode; message?: string; fieldErrors?: Record<string, string[]> };

/**
 * The one mapping from a refusal to the answer each kind gives: a page sends the visitor to sign in,
 * shows the not-found page or the not-allowed (403) page; an action returns a result code; a route
 * handler answers a JSON status.
 */
const REFUSALS = {
  "no-shop": { page: "not-found", code: "not-found", status: 404, message: "No such shop." },
  "signed-out": { page: "sign-in", code: "unauthenticated", status: 401, message: "Sign in to continue." },
  "not-member": { page: "forbidden", code: "forbidden", status: 403, message: "You are not a member of this shop." },
  "not-allowed": { page: "forbidden", code: "forbidden", status: 403, message: "Your role may not do this." },
} as const satisfies Record<Refusal, { page: "sign-in" | "not-found" | "forbidden"; code: ActionCode; status: 401 | 403 | 404; message: string }>;

/** Whether a role has the permission, or any one of the permissions. */
function allows(role: Role, access: Access): boolean {
  return typeof access === "string" ? can(role, access) : access.some((p) => can(role, p));
}

/** The member's context when they may do `access` (or only need to be a member), or the refusal. */
function authorize(r: ContextResult, access?: Access): { ok: true; ctx: ShopContext } | { ok: false; refusal: Refusal } {
  if (r.status !== "ok") return { ok: false, refusal: r.status };
  if (access !== undefined && !allows(r.ctx.role, access)) return { ok: false, refusal: "not-allowed" };
  return { ok: true, ctx: r.ctx };
}

/** Where a signed-out visitor goes: the sign-in page, then back to `next`. */
function signInHref(shopSlug: string, next: string): string {
  return `/sign-in?shop=${encodeURIComponent(shopSlug)}&next=${encodeURIComponent(next)}`;
}

/** A server action's answer to a refusal. */
export function refusedResult(refusal: Refusal): { ok: false; code: ActionCode; message: string } {
  const { code, message } = REFUSALS[refusal];
  return { ok: false, code, message };
}

/** A route handler's answer to a refusal. */
export function refusedResponse(refusal: Refusal): Response {
  const { status, message } = REFUSALS[refusal];
  return jsonError(status, message);
}

/**
 * For pages: the context when the signed-in member may do `access`; otherwise the sign-in page
 * (then back to `next`), the not-found page or the not-allowed page.
 */
export async function requireShopPage(shopSlug: string, access?: Access, next?: string): Promise<ShopContext> {
  const r = authorize(await getShopContext(shopSlug), access);
  if (r.ok) return r.ctx;
  const answer = REFUSALS[r.refusal].page;
  if (answer === "sign-in") redirect(signInHref(shopSlug, next ?? `/desk/${shopSlug}`));
  if (answer === "not-found") notFound();
  forbidden();
}

export interface ShopApiOptions {
  /**
   * "not-found": a signed-in person who is not a member of this shop (a member of another shop)
   * gets 404, as if the shop did not exist — for staff routes whose URL should not tell outsiders
   * anything. By default they get 403.
   */
  outsiders?: "forbidden" | "not-found";
}

/**
 * For route handlers: the context from the request itself, or the refusal as JSON before the handler runs.
 * A write (any method but GET/HEAD/OPTIONS) sent by a page of another site is refused first (403).
 *
 * A request with `Authorization: Bearer <key>` is a shop API key's (lib/auth/api-keys.ts): an
 * unknown or revoked key is 401, a key whose scopes do not cover `access` 403 (one mapping:
 * lib/auth/api-key-scopes.ts), past its rate limit 429; every call with a known key, answered or
 * refused, goes into the shop's audit log.
 */
export async function withShopApi(
  request: Request,
  shopSlug: string,
  access: Access,
  handler: (ctx: ShopContext) => Promise<Response>,
  options: ShopApiOptions = {},
): Promise<Response> {
  const crossOrigin = crossOriginRefusal(request, env.APP_ORIGINS);
  if (crossOrigin) return crossOrigin;
  const token = bearerToken(request.headers);
  if (token !== null) return withKey(request, shopSlug, token, access, handler);
  const r = authorize(await resolveShopContext(request.headers, shopSlug), access);
  if (r.ok) return handler(r.ctx);
  return refusedResponse(r.refusal === "not-member" && options.outsiders === "not-found" ? "no-shop" : r.refusal);
}

async function withKey(request: Request, shopSlug: string, token: string, access: Access, handler: (ctx: ShopContext) => Promise<Response>) {
  const shop = await getShopBySlug(shopSlug);
  if (!shop) return refusedResponse("no-shop");
  const key = await resolveApiKey(shop, token);
  if (key.status === "invalid") return jsonError(401, "This API key is not valid for this shop.", undefined, { headers: { "www-authenticate": "Bearer" } });
  const keyId = key.status === "ok" ? (key.ctx.apiKey?.id ?? "") : key.keyId;
  let answer: Response;
  if (key.status === "revoked") answer = jsonError(401, "This API key has been revoked.", undefined, { headers: { "www-authenticate": "Bearer" } });
  else if (!keyAllows(key.ctx.apiKey?.scopes ?? [], access)) answer = jsonError(403, "This API key's scopes do not allow this.");
  else {
    const gate = await limits.apiKey.hit(keyId);
    answer = gate.allowed ? await handler(key.ctx) : tooManyRequests(gate);
  }
  await recordKeyCall(shop.id, keyId, request, answer.status);
  return answer;
}

function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/** An action's answer to input its schema refused: the messages go back onto the fields. */
export function invalidResult(error: z.ZodError): { ok: false; code: "invalid"; message: string; fieldErrors: Record<string, string[]> } {
  return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: fieldErrorsOf(error) };
}

/** An action's answer to input refused field by field by our own readers (messages keyed by field path). */
export function invalidFields(errors: Record<string, string | string[]> | readonly { field: string; message: string }[]): {
  ok: false;
  code: "invalid";
  message: string;
  fieldErrors: Record<string, string[]>;
} {
  const fieldErrors: Record<string, string[]> = {};
  if (Array.isArray(errors)) for (const e of errors as readonly { field: string; message: string }[]) (fieldErrors[e.field] ??= []).push(e.message);
  else for (const [k, v] of Object.entries(errors as Record<string, string | string[]>)) fieldErrors[k] = Array.isArray(v) ? v : [v];
  return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors };
}

/**
 * The one way to mutate a shop's data: context → permission → zod parse (after refusing NUL
 * characters anywhere in the input) → handler. Expected failures come back as results; only bugs throw.
 */
export function shopAction<S extends z.ZodType, T>(schema: S, access: Access, handler: (ctx: ShopContext, input: z.output<S>) => Promise<ActionResult<T>>) {
  return async (shopSlug: string, input: unknown): Promise<ActionResult<T>> => {
    const r = authorize(await resolveShopContext(await headers(), String(shopSlug)), access);
    if (!r.ok) return refusedResult(r.refusal);
    const nulAt = findNul(input);
    if (nulAt !== null) return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: { [nulAt || "_form"]: [NUL_MESSAGE] } };
    const parsed = schema.safeParse(input);
    if (!parsed.success) return invalidResult(parsed.error);
    return handler(r.ctx, parsed.data);
  };
}
