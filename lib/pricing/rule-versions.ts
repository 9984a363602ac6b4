/**
 * Pricing-rule versions compared field by field, as the rules' history shows them and the audit
 * log records them: each changed field with its label and both values as people read them. Lists
 * (quantity breaks, enclosures) are compared as a whole and shown as one line each. Pure.
 */
import { Dec } from "./decimal";
import type { PricingRules } from "./types";

/** Every rule a shop sets, in the order the form shows them, with its label. */
export const RULE_LABELS: Record<keyof PricingRules, string> = {
  currency: "Currency",
  labourRatePerHour: "Labour rate per hour",
  setupMinutes: "Setup minutes per bank",
  minutesPerCell: "Assembly minutes per cell",
  testMinutes: "Test minutes per bank",
  overheadPct: "Overhead on materials",
  marginPct: "Margin on price",
  taxRatePct: "Tax rate",
  quantityBreaks: "Quantity breaks",
  quoteValidityDays: "Quote validity",
  depositPercent: "Deposit on acceptance",
  interconnectCostPerCell: "Interconnect per cell",
  balancingBoardCost: "Balancing board when the catalog has no cost",
  terminalSetCost: "Terminal set per bank",
  enclosures: "Enclosures",
  enclosurePackingFactor: "Enclosure packing factor",
  balancingResistorCost: "Balancing resistor (retired flat cost)",
  bleederCostPerWatt: "Bleeder per watt (retired flat cost)",
};

const RULE_KEYS = Object.keys(RULE_LABELS) as (keyof PricingRules)[];

/** A rule's value as people read it. */
export function formatRule(key: keyof PricingRules, rules: Partial<PricingRules>): string {
  const v = rules[key];
  if (v === undefined || v === null) return "—";
  switch (key) {
    case "overheadPct":
    case "marginPct":
    case "taxRatePct":
      return `${new Dec(v as string).toString()} %`;
    case "depositPercent":
      return v === 0 ? "none: the full total on acceptance" : `${String(v)} %`;
    case "setupMinutes":
    case "minutesPerCell":
    case "testMinutes":
      return `${String(v)} min`;
    case "quoteValidityDays":
      return `${String(v)} days`;
    case "enclosurePackingFactor":
      return `× ${String(v)}`;
    case "quantityBreaks": {
      const list = [...(v as PricingRules["quantityBreaks"])].sort((a, b) => a.minQuantity - b.minQuantity);
      return list.length === 0 ? "none" : list.map((b) => `from ${b.minQuantity}: ${new Dec(b.discountPct).toString()} %`).join("; ");
    }
    case "enclosures": {
      const list = v as PricingRules["enclosures"];
      return list.length === 0 ? "none" : list.map((e) => `${e.name} (${Number((e.maxVolumeM3 * 1000).toPrecision(6))} L) ${e.cost}`).join("; ");
    }
    case "currency":
      return String(v);
    default:
      return new Dec(v as string).toString();
  }
}

export interface RuleChange {
  key: keyof PricingRules;
  label: string;
  from: string;
  to: string;
}

/** The rules that differ between two versions, each worded old → new; empty when they are the same. */
export function diffRules(before: Partial<PricingRules>, after: Partial<PricingRules>): RuleChange[] {
  const out: RuleChange[] = [];
  for (const key of RULE_KEYS) {
    const from = formatRule(key, before);
    const to = formatRule(key, after);
    if (from !== to) out.push({ key, label: RULE_LABELS[key], from, to });
  }
  return out;
}
