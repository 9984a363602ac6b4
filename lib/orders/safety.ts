/**
 * The safety words an order carries onto the floor and to the customer (DESIGN.md §6), per
 * technology: supercapacitor (EDLC), electrolytic and film banks are discharged and shorted before
 * handling and ship with a shorting link; hybrid lithium-ion capacitor cells are never shorted nor
 * taken below their minimum voltage, and ship partly charged. Pure.
 */
import type { Technology } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";

/** Whether a bank of this technology may be shorted and shipped with a shorting link. */
export function mayBeShorted(technology: Technology): boolean {
  return technology !== "hybrid";
}

/** The handling rules for a bank on the bench and in transit, most important first. */
export function handlingRules(input: { technology: Technology; maxVoltage: number; safeVoltage: number; storedEnergy: number }): string[] {
  const v = formatQuantity(input.maxVoltage, "V");
  const rules: string[] = [];
  if (mayBeShorted(input.technology)) {
    rules.push(
      `Treat the bank as charged (up to ${v}) until you have measured it. Discharge it through the bleeder or a rated discharge resistor to below ${formatQuantity(input.safeVoltage, "V")}, then short the terminals before touching any conductor.`,
      "Ship it discharged with the shorting link fitted across its terminals; the link stays on until the bank is installed.",
    );
  } else {
    rules.push(
      `Hybrid lithium-ion capacitor cells are never shorted and never taken below their minimum voltage: a short or a deep discharge damages them. Treat the bank as charged (up to ${v}) at all times.`,
      "Ship it partly charged, at the maker's shipping voltage, with the terminals covered and insulated; never fit a shorting link.",
    );
  }
  if (input.storedEnergy >= 10)
    rules.push(
      `It stores up to ${formatQuantity(input.storedEnergy, "J")}: a short across its terminals can burn, arc and throw molten metal. Wear eye protection and insulated gloves.`,
    );
  rules.push(
    "These are engineering estimates and the shop's practice: local electrical codes and licensed practice decide how the bank is built, tested, shipped and installed.",
  );
  return rules;
}

/** One sentence for the "shipped" e-mail: what arrives with the bank about its charge. */
export function shippingNote(technology: Technology): string {
  return mayBeShorted(technology)
    ? "The bank travels discharged with a shorting link across its terminals: keep the link fitted until the bank is installed, and treat the bank as charged until you have measured it."
    : "The bank's hybrid lithium-ion capacitor cells travel partly charged and must never be shorted: keep the terminal covers on until the bank is installed.";
}
