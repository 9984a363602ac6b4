import { describe, expect, it } from "vitest";
import { canonical, decodeForm, FormError, MAX_PAIRS, paramName, splitKey } from "@/dev/stripe-standin/form";

/** Null-prototype trees compared as plain data. */
const plain = (v: unknown) => JSON.parse(JSON.stringify(v)) as unknown;

describe("splitKey", () => {
  it.each([
    ["mode", ["mode"]],
    ["line_items[0][price_data][currency]", ["line_items", "0", "price_data", "currency"]],
    ["expand[]", ["expand", ""]],
    ["metadata[order no.]", ["metadata", "order no."]],
  ])("%s", (key, parts) => {
    expect(splitKey(key)).toEqual(parts);
  });

  it.each(["", "[0]", "a[b", "a]b[", "a[b]c"])("refuses the malformed key %j", (key) => {
    expect(splitKey(key)).toBeNull();
  });
});

describe("decodeForm", () => {
  it.each([
    ["", {}],
    ["mode=payment", { mode: "payment" }],
    ["a=1&a=2", { a: "2" }],
    ["name=Balancing+resistor%20set", { name: "Balancing resistor set" }],
    ["line_items[0][quantity]=2&line_items[0][price_data][currency]=eur", { line_items: { "0": { quantity: "2", price_data: { currency: "eur" } } } }],
    ["expand[]=a&expand[]=b", { expand: { "0": "a", "1": "b" } }],
    ["metadata=", { metadata: "" }],
  ])("%j", (text, tree) => {
    expect(plain(decodeForm(text))).toEqual(plain(tree));
  });

  it("keeps a key named __proto__ as data, not as a prototype", () => {
    const t = decodeForm("metadata[__proto__]=x");
    const m = t.metadata as Record<string, unknown>;
    expect(Object.getPrototypeOf(m)).toBeNull();
    expect(Object.keys(m)).toEqual(["__proto__"]);
  });

  it.each([
    ["a=1&a[b]=2", "both a value and a hash"],
    ["a[b]=1&a=2", "both a value and a hash"],
    ["a[12345]=1", "Index too large"],
    ["a[b][c][d][e][f][g][h][i]=1", "nested too deeply"],
    ["a[=1", "Invalid parameter name"],
    ["a=%E0%A4%A", "not valid form encoding"],
  ])("refuses %j", (text, message) => {
    expect(() => decodeForm(text)).toThrow(FormError);
    expect(() => decodeForm(text)).toThrow(message);
  });

  it(`refuses more than ${MAX_PAIRS} pairs`, () => {
    const text = Array.from({ length: MAX_PAIRS + 1 }, (_, i) => `metadata[k${i}]=v`).join("&");
    expect(() => decodeForm(text)).toThrow("Too many parameters");
  });
});

describe("paramName and canonical", () => {
  it("names parameters with brackets, as Stripe's errors do", () => {
    expect(paramName(["line_items", 0, "price_data", "unit_amount"])).toBe("line_items[0][price_data][unit_amount]");
    expect(paramName(["mode"])).toBe("mode");
  });

  it("gives the same string for the same parameters in any order, and another for other values", () => {
    const a = canonical(decodeForm("amount=100&payment_intent=pi_1&metadata[a]=1&metadata[b]=2"));
    expect(canonical(decodeForm("metadata[b]=2&payment_intent=pi_1&metadata[a]=1&amount=100"))).toBe(a);
    expect(canonical(decodeForm("amount=101&payment_intent=pi_1&metadata[a]=1&metadata[b]=2"))).not.toBe(a);
  });
});
