/**
 * The product's words, in one place: the names of technologies, topologies, roles and statuses,
 * the lists of statuses (the database enums are built from them), and the one description of a
 * customer's requirement. Pages, e-mails, the quote and its PDF all take their words from here.
 * Pure: no framework, no database (client components import it too).
 */
import type { Requirement, Technology, Topology } from "./bank/types";
import type { Role } from "./auth/permissions";
import { formatQuantity as q } from "./quantities";

export const TECHNOLOGY_LABELS: Record<Technology, string> = {
  edlc: "Supercapacitor (EDLC)",
  hybrid: "Hybrid lithium-ion capacitor",
  electrolytic: "Aluminium electrolytic",
  film: "Film",
};

/** Short names for table cells; the full name goes in the cell's title. */
export const TECHNOLOGY_SHORT: Record<Technology, string> = { edlc: "EDLC", hybrid: "Hybrid LIC", electrolytic: "Electrolytic", film: "Film" };

export const TOPOLOGY_LABELS: Record<Topology, string> = {
  "series-of-parallel-groups": "Parallel groups in series",
  "parallel-of-series-strings": "Series strings in parallel",
};

/** "18 S × 4 P": cells in series by cells in parallel. */
export function arrangementLabel(o: { seriesCount: number; parallelCount: number }): string {
  return `${o.seriesCount} S × ${o.parallelCount} P`;
}

export const ROLE_LABELS: Record<Role, string> = { manager: "Manager", estimator: "Estimator", customer: "Customer" };
export const ROLE_PLURALS: Record<Role, string> = { manager: "Managers", estimator: "Estimators", customer: "Customers" };

/**
 * The states of a quote revision (lib/quoting/quote-states.ts says which moves join them). A quote's
 * own status is its latest revision's. "withdrawn" is the shop taking back a sent revision.
 */
export const QUOTE_STATUSES = ["draft", "sent", "accepted", "declined", "expired", "superseded", "withdrawn"] as const;
export type QuoteStatus = (typeof QUOTE_STATUSES)[number];
export const QUOTE_STATUS_LABELS: Record<QuoteStatus, string> = {
  draft: "Draft",
  sent: "Sent",
  accepted: "Accepted",
  declined: "Declined",
  expired: "Expired",
  superseded: "Superseded",
  withdrawn: "Withdrawn",
};
/** The states a quote itself can be in (its latest issued revision's): drafts are not quotes yet and a latest revision is never superseded. */
export const QUOTE_LIST_STATUSES = ["sent", "accepted", "declined", "expired", "withdrawn"] as const satisfies readonly QuoteStatus[];

/** What a message in a quote's thread is: a plain message, a customer's request for a change, or a note the shop issued with a revision. */
export const QUOTE_MESSAGE_KINDS = ["message", "change-request", "decline", "revision-note", "withdrawal"] as const;
export type QuoteMessageKind = (typeof QUOTE_MESSAGE_KINDS)[number];
export const QUOTE_MESSAGE_KIND_LABELS: Record<QuoteMessageKind, string> = {
  message: "Message",
  "change-request": "Change asked for",
  decline: "Declined",
  "revision-note": "With the new revision",
  withdrawal: "Withdrawn by the shop",
};

/** Lines an estimator may add to a quote beside the bank itself. */
export const EXTRA_LINE_KINDS = ["enclosure", "discharge-circuit", "engineering", "freight", "other"] as const;
export type ExtraLineKind = (typeof EXTRA_LINE_KINDS)[number];
export const EXTRA_LINE_LABELS: Record<ExtraLineKind, string> = {
  enclosure: "Enclosure",
  "discharge-circuit": "Switched discharge circuit",
  engineering: "Engineering hours",
  freight: "Freight",
  other: "Other",
};

export const REQUEST_STATUSES = ["quoted", "needs-review", "closed"] as const;
export type RequestStatus = (typeof REQUEST_STATUSES)[number];
export const REQUEST_STATUS_LABELS: Record<RequestStatus, string> = { "needs-review": "Needs review", quoted: "Quoted", closed: "Closed" };

/** What a shop's own systems can hear of through outbound webhooks (db/schema/records.ts). */
export const SHOP_EVENT_TYPES = ["quote.issued", "quote.accepted", "order.status_changed", "payment.refunded", "catalog.imported"] as const;
export type ShopEventType = (typeof SHOP_EVENT_TYPES)[number];

export const OUTBOX_STATUSES = ["waiting", "sent", "failed"] as const;
export type OutboxStatus = (typeof OUTBOX_STATUSES)[number];
export const OUTBOX_STATUS_LABELS: Record<OutboxStatus, string> = { waiting: "Waiting", sent: "Sent", failed: "Failed" };

/** Currencies a shop can open with (ISO 4217 codes), with their names. */
export const SHOP_CURRENCIES = ["EUR", "GBP", "USD", "CHF", "JPY", "KWD"] as const;
type ShopCurrency = (typeof SHOP_CURRENCIES)[number];
export const CURRENCY_NAMES: Record<ShopCurrency, string> = {
  EUR: "euro",
  GBP: "pound sterling",
  USD: "US dollar",
  CHF: "Swiss franc",
  JPY: "yen",
  KWD: "Kuwaiti dinar",
};

export interface LabelledValue {
  label: string;
  value: string;
}

interface RequirementPart extends LabelledValue {
  /** how the part reads inside the one-line description */
  phrase: string;
}

const banks = (n: number) => `${n.toLocaleString("en-GB")} bank${n === 1 ? "" : "s"}`;

/** Every stated part of a requirement, in the order people state them. */
function requirementParts(r: Requirement): RequirementPart[] {
  const parts: RequirementPart[] = [];
  const vmax = q(r.maxVoltage, "V");
  parts.push({ label: "Maximum voltage", value: vmax, phrase: r.minVoltage !== undefined && r.minVoltage > 0 ? `${vmax} → ${q(r.minVoltage, "V")}` : vmax });
  if (r.minVoltage !== undefined) parts.push({ label: "Minimum voltage", value: q(r.minVoltage, "V"), phrase: "" });
  if (r.capacitance !== undefined) parts.push({ label: "Capacitance", value: q(r.capacitance, "F"), phrase: q(r.capacitance, "F") });
  if (r.energy !== undefined) parts.push({ label: "Usable energy", value: q(r.energy, "J"), phrase: `${q(r.energy, "J")} usable` });
  if (r.backup) {
    const backup = `${q(r.backup.power, "W")} for ${q(r.backup.seconds, "s")}`;
    parts.push({ label: "Backup", value: backup, phrase: backup });
  }
  if (r.peakCurrent) {
    const peak = `${q(r.peakCurrent.current, "A")} with at most ${q(r.peakCurrent.maxDrop, "V")} drop`;
    parts.push({ label: "Peak current", value: peak, phrase: `${q(r.peakCurrent.current, "A")} peak with at most ${q(r.peakCurrent.maxDrop, "V")} drop` });
  }
  if (r.maxMass !== undefined) parts.push({ label: "Mass limit", value: q(r.maxMass, "kg"), phrase: `at most ${q(r.maxMass, "kg")}` });
  if (r.maxVolume !== undefined) parts.push({ label: "Volume limit", value: q(r.maxVolume, "m³"), phrase: `at most ${q(r.maxVolume, "m³")}` });
  if (r.technology) parts.push({ label: "Technology", value: TECHNOLOGY_LABELS[r.technology], phrase: `${TECHNOLOGY_LABELS[r.technology]} only` });
  const quantity = r.quantity ?? 1;
  parts.push({ label: "Quantity", value: banks(quantity), phrase: banks(quantity) });
  return parts;
}

/** A requirement in one line: "48 V → 24 V, 20 kJ usable, 2 banks". */
export function describeRequirement(r: Requirement): string {
  return requirementParts(r)
    .map((p) => p.phrase)
    .filter((p) => p !== "")
    .join(", ");
}

/** A requirement as labelled rows (the quote page and its PDF). */
export function requirementFacts(r: Requirement): LabelledValue[] {
  return requirementParts(r).map(({ label, value }) => ({ label, value }));
}
