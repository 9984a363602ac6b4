/**
 * The product's words, in one place: the names of technologies, topologies, roles and statuses,
 * the lists of statuses (the database enums are built from them), and the one description of a
 * customer's requirement. Pages, e-mails, the quote and its PDF all take their words from here.
 * Pure: no framework, no database (client components import it too).
 */
import type { FaultFilter, Requirement, Technology, Topology } from "./bank/types";
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

/** The failures a customer may ask a bank to survive, in words ("survives one shorted cell"). */
export const FAULT_FILTER_LABELS: Record<FaultFilter, string> = {
  short: "one shorted cell",
  open: "one open cell",
  both: "one shorted or one open cell",
};

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

/**
 * An order's stages on the floor, in order, then the states beside them (DESIGN.md §5). The moves
 * allowed between them are in lib/orders/stages.ts.
 */
export const ORDER_STATUSES = ["paid", "kitting", "assembling", "testing", "ready", "shipped", "delivered", "on-hold", "cancelled", "refunded"] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];
export const ORDER_STATUS_LABELS: Record<OrderStatus, string> = {
  paid: "Paid",
  kitting: "Kitting",
  assembling: "Assembling",
  testing: "Testing",
  ready: "Ready to ship",
  shipped: "Shipped",
  delivered: "Delivered",
  "on-hold": "On hold",
  cancelled: "Cancelled",
  refunded: "Refunded",
};

/** A checkout's state: waiting on the payment page, paid, or lapsed unpaid. */
export const PAYMENT_STATUSES = ["open", "paid", "expired"] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];
/** What a payment pays: the whole quote, the shop's deposit, or what is left after a deposit. */
export const PAYMENT_KINDS = ["full", "deposit", "balance"] as const;
export type PaymentKind = (typeof PAYMENT_KINDS)[number];
export const PAYMENT_KIND_LABELS: Record<PaymentKind, string> = { full: "Full payment", deposit: "Deposit", balance: "Balance" };

/** What a shop's own systems can hear of through outbound webhooks (db/schema/records.ts). */
export const SHOP_EVENT_TYPES = ["quote.issued", "quote.accepted", "order.status_changed", "payment.refunded", "catalog.imported"] as const;
export type ShopEventType = (typeof SHOP_EVENT_TYPES)[number];
/** What each event means, as the webhook form explains it. */
export const SHOP_EVENT_LABELS: Record<ShopEventType, string> = {
  "quote.issued": "A quote or a new revision of it was issued to a customer",
  "quote.accepted": "A customer accepted a quote",
  "order.status_changed": "An order moved (kitting, assembling, testing, ready, shipped, delivered, cancelled)",
  "payment.refunded": "A payment was refunded",
  "catalog.imported": "A catalog import was applied",
};

/** An outbound webhook endpoint: sending, or stopped (by the manager, or after failing for days). */
export const WEBHOOK_ENDPOINT_STATES = ["active", "disabled"] as const;
export type WebhookEndpointState = (typeof WEBHOOK_ENDPOINT_STATES)[number];
export const WEBHOOK_ENDPOINT_STATE_LABELS: Record<WebhookEndpointState, string> = { active: "Sending", disabled: "Stopped" };

/** One delivery of one event to one endpoint, through its attempts. */
export const WEBHOOK_DELIVERY_STATES = ["waiting", "retrying", "delivered", "failed", "cancelled"] as const;
export type WebhookDeliveryState = (typeof WEBHOOK_DELIVERY_STATES)[number];
export const WEBHOOK_DELIVERY_STATE_LABELS: Record<WebhookDeliveryState, string> = {
  waiting: "Waiting",
  retrying: "Trying again",
  delivered: "Delivered",
  failed: "Gave up",
  cancelled: "Not sent (endpoint stopped)",
};

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
  if (r.ambientTemperature !== undefined) {
    const t = `${Number(r.ambientTemperature.toFixed(1))} °C`;
    parts.push({ label: "Ambient temperature", value: t, phrase: `${t} ambient` });
  }
  if (r.rmsCurrent !== undefined) parts.push({ label: "RMS current", value: q(r.rmsCurrent, "A"), phrase: `${q(r.rmsCurrent, "A")} rms` });
  if (r.survives) {
    const what = FAULT_FILTER_LABELS[r.survives];
    parts.push({ label: "Must survive", value: what, phrase: `survives ${what}` });
  }
  if (r.minLifeYears !== undefined) {
    const years = `${Number(r.minLifeYears.toFixed(1))} years`;
    parts.push({ label: "Expected life at least", value: years, phrase: `lasts ${years}` });
  }
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

/**
 * A "no arrangement" reason from the engine in the product's words: its leading technology key
 * ("edlc: …") becomes the technology's name, and whole numbers of five or more digits are grouped
 * ("20000 cells" → "20,000 cells"), as figures are everywhere else.
 */
export function reasonWords(reason: string): string {
  const m = /^([a-z-]+): /.exec(reason);
  const tech = m?.[1] as Technology | undefined;
  const body = tech && tech in TECHNOLOGY_LABELS ? `${TECHNOLOGY_LABELS[tech]}: ${reason.slice(m?.[0].length ?? 0)}` : reason;
  return body.replace(/(?<![\d.,])\d{5,}(?![\d.,])/g, (n) => Number(n).toLocaleString("en-GB"));
}
