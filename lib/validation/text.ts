import { z } from "zod";

/**
 * NUL (U+0000) has no place in any text a person types, and PostgreSQL refuses it in `text`
 * columns: left alone it would turn a bad input into a server error. One message, one check,
 * used by every boundary: zod string schemas (`text()`), JSON bodies (lib/http/read-json.ts),
 * server-action inputs (lib/auth/shop-action.ts) and URLs (proxy.ts).
 */
export const NUL_MESSAGE = "Remove the NUL character (U+0000); it cannot be stored.";

export const hasNul = (value: string) => value.includes("\u0000");

/** A string schema that refuses NUL; chain `.trim()`, `.min()`, … as on `z.string()`. */
export function text() {
  return z.string().refine((v) => !hasNul(v), { message: NUL_MESSAGE });
}

/**
 * The path ("requirement.notes", "items.3", or "" for the value itself) of the first string or
 * object key holding a NUL anywhere in a JSON-like value; null when there is none. Iterative, so
 * a deeply nested body cannot exhaust the stack.
 */
export function findNul(value: unknown): string | null {
  const stack: { value: unknown; path: string }[] = [{ value, path: "" }];
  const seen = new Set<object>();
  while (stack.length > 0) {
    const { value: v, path } = stack.pop()!;
    if (typeof v === "string") {
      if (hasNul(v)) return path;
    } else if (v !== null && typeof v === "object") {
      if (seen.has(v)) continue;
      seen.add(v);
      const entries = Array.isArray(v) ? v.map((item, i) => [String(i), item] as const) : Object.entries(v as Record<string, unknown>);
      for (const [key, item] of entries) {
        const at = path ? `${path}.${key}` : key;
        if (hasNul(key)) return at;
        stack.push({ value: item, path: at });
      }
    }
  }
  return null;
}
