import { z } from "zod";
import { MAX_QUANTITY, MAX_VOLUME } from "../bank/bounds";
import { ISO_4217_MINOR_UNITS, isKnownCurrency } from "../pricing/currency";
import type { PricingRules } from "../pricing/types";
import { validatePricingRules } from "../pricing/validate";
import { text } from "./text";

/**
 * A shop's pricing rules as the API and the desk's form send them, each bounded, with the money and
 * percentage checks of lib/pricing/validate.ts (messages at the field). The rules-form fields are
 * text as people type them; the API takes the rule set itself.
 */

/** Most quantity breaks and enclosures one rule set holds. */
export const MAX_RULE_LIST = 20;
/** Longest time the form takes for one labour step: two working days in minutes. */
export const MAX_MINUTES = 2 * 8 * 60;
/** Longest a quote may stay valid. */
export const MAX_VALIDITY_DAYS = 365;
/** Longest reason for a change. */
export const MAX_REASON = 500;

/** Every current ISO 4217 code a shop can price in, A to Z. */
export const CURRENCY_CODES = Object.keys(ISO_4217_MINOR_UNITS).sort();

const money = z.string().regex(/^\d+(\.\d+)?$/, 'Write an amount like "68.00" (a point, no currency sign)');
const pct = z.string().regex(/^\d+(\.\d+)?$/, 'Write a percentage like "12.5"');
const minutes = z.number().min(0).max(MAX_MINUTES, `At most ${MAX_MINUTES} minutes`);

export const pricingRulesSchema = z
  .strictObject({
    currency: z.string().refine(isKnownCurrency, "Choose an ISO 4217 currency code, such as EUR"),
    labourRatePerHour: money,
    setupMinutes: minutes,
    minutesPerCell: minutes,
    testMinutes: minutes,
    overheadPct: pct,
    marginPct: pct,
    taxRatePct: pct,
    interconnectCostPerCell: money,
    balancingBoardCost: money.optional(),
    // retired flat resistor costs (resistors are catalog parts now): read back from old rule sets, never used
    balancingResistorCost: money.optional(),
    bleederCostPerWatt: money.optional(),
    terminalSetCost: money,
    enclosures: z.array(z.strictObject({ name: text().trim().min(1).max(120), maxVolumeM3: z.number().gt(0).max(MAX_VOLUME), cost: money })).max(MAX_RULE_LIST),
    enclosurePackingFactor: z.number().min(1).max(10),
    quantityBreaks: z.array(z.strictObject({ minQuantity: z.number().int().min(1).max(MAX_QUANTITY), discountPct: pct })).max(MAX_RULE_LIST),
    quoteValidityDays: z.number().int().min(1).max(MAX_VALIDITY_DAYS),
    depositPercent: z.number().min(0, "At least 0 % (0 = the full total on acceptance)").max(100, "At most 100 %"),
  })
  .superRefine(
    (rules, ctx) => {
      for (const issue of validatePricingRules(rules as PricingRules)) {
        const path = issue.path
          .split(/[.[\]]/)
          .filter(Boolean)
          .map((p) => (/^\d+$/.test(p) ? Number(p) : p));
        ctx.addIssue({ code: "custom", path, message: issue.message });
      }
    },
    // the money and percentage rules once every field has its shape and bounds (one message per field)
    { when: (payload) => payload.issues.length === 0 },
  );

/** PUT /api/v1/shops/{shop}/pricing-rules: the whole rule set and why it changes; `version` (from a GET) refuses a rule set changed since (409). */
export const putPricingRulesSchema = z.strictObject({
  rules: pricingRulesSchema,
  reason: text().trim().min(3, "Say why the rules change (at least 3 characters)").max(MAX_REASON),
  version: z.number().int().min(0).optional(),
});
export type PutPricingRulesInput = z.infer<typeof putPricingRulesSchema>;

/** GET /api/v1/shops/{shop}/pricing-rules: the rules in force and the version they are (0: never changed since the shop opened). */
export const pricingRulesResponseSchema = z.object({
  rules: pricingRulesSchema,
  version: z.number().int(),
  reason: z.string().nullable(),
  savedAt: z.string().nullable(),
});

// ---- the desk's form: text fields ----

const t = (max = 40) => text().max(max, `Keep this under ${max} characters`);

export const pricingRulesFormSchema = z.object({
  currency: t(3),
  labourRatePerHour: t(),
  setupMinutes: t(),
  minutesPerCell: t(),
  testMinutes: t(),
  overheadPct: t(),
  marginPct: t(),
  taxRatePct: t(),
  interconnectCostPerCell: t(),
  balancingBoardCost: t(),
  terminalSetCost: t(),
  enclosurePackingFactor: t(),
  quoteValidityDays: t(),
  depositPercent: t(),
  quantityBreaks: z.array(z.object({ minQuantity: t(), discountPct: t() })).max(MAX_RULE_LIST, `At most ${MAX_RULE_LIST} breaks`),
  enclosures: z.array(z.object({ name: t(120), volumeLitres: t(), cost: t() })).max(MAX_RULE_LIST, `At most ${MAX_RULE_LIST} enclosures`),
  reason: text().max(MAX_REASON, `Keep the reason under ${MAX_REASON} characters`),
});
export type PricingRulesFormValues = z.infer<typeof pricingRulesFormSchema>;

const num = (s: string) => (/^\s*\d+(\.\d+)?\s*$/.test(s) ? Number(s) : Number.NaN);
const dec = (s: string) => s.trim();

/** The form's text as a rule set (the schema above then checks it). */
export function rulesFromForm(v: PricingRulesFormValues): Record<string, unknown> {
  return {
    currency: v.currency.trim().toUpperCase(),
    labourRatePerHour: dec(v.labourRatePerHour),
    setupMinutes: num(v.setupMinutes),
    minutesPerCell: num(v.minutesPerCell),
    testMinutes: num(v.testMinutes),
    overheadPct: dec(v.overheadPct),
    marginPct: dec(v.marginPct),
    taxRatePct: dec(v.taxRatePct),
    interconnectCostPerCell: dec(v.interconnectCostPerCell),
    ...(v.balancingBoardCost.trim() === "" ? {} : { balancingBoardCost: dec(v.balancingBoardCost) }),
    terminalSetCost: dec(v.terminalSetCost),
    enclosures: v.enclosures.map((e) => ({ name: e.name.trim(), maxVolumeM3: num(e.volumeLitres) / 1000, cost: dec(e.cost) })),
    enclosurePackingFactor: num(v.enclosurePackingFactor),
    quantityBreaks: v.quantityBreaks.map((b) => ({ minQuantity: num(b.minQuantity), discountPct: dec(b.discountPct) })),
    quoteValidityDays: num(v.quoteValidityDays),
    depositPercent: num(v.depositPercent),
  };
}

/** A rule set as the form's text. */
export function formFromRules(r: PricingRules): PricingRulesFormValues {
  return {
    currency: r.currency,
    labourRatePerHour: r.labourRatePerHour,
    setupMinutes: String(r.setupMinutes),
    minutesPerCell: String(r.minutesPerCell),
    testMinutes: String(r.testMinutes),
    overheadPct: r.overheadPct,
    marginPct: r.marginPct,
    taxRatePct: r.taxRatePct,
    interconnectCostPerCell: r.interconnectCostPerCell,
    balancingBoardCost: r.balancingBoardCost ?? "",
    terminalSetCost: r.terminalSetCost,
    enclosurePackingFactor: String(r.enclosurePackingFactor),
    quoteValidityDays: String(r.quoteValidityDays),
    depositPercent: String(r.depositPercent),
    quantityBreaks: r.quantityBreaks.map((b) => ({ minQuantity: String(b.minQuantity), discountPct: b.discountPct })),
    enclosures: r.enclosures.map((e) => ({ name: e.name, volumeLitres: String(Number((e.maxVolumeM3 * 1000).toPrecision(10))), cost: e.cost })),
    reason: "",
  };
}

/** The form path of a rule-set path ("enclosures.2.maxVolumeM3" → "enclosures.2.volumeLitres"). */
function formPath(path: PropertyKey[]): string {
  const p = path.map(String);
  if (p[0] === "enclosures" && p[2] === "maxVolumeM3") p[2] = "volumeLitres";
  return p.join(".");
}

/**
 * The form read as a rule set and a reason, or the messages for its fields. The same function runs
 * in the browser (react-hook-form's resolver) and in the server action.
 */
export function readRulesForm(
  v: PricingRulesFormValues,
  opts: { requireReason: boolean },
): { ok: true; rules: PricingRules; reason: string } | { ok: false; fieldErrors: Record<string, string> } {
  const fieldErrors: Record<string, string> = {};
  const candidate = rulesFromForm(v);
  const parsed = pricingRulesSchema.safeParse(candidate);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) {
      const key = formPath(issue.path);
      const msg = issue.code === "invalid_type" ? "Write a number here" : issue.message;
      fieldErrors[key] ??= msg;
    }
    // the money and percentage rules too, so every field's problem shows at once
    for (const issue of validatePricingRules(candidate as unknown as PricingRules))
      fieldErrors[formPath(issue.path.split(/[.[\]]/).filter(Boolean))] ??= issue.message;
  }
  const reason = v.reason.trim();
  if (opts.requireReason && reason.length < 3) fieldErrors.reason = "Say why the rules change: the history keeps it (at least 3 characters)";
  if (!parsed.success || Object.keys(fieldErrors).length > 0) return { ok: false, fieldErrors };
  return { ok: true, rules: parsed.data as PricingRules, reason };
}

/** Saving the rules from the desk: the form, and the version it was loaded at. */
export const savePricingRulesSchema = z.object({ values: pricingRulesFormSchema, version: z.number().int().min(0) });
/** Previewing a change: the form as it stands. */
export const previewPricingRulesSchema = z.object({ values: pricingRulesFormSchema });

/** The rules form as react-hook-form checks it: the shapes, then the same reading as the server (messages at the fields). */
export const pricingRulesFormCheckedSchema = pricingRulesFormSchema.superRefine((values, ctx) => {
  const r = readRulesForm(values, { requireReason: true });
  if (!r.ok)
    for (const [path, message] of Object.entries(r.fieldErrors))
      ctx.addIssue({ code: "custom", path: path.split(".").map((p) => (/^\d+$/.test(p) ? Number(p) : p)), message });
});
