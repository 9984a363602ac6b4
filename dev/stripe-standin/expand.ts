/**
 * `expand[]` as Stripe does it: an id field replaced by the object it names
 * (`payment_intent`, `payment_intent.latest_charge`), a list field that is absent until expanded
 * (`line_items` on a session, `refunds` on a charge), `data.` in front for list endpoints, at most
 * four levels. Paths are checked before the endpoint runs; a field that cannot be expanded is a 400.
 */
import { paramError } from "./errors";
import type { Json, JsonObject } from "./objects";

export type Kind = "checkout.session" | "payment_intent" | "charge" | "refund" | "item" | "price" | "product" | "event";

interface Field {
  /** The kind the field expands to; null for fields that are always null in the stand-in. */
  to: Kind | null;
  /** A list that is absent unless expanded. */
  list?: boolean;
  /** Already an object in the JSON; only its own fields can be expanded further. */
  inline?: boolean;
}

const EXPANDABLE: Record<Kind, Record<string, Field>> = {
  "checkout.session": {
    payment_intent: { to: "payment_intent" },
    line_items: { to: "item", list: true },
    customer: { to: null },
    invoice: { to: null },
    payment_link: { to: null },
    setup_intent: { to: null },
    subscription: { to: null },
  },
  payment_intent: {
    latest_charge: { to: "charge" },
    customer: { to: null },
    invoice: { to: null },
    review: { to: null },
    application: { to: null },
    on_behalf_of: { to: null },
  },
  charge: {
    payment_intent: { to: "payment_intent" },
    refunds: { to: "refund", list: true },
    balance_transaction: { to: null },
    customer: { to: null },
    invoice: { to: null },
    application: { to: null },
    application_fee: { to: null },
    review: { to: null },
  },
  refund: { payment_intent: { to: "payment_intent" }, charge: { to: "charge" }, balance_transaction: { to: null } },
  item: { price: { to: "price", inline: true } },
  price: { product: { to: "product" } },
  product: { default_price: { to: null } },
  event: {},
};

export const MAX_EXPAND_LEVELS = 4;

export interface Resolver {
  object(kind: Kind, id: string): JsonObject | null;
  list(kind: Kind, field: string, parent: JsonObject): JsonObject;
}

type Tree = Map<string, Tree>;

/** Checks every path for an object of `kind` (or a list of them) and returns them as a tree. */
export function checkExpand(kind: Kind, paths: readonly string[], isList: boolean): Tree {
  const root: Tree = new Map();
  paths.forEach((path, i) => {
    const segs = path.split(".");
    const refuse = () => paramError(`This property cannot be expanded (${path}).`, `expand[${i}]`);
    if (segs.filter((s) => s !== "data").length > MAX_EXPAND_LEVELS) {
      throw paramError(`You cannot expand more than ${MAX_EXPAND_LEVELS} levels of a property. Property: ${path}`, `expand[${i}]`);
    }
    let node = root;
    let at: Kind | null = kind;
    let k = 0;
    if (isList) {
      if (segs[0] !== "data" || segs.length < 2) throw refuse();
      node = child(node, "data");
      k = 1;
    }
    while (k < segs.length) {
      const seg = segs[k] as string;
      const field: Field | undefined = at ? EXPANDABLE[at][seg] : undefined;
      if (!field) throw refuse();
      node = child(node, seg);
      at = field.to;
      k += 1;
      if (field.list && k < segs.length) {
        if (segs[k] !== "data" || k + 1 >= segs.length) throw refuse();
        node = child(node, "data");
        k += 1;
      }
    }
  });
  return root;
}

function child(node: Tree, key: string): Tree {
  let next = node.get(key);
  if (!next) {
    next = new Map();
    node.set(key, next);
  }
  return next;
}

/** Expands a checked tree in place on one object's JSON. */
export function applyExpand(json: JsonObject, kind: Kind, tree: Tree, resolver: Resolver): JsonObject {
  for (const [key, sub] of tree) {
    const field = EXPANDABLE[kind][key];
    if (!field) continue;
    if (field.list && field.to) {
      const list = resolver.list(kind, key, json);
      const items = sub.get("data");
      if (items) for (const item of list.data as Json[]) applyExpand(item as JsonObject, field.to, items, resolver);
      json[key] = list;
    } else if (field.inline && field.to) {
      const inner = json[key];
      if (inner && typeof inner === "object" && !Array.isArray(inner)) applyExpand(inner, field.to, sub, resolver);
    } else if (field.to) {
      const id = json[key];
      if (typeof id === "string") {
        const found = resolver.object(field.to, id);
        if (found) json[key] = applyExpand(found, field.to, sub, resolver);
      }
    }
  }
  return json;
}

/** Expands `data.…` paths on every item of a list. */
export function applyExpandToList(list: JsonObject, kind: Kind, tree: Tree, resolver: Resolver): JsonObject {
  const items = tree.get("data");
  if (items) for (const item of list.data as Json[]) applyExpand(item as JsonObject, kind, items, resolver);
  return list;
}
