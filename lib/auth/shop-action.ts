import "server-only";
import { headers } from "next/headers";
import type { z } from "zod";
import { NUL_MESSAGE, findNul } from "@/lib/validation/text";
import { can, type Permission } from "./permissions";
import { resolveShopContext, type ShopContext } from "./context";

export type ActionResult<T> =
  | { ok: true; data: T }
  | { ok: false; code: "unauthenticated" | "forbidden" | "not-found" | "invalid" | "conflict"; message?: string; fieldErrors?: Record<string, string[]> };

export function fieldErrorsOf(error: z.ZodError): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_form";
    (out[key] ??= []).push(issue.message);
  }
  return out;
}

/**
 * The one way to mutate a shop's data: context → permission → zod parse (after refusing NUL
 * characters anywhere in the input) → handler.
 * Expected failures come back as results; only bugs throw.
 */
export function shopAction<S extends z.ZodType, T>(
  schema: S,
  permission: Permission,
  handler: (ctx: ShopContext, input: z.output<S>) => Promise<ActionResult<T>>,
) {
  return async (shopSlug: string, input: unknown): Promise<ActionResult<T>> => {
    const r = await resolveShopContext(await headers(), String(shopSlug));
    if (r.status === "no-shop") return { ok: false, code: "not-found", message: "No such shop." };
    if (r.status === "signed-out") return { ok: false, code: "unauthenticated", message: "Sign in to continue." };
    if (r.status === "not-member") return { ok: false, code: "forbidden", message: "You are not a member of this shop." };
    if (!can(r.ctx.role, permission)) return { ok: false, code: "forbidden", message: "Your role may not do this." };
    const nulAt = findNul(input);
    if (nulAt !== null) return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: { [nulAt || "_form"]: [NUL_MESSAGE] } };
    const parsed = schema.safeParse(input);
    if (!parsed.success) {
      return { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: fieldErrorsOf(parsed.error) };
    }
    return handler(r.ctx, parsed.data);
  };
}
