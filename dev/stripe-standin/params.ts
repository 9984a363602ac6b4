/**
 * Parameter checking against Stripe's own schemas (spec.ts): form strings are turned into the
 * schema's types (integers, booleans, arrays, hashes) and refused the way the real API refuses
 * them — an unknown parameter at any depth, a wrong type, a value outside an enum, a string over
 * its maximum length, an empty string where nothing may be unset. Stripe's schemas leave nested
 * objects open (no `additionalProperties: false`) but the API refuses unknown nested keys too, so
 * every object with listed properties is closed here.
 *
 * Then a second, smaller gate: the stand-in implements only the parameters listed in
 * `Implemented` trees; a parameter the real API takes but the stand-in does not model is refused
 * with code `standin_unsupported` rather than silently ignored.
 */
import { paramError } from "./errors";
import { paramName, type FormTree, type FormValue } from "./form";
import type { Schema } from "./spec";

type Path = (string | number)[];
/** What a decoded, type-checked request looks like: strings, numbers, booleans, arrays, hashes. */
export type ParamValue = string | number | boolean | ParamValue[] | ParamObject;
export interface ParamObject {
  [key: string]: ParamValue;
}
export type Params = ParamObject;

function isTree(v: FormValue): v is FormTree {
  return typeof v === "object";
}

function shortValue(s: string): string {
  return s.length > 40 ? `${s.slice(0, 40)}…` : s;
}

function oneOfList(values: readonly unknown[]): string {
  const items = values.map(String);
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")}, or ${items[items.length - 1]}`;
}

/** The empty-string branch Stripe adds to params that may be unset (`metadata=`). */
function isUnsetBranch(s: Schema): boolean {
  return s.type === "string" && Array.isArray(s.enum) && s.enum.length === 1 && s.enum[0] === "";
}

function coerceAnyOf(value: FormValue, schema: Schema & { anyOf: Schema[] }, path: Path): ParamValue {
  if (value === "" && schema.anyOf.some(isUnsetBranch)) return "";
  const errors: { branch: Schema; error: unknown }[] = [];
  for (const branch of schema.anyOf) {
    if (isUnsetBranch(branch)) continue;
    try {
      return coerce(value, branch, path);
    } catch (error) {
      errors.push({ branch, error });
    }
  }
  // Report the branch of the value's own kind: a hash for a hash, a scalar for a string.
  const wantsContainer = isTree(value);
  const preferred = errors.find(({ branch }) => (branch.type === "object" || branch.type === "array") === wantsContainer) ?? errors[0];
  throw preferred?.error ?? paramError(`Invalid ${paramName(path)}`, paramName(path));
}

/** Converts one decoded form value to the schema's type, or throws Stripe's 400 for it. */
export function coerce(value: FormValue, schema: Schema, path: Path): ParamValue {
  const name = paramName(path);
  if (schema.anyOf) return coerceAnyOf(value, schema as Schema & { anyOf: Schema[] }, path);
  if (value === "") {
    throw paramError(
      `You passed an empty string for '${name}'. We assume empty values are an attempt to unset a parameter; however '${name}' cannot be unset. You should remove '${name}' from your request or supply a non-empty value.`,
      name,
      "parameter_invalid_empty",
    );
  }
  switch (schema.type) {
    case "string": {
      if (isTree(value)) throw paramError(`Invalid string: ${name} must be a string, not a hash`, name);
      if (schema.enum && !schema.enum.includes(value)) {
        throw paramError(`Invalid ${name}: must be one of ${oneOfList(schema.enum)}`, name);
      }
      if (schema.maxLength !== undefined && value.length > schema.maxLength) {
        throw paramError(`Invalid string: ${shortValue(value)}; must be at most ${schema.maxLength} characters`, name);
      }
      if (schema.format === "decimal" && !/^-?\d+(\.\d+)?$/.test(value)) throw paramError(`Invalid decimal: ${shortValue(value)}`, name);
      return value;
    }
    case "integer": {
      if (isTree(value) || !/^-?\d{1,16}$/.test(value) || !Number.isSafeInteger(Number(value))) {
        throw paramError(`Invalid integer: ${isTree(value) ? "a hash" : shortValue(value)}`, name, "parameter_invalid_integer");
      }
      return Number(value);
    }
    case "number": {
      if (isTree(value) || !/^-?\d{1,16}(\.\d{1,12})?$/.test(value)) throw paramError(`Invalid number: ${isTree(value) ? "a hash" : shortValue(value)}`, name);
      return Number(value);
    }
    case "boolean": {
      if (value !== "true" && value !== "false") throw paramError(`Invalid boolean: ${isTree(value) ? "a hash" : shortValue(value)}`, name);
      return value === "true";
    }
    case "array": {
      if (!isTree(value) || !Object.keys(value).every((k) => /^\d+$/.test(k))) throw paramError("Invalid array", name);
      const items = schema.items ?? {};
      return Object.keys(value)
        .sort((a, b) => Number(a) - Number(b))
        .map((k, i) => coerce(value[k] as FormValue, items, [...path, i]));
    }
    case "object":
    default: {
      if (schema.type !== "object" && schema.type !== undefined) throw new Error(`unsupported schema type ${String(schema.type)} at ${name}`);
      if (!isTree(value)) throw paramError("Invalid hash", name);
      return coerceObject(value, schema, path);
    }
  }
}

function coerceObject(value: FormTree, schema: Schema, path: Path): ParamObject {
  const properties = schema.properties ?? {};
  const extra = typeof schema.additionalProperties === "object" ? schema.additionalProperties : null;
  // Unknown keys first, as the real API reports them before anything else.
  for (const key of Object.keys(value)) {
    if (!Object.prototype.hasOwnProperty.call(properties, key) && !extra) {
      const unknown = paramName([...path, key]);
      throw paramError(`Received unknown parameter: ${unknown}`, unknown, "parameter_unknown");
    }
  }
  for (const key of schema.required ?? []) {
    if (value[key] === undefined) throw paramError(`Missing required param: ${paramName([...path, key])}.`, paramName([...path, key]), "parameter_missing");
  }
  const out = Object.create(null) as ParamObject;
  for (const key of Object.keys(value)) {
    const known = Object.prototype.hasOwnProperty.call(properties, key);
    const sub = known ? (properties[key] as Schema) : (extra as Schema);
    // `metadata[key]=` unsets that one key: an empty value is allowed for free-form keys.
    out[key] = !known && value[key] === "" && sub.type === "string" ? "" : coerce(value[key] as FormValue, sub, [...path, key]);
  }
  return out;
}

/** The parameters one operation of the stand-in models: `true` takes the whole subtree. */
export type Implemented = true | { [key: string]: Implemented };

/** Refuses a parameter the real API accepts but this stand-in does not model. */
export function checkImplemented(value: ParamValue, implemented: Implemented, path: Path): void {
  if (implemented === true || typeof value !== "object") return;
  if (Array.isArray(value)) {
    value.forEach((item, i) => checkImplemented(item, implemented, [...path, i]));
    return;
  }
  for (const key of Object.keys(value)) {
    const sub = implemented[key];
    const name = paramName([...path, key]);
    if (sub === undefined) {
      throw paramError(
        `The local Stripe stand-in does not implement the parameter ${name} (the real API accepts it). Add it in dev/stripe-standin if the app needs it.`,
        name,
        "standin_unsupported",
      );
    }
    checkImplemented(value[key] as ParamValue, sub, [...path, key]);
  }
}

/** Every path of an `Implemented` tree must exist in the schema: a typo there fails at start. */
export function assertImplementedInSchema(implemented: Implemented, schema: Schema, path: Path): void {
  if (implemented === true) return;
  let target: Schema | undefined = schema;
  if (target.anyOf) target = target.anyOf.find((s) => s.type === "object" || s.type === "array");
  if (target?.type === "array") target = target.items;
  for (const key of Object.keys(implemented)) {
    const sub = target?.properties?.[key];
    if (!sub) throw new Error(`stand-in parameter ${paramName([...path, key])} is not in Stripe's description`);
    assertImplementedInSchema(implemented[key] as Implemented, sub, [...path, key]);
  }
}

/** Metadata limits (50 keys, keys ≤ 40 characters, values ≤ 500), recalled from Stripe's docs on metadata. */
export function checkMetadata(value: ParamValue | undefined, param: string): void {
  if (value === undefined || typeof value !== "object" || Array.isArray(value)) return;
  const keys = Object.keys(value);
  if (keys.length > 50) throw paramError(`Invalid ${param}: metadata can have at most 50 keys`, param);
  for (const k of keys) {
    if (k.length > 40) throw paramError(`Invalid ${param}: metadata keys can be at most 40 characters long (${shortValue(k)})`, `${param}[${k}]`);
    const v = value[k];
    if (typeof v === "string" && v.length > 500) throw paramError(`Invalid ${param}: metadata values can be at most 500 characters long`, `${param}[${k}]`);
  }
}
