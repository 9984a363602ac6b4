import { z } from "zod";
import { MAX_BY_UNIT, MAX_CELLS_PER_BANK, MAX_QUANTITY } from "../bank/bounds";
import { parseQuantity, type QuantityUnit } from "../quantities";
import { ORDER_NUMBER_PATTERN } from "../orders/order-number";
import { QUOTE_NUMBER_PATTERN } from "../quoting/quote-number";
import { ORDER_STATUSES, PAYMENT_KINDS, PAYMENT_STATUSES } from "../vocabulary";
import { text } from "./text";

/**
 * Request and response shapes of checkout, the orders API, and the desk's order actions (moves,
 * test records, refunds, cancellation). The same schemas run in the forms (react-hook-form) and on
 * the server, and describe the JSON routes for the OpenAPI document.
 */

/** Longest note on an order move, a refund reason or a test. */
export const MAX_ORDER_NOTE_LENGTH = 1000;
/** Longest carrier name and tracking reference. */
export const MAX_CARRIER_LENGTH = 100;
export const MAX_TRACKING_LENGTH = 100;
/** Most quote revisions a quote may have (a revision number beyond it cannot exist). */
const MAX_REVISION = 10_000;
/** A test's hold at voltage: at most a week, in minutes. */
export const MAX_HOLD_MINUTES = 7 * 24 * 60;

const quoteNumber = z.string().regex(QUOTE_NUMBER_PATTERN, "Not a quote number (Q-2026-0001).");
const orderNumber = z.string().regex(ORDER_NUMBER_PATTERN, "Not an order number (O-2026-0001).");
const money = z.object({ amount: z.string().regex(/^\d+(\.\d+)?$/), currency: z.string().length(3) });

// ---- checkout ------------------------------------------------------------------------------------

/** `POST /api/v1/shops/{shop}/quotes/{number}/checkout`: which revision the customer accepted and what they pay now. */
export const checkoutRequestSchema = z.object({
  revision: z.number({ error: "Say which revision you accept." }).int().min(1).max(MAX_REVISION),
  kind: z.enum(PAYMENT_KINDS, { error: "Choose the whole amount, the deposit or the balance." }),
});
export type CheckoutRequest = z.infer<typeof checkoutRequestSchema>;

/** The answer: where to send the customer to pay, and the session's id. */
export const checkoutResponseSchema = z.object({ url: z.string().url(), sessionId: z.string() });
export type CheckoutResponse = z.infer<typeof checkoutResponseSchema>;

/** The "Accept and pay" server action's input: the checkout body with the quote's number. */
export const startCheckoutSchema = checkoutRequestSchema.extend({ number: quoteNumber });
export type StartCheckoutInput = z.infer<typeof startCheckoutSchema>;

/** `GET …/quotes/{number}/checkout?session=…`: where one checkout stands, for the success page's polling. */
export const checkoutStateQuerySchema = z.object({ session: z.string().regex(/^cs_[A-Za-z0-9_]{1,200}$/, "Not a checkout session id.") });
export const checkoutStateSchema = z.object({
  sessionId: z.string(),
  status: z.enum(PAYMENT_STATUSES),
  kind: z.enum(PAYMENT_KINDS),
  amount: money,
  /** set once the payment service has confirmed the payment and the order exists */
  orderNumber: z.string().nullable(),
});
export type CheckoutState = z.infer<typeof checkoutStateSchema>;

// ---- the orders API ------------------------------------------------------------------------------

/** `GET /api/v1/shops/{shop}/orders`: the staff's view of all orders, or a customer's own. */
export const ordersResponseSchema = z.object({
  orders: z.array(
    z.object({
      number: z.string(),
      quoteNumber: z.string(),
      status: z.enum(ORDER_STATUSES),
      amountPaid: money,
      amountRefunded: money,
      total: money,
      dueDate: z.string(),
      history: z.array(z.object({ status: z.enum(ORDER_STATUSES), at: z.string() })),
    }),
  ),
  total: z.number().int(),
  page: z.number().int(),
  size: z.number().int(),
});
export type OrdersResponse = z.infer<typeof ordersResponseSchema>;

// ---- the desk's order actions --------------------------------------------------------------------

const note = text().trim().max(MAX_ORDER_NOTE_LENGTH, `Keep the note under ${MAX_ORDER_NOTE_LENGTH} characters.`);

const moveFields = {
  to: z.enum(ORDER_STATUSES, { error: "Choose where the order goes." }),
  note: note.default(""),
  carrier: text().trim().max(MAX_CARRIER_LENGTH, `Keep the carrier under ${MAX_CARRIER_LENGTH} characters.`).default(""),
  trackingReference: text().trim().max(MAX_TRACKING_LENGTH, `Keep the reference under ${MAX_TRACKING_LENGTH} characters.`).default(""),
};

function shippingNeedsTracking(v: { to: string; carrier: string; trackingReference: string }, ctx: z.RefinementCtx) {
  if (v.to !== "shipped") return;
  if (!v.carrier) ctx.addIssue({ code: "custom", path: ["carrier"], message: "Name the carrier the bank ships with." });
  if (!v.trackingReference) ctx.addIssue({ code: "custom", path: ["trackingReference"], message: "Enter the carrier's tracking reference." });
}

/** The move form's own fields (the order and where it stood come with the page). */
export const moveOrderFormSchema = z.object(moveFields).superRefine(shippingNeedsTracking);

/** Moving an order: from the status the form showed (a move made meanwhile is refused) to the next. */
export const moveOrderSchema = z.object({ number: orderNumber, from: z.enum(ORDER_STATUSES), ...moveFields }).superRefine(shippingNeedsTracking);
export type MoveOrderInput = z.infer<typeof moveOrderSchema>;

/** Cancelling before kitting, with a reason, and whether to refund what was paid. */
export const cancelOrderSchema = z.object({
  number: orderNumber,
  from: z.enum(ORDER_STATUSES),
  note: note.min(1, "Say why the order is cancelled."),
  refund: z.boolean(),
  idempotencyKey: z.string().uuid(),
});
export type CancelOrderInput = z.infer<typeof cancelOrderSchema>;

/** A refund: how much (a decimal in the order's currency), why (required), and the form's one-submit key. */
export const refundOrderSchema = z.object({
  number: orderNumber,
  amount: text()
    .trim()
    .regex(/^\d{1,12}([.,]\d{1,4})?$/, "Enter an amount like 120.50.")
    .transform((v) => v.replace(",", ".")),
  reason: note.min(1, "Say why the money goes back; the customer's order shows it."),
  idempotencyKey: z.string().uuid(),
});
export type RefundOrderInput = z.input<typeof refundOrderSchema>;

/** An engineering value as people type it ("23.4 F", "12 mΩ"), within its physical bound. */
function measured(unit: keyof typeof MAX_BY_UNIT & QuantityUnit, label: string, { allowZero = false } = {}) {
  const max = MAX_BY_UNIT[unit];
  return text()
    .max(60, "Keep this under 60 characters.")
    .transform((raw, ctx) => {
      const r = parseQuantity(raw, unit, { allowZero });
      if (!r.ok) {
        ctx.addIssue({ code: "custom", message: `${label}: ${r.message}.` });
        return z.NEVER;
      }
      if (r.value > max) {
        ctx.addIssue({ code: "custom", message: `${label} is beyond any bank this shop could build.` });
        return z.NEVER;
      }
      return r.value;
    });
}

/** Each position's voltage, one per line, in position order. */
const positionVoltages = text()
  .max(MAX_CELLS_PER_BANK * 24, "Too many values.")
  .transform((raw, ctx) => {
    const lines = raw
      .split(/[\n;]+/)
      .map((l) => l.trim())
      .filter(Boolean);
    if (lines.length === 0) {
      ctx.addIssue({ code: "custom", message: "Enter each position's voltage, one per line." });
      return z.NEVER;
    }
    if (lines.length > MAX_CELLS_PER_BANK) {
      ctx.addIssue({ code: "custom", message: `At most ${MAX_CELLS_PER_BANK} values.` });
      return z.NEVER;
    }
    const values: number[] = [];
    for (const [i, line] of lines.entries()) {
      const r = parseQuantity(line, "V", { allowZero: true });
      if (!r.ok || r.value > MAX_BY_UNIT.V) {
        ctx.addIssue({ code: "custom", message: `Line ${i + 1}: ${r.ok ? "beyond any bank's voltage" : r.message}.` });
        return z.NEVER;
      }
      values.push(r.value);
    }
    return values;
  });

/** One bank's test as the tester types it: values with their units, the hold, each position's voltage. */
export const recordTestSchema = z.object({
  number: orderNumber,
  bank: z.coerce.number({ error: "Choose the bank." }).int("Choose the bank.").min(1, "Choose the bank.").max(MAX_QUANTITY),
  capacitance: measured("F", "Capacitance"),
  esr: measured("Ω", "ESR"),
  leakageCurrent: measured("A", "Leakage current", { allowZero: true }),
  holdMinutes: z.coerce
    .number({ error: "Enter the hold in minutes." })
    .int("Enter whole minutes.")
    .min(0, "Enter whole minutes.")
    .max(MAX_HOLD_MINUTES, "At most a week (10,080 minutes)."),
  positionVoltages,
  note: note.default(""),
});
export type RecordTestInput = z.input<typeof recordTestSchema>;
