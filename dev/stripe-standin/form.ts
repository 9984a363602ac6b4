/**
 * Stripe's request encoding: `application/x-www-form-urlencoded` with bracketed keys
 * (`line_items[0][price_data][currency]=eur`, `expand[0]=payment_intent`, `expand[]=x`). Decoded
 * into a tree of null-prototype objects whose leaves are strings; whether a container is an array
 * is decided later by the parameter's schema (see params.ts), so `a[0]`/`a[1]` keys stay keys here.
 *
 * Bounded by construction: at most MAX_PAIRS pairs, MAX_DEPTH levels, indices of at most four
 * digits. Anything else is refused with a message naming the key.
 */

export type FormValue = string | FormTree;
export interface FormTree {
  [key: string]: FormValue;
}

export const MAX_PAIRS = 2_000;
export const MAX_DEPTH = 8;

export class FormError extends Error {
  constructor(
    message: string,
    readonly param: string | null,
  ) {
    super(message);
  }
}

export function emptyTree(): FormTree {
  return Object.create(null) as FormTree;
}

/** `line_items[0][price_data]` → ["line_items", "0", "price_data"]; "" for `[]`. Null when malformed. */
export function splitKey(key: string): string[] | null {
  const open = key.indexOf("[");
  if (open === -1) return key === "" ? null : [key];
  const head = key.slice(0, open);
  if (head === "") return null;
  const parts = [head];
  let rest = key.slice(open);
  while (rest.length > 0) {
    const m = /^\[([^[\]]*)\]/.exec(rest);
    if (!m) return null;
    parts.push(m[1] ?? "");
    rest = rest.slice(m[0].length);
  }
  return parts;
}

function decodeComponent(s: string): string {
  return decodeURIComponent(s.replace(/\+/g, " "));
}

/** Decodes a form body or query string into a tree. Throws FormError on malformed input. */
export function decodeForm(text: string): FormTree {
  const root = emptyTree();
  if (text === "") return root;
  const pairs = text.split("&");
  if (pairs.length > MAX_PAIRS) throw new FormError(`Too many parameters (more than ${MAX_PAIRS}).`, null);
  for (const pair of pairs) {
    if (pair === "") continue;
    const eq = pair.indexOf("=");
    let key: string;
    let value: string;
    try {
      key = decodeComponent(eq === -1 ? pair : pair.slice(0, eq));
      value = eq === -1 ? "" : decodeComponent(pair.slice(eq + 1));
    } catch {
      throw new FormError("The request body or query string is not valid form encoding.", null);
    }
    const parts = splitKey(key);
    if (!parts) throw new FormError(`Invalid parameter name: ${key}`, key);
    if (parts.length > MAX_DEPTH) throw new FormError(`Parameter nested too deeply: ${key}`, key);
    let node = root;
    for (let i = 0; i < parts.length; i++) {
      let part = parts[i] as string;
      const last = i === parts.length - 1;
      if (part === "")
        part = String(Object.keys(node).length); // `a[]=x` appends
      else if (i > 0 && /^\d+$/.test(part) && part.length > 4) throw new FormError(`Index too large in ${key}`, key);
      if (last) {
        if (typeof node[part] === "object") throw new FormError(`Invalid parameter: ${key} is both a value and a hash`, key);
        node[part] = value; // the last of repeated keys wins
      } else {
        const next = node[part];
        if (typeof next === "string") throw new FormError(`Invalid parameter: ${key} is both a value and a hash`, key);
        if (next === undefined) {
          const created = emptyTree();
          node[part] = created;
          node = created;
        } else {
          node = next;
        }
      }
    }
  }
  return root;
}

/** `["line_items", 0, "quantity"]` → `line_items[0][quantity]`, as Stripe names parameters in errors. */
export function paramName(path: readonly (string | number)[]): string {
  const [head, ...rest] = path;
  return `${head ?? ""}${rest.map((p) => `[${p}]`).join("")}`;
}

/** A canonical string for a decoded tree (keys sorted), used to compare idempotent requests. */
export function canonical(value: FormValue): string {
  if (typeof value === "string") return JSON.stringify(value);
  return `{${Object.keys(value)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${canonical(value[k] as FormValue)}`)
    .join(",")}}`;
}
