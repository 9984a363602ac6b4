/**
 * The stand-in's state and the life of its objects:
 * - a Checkout Session is created open; paying it with the approving test card creates (or reuses)
 *   its PaymentIntent and a succeeded charge and completes it; the declining card leaves it open
 *   with a failed charge on the PaymentIntent; it expires at `expires_at` or when expired through
 *   the API (its PaymentIntent, if any, is then canceled);
 * - refunds are taken against a succeeded PaymentIntent (or its charge), in full or in part, never
 *   above what is left; card refunds succeed at once, as in test mode;
 * - every change records the events the real service sends for it, in the same order.
 * Everything is in memory; `reset()` forgets it all.
 */
import { missingParam, noSuch, paramError, stateError, StripeApiError } from "./errors";
import type { Kind, Resolver } from "./expand";
import { newId } from "./ids";
import { matchesCreated } from "./lists";
import { formatMinor, isSupportedCurrency, MAX_AMOUNT, minimumAmount } from "./money";
import {
  chargeJson,
  eventJson,
  lineItemJson,
  listJson,
  paymentIntentJson,
  priceJson,
  productJson,
  refundJson,
  sessionJson,
  type ChargeRecord,
  type EventRecord,
  type Json,
  type JsonObject,
  type Metadata,
  type PaymentIntentRecord,
  type PriceRecord,
  type ProductRecord,
  type RefundReason,
  type RefundRecord,
  type SessionRecord,
} from "./objects";
import { checkMetadata, type ParamObject, type Params, type ParamValue } from "./params";

/** What caused a change: an API request (its id and idempotency key) or nothing (the hosted page, the clock). */
export interface Cause {
  id: string | null;
  idempotency_key: string | null;
}
export const NO_REQUEST: Cause = { id: null, idempotency_key: null };

export type TestCard = "success" | "decline";
export interface PayerDetails {
  email?: string | null;
  name?: string | null;
}

/** Bounds from Stripe's docs as recalled: at most 100 line items in payment mode, sessions live 30 min – 24 h. */
export const MAX_LINE_ITEMS = 100;
export const MAX_QUANTITY = 999_999;
export const SESSION_MIN_LIFETIME_S = 30 * 60;
export const SESSION_MAX_LIFETIME_S = 24 * 60 * 60;
/** A line-item list embedded by `expand[]=line_items` holds the first 10 items, as other embedded lists do. */
export const EMBEDDED_LIST_LIMIT = 10;

const DECLINE = { code: "card_declined", declineCode: "generic_decline", message: "Your card was declined." } as const;

function metadataOf(value: ParamValue | undefined): Metadata {
  const out = Object.create(null) as Metadata; // a key named __proto__ stays a key
  if (value && typeof value === "object" && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value)) if (typeof v === "string" && v !== "") out[k] = v;
  }
  return out;
}

function str(value: ParamValue | undefined): string | null {
  return typeof value === "string" ? value : null;
}

function checkUrl(value: string, param: string): void {
  let ok = false;
  try {
    const u = new URL(value);
    ok = u.protocol === "http:" || u.protocol === "https:";
  } catch {
    ok = false;
  }
  if (!ok) throw paramError("Not a valid URL", param, "url_invalid");
}

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;
function checkEmail(value: string, param: string): void {
  if (!EMAIL.test(value)) throw paramError(`Invalid email address: ${value}`, param, "email_invalid");
}

export class StripeModel {
  /** Seconds added to the wall clock (tests move time forward to make sessions expire). */
  clockOffsetS = 0;
  readonly sessions = new Map<string, SessionRecord>();
  readonly products = new Map<string, ProductRecord>();
  readonly prices = new Map<string, PriceRecord>();
  readonly paymentIntents = new Map<string, PaymentIntentRecord>();
  readonly charges = new Map<string, ChargeRecord>();
  readonly refunds = new Map<string, RefundRecord>();
  /** In creation order; lists read them newest first. */
  readonly events: EventRecord[] = [];
  private readonly eventsById = new Map<string, EventRecord>();
  private batch: EventRecord[] = [];
  private seq = 0;

  constructor(
    /** Where the hosted checkout pages are served: the session's `url` starts with it. */
    private readonly publicBase: () => string,
    /** Whether an event has somewhere to go (its `pending_webhooks` starts at 1). */
    private readonly hasWebhookEndpoint: () => boolean,
  ) {}

  now(): number {
    return Math.floor(Date.now() / 1000) + this.clockOffsetS;
  }

  reset(): void {
    this.clockOffsetS = 0;
    for (const m of [this.sessions, this.products, this.prices, this.paymentIntents, this.charges, this.refunds, this.eventsById]) m.clear();
    this.events.length = 0;
    this.batch = [];
  }

  // ---- events -------------------------------------------------------------------------------

  private emit(type: string, object: JsonObject, cause: Cause, previous: JsonObject | null = null): void {
    const event: EventRecord = {
      id: newId.event(),
      seq: ++this.seq,
      created: this.now(),
      type,
      object,
      previousAttributes: previous,
      request: { ...cause },
      pendingWebhooks: this.hasWebhookEndpoint() ? 1 : 0,
    };
    this.events.push(event);
    this.eventsById.set(event.id, event);
    this.batch.push(event);
  }

  /** The events recorded since the last call, in order: the caller hands them to webhook delivery. */
  takeBatch(): EventRecord[] {
    const out = this.batch;
    this.batch = [];
    return out;
  }

  getEvent(id: string): EventRecord {
    const e = this.eventsById.get(id);
    if (!e) throw noSuch("event", id, "id");
    return e;
  }

  /** Newest first, filtered as `GET /v1/events` filters. */
  listEvents(params: Params): EventRecord[] {
    if (params.type !== undefined && params.types !== undefined) {
      throw paramError("You may only specify one of these parameters: type, types.", "types", "parameters_exclusive");
    }
    const types = params.type !== undefined ? [params.type as string] : ((params.types as string[] | undefined) ?? null);
    if (types && types.length > 20) throw paramError("Invalid types: at most 20 types may be given", "types");
    const matchers = types?.map((t) => (t.endsWith(".*") ? (x: string) => x.startsWith(t.slice(0, -1)) : (x: string) => x === t));
    return this.events
      .filter((e) => !matchers || matchers.some((m) => m(e.type)))
      .filter((e) => matchesCreated(e.created, params.created))
      .filter((e) => params.delivery_success === undefined || (e.pendingWebhooks === 0) === params.delivery_success)
      .reverse();
  }

  eventJson(e: EventRecord): JsonObject {
    return eventJson(e);
  }

  // ---- checkout sessions ----------------------------------------------------------------------

  /** Stripe sends no event when a session is created. */
  createSession(params: Params): SessionRecord {
    const now = this.now();
    if (params.mode === undefined) throw missingParam("mode");
    if (params.mode !== "payment")
      throw paramError(`The local Stripe stand-in implements mode=payment only (got ${String(params.mode)}).`, "mode", "standin_unsupported");
    if (params.ui_mode !== undefined && params.ui_mode !== "hosted")
      throw paramError("The local Stripe stand-in implements ui_mode=hosted only.", "ui_mode", "standin_unsupported");
    const pmTypes = params.payment_method_types as string[] | undefined;
    if (pmTypes && pmTypes.some((t) => t !== "card"))
      throw paramError("The local Stripe stand-in takes card payments only.", "payment_method_types", "standin_unsupported");
    if (params.success_url === undefined) throw missingParam("success_url");
    checkUrl(params.success_url as string, "success_url");
    if (params.cancel_url !== undefined) checkUrl(params.cancel_url as string, "cancel_url");
    if (params.customer_email !== undefined) checkEmail(params.customer_email as string, "customer_email");
    checkMetadata(params.metadata, "metadata");
    const pid = params.payment_intent_data as ParamObject | undefined;
    checkMetadata(pid?.metadata, "payment_intent_data[metadata]");
    if (pid?.receipt_email !== undefined) checkEmail(pid.receipt_email as string, "payment_intent_data[receipt_email]");

    const items = params.line_items as ParamObject[] | undefined;
    if (!items || items.length === 0) throw missingParam("line_items");
    if (items.length > MAX_LINE_ITEMS) throw paramError(`You may only specify up to ${MAX_LINE_ITEMS} line items in payment mode.`, "line_items");
    let currency: string | null = null;
    let total = 0;
    items.forEach((item, i) => {
      const at = `line_items[${i}]`;
      const pd = item.price_data as ParamObject | undefined;
      if (!pd) throw missingParam(`${at}[price_data]`);
      if (item.quantity === undefined) throw missingParam(`${at}[quantity]`);
      const quantity = item.quantity as number;
      if (quantity < 1 || quantity > MAX_QUANTITY)
        throw paramError(`Invalid ${at}[quantity]: must be between 1 and ${MAX_QUANTITY}`, `${at}[quantity]`, "parameter_invalid_integer");
      const c = (pd.currency as string).toLowerCase();
      if (!isSupportedCurrency(c)) throw paramError(`Invalid currency: ${pd.currency as string}.`, `${at}[price_data][currency]`);
      if (currency !== null && c !== currency) throw paramError("All line items must use the same currency.", `${at}[price_data][currency]`);
      currency = c;
      if (pd.unit_amount === undefined) throw missingParam(`${at}[price_data][unit_amount]`);
      const unit = pd.unit_amount as number;
      if (unit < 0 || unit > MAX_AMOUNT)
        throw paramError(
          `Invalid ${at}[price_data][unit_amount]: must be between 0 and ${MAX_AMOUNT}`,
          `${at}[price_data][unit_amount]`,
          "parameter_invalid_integer",
        );
      if (!pd.product_data) throw missingParam(`${at}[price_data][product_data]`);
      checkMetadata((pd.product_data as ParamObject).metadata, `${at}[price_data][product_data][metadata]`);
      total += unit * quantity;
    });
    const cur = currency as unknown as string;
    if (params.currency !== undefined && (params.currency as string).toLowerCase() !== cur) {
      throw paramError("currency must match the currency of the line items.", "currency");
    }
    if (total > MAX_AMOUNT) throw paramError(`Amount must be no more than ${formatMinor(MAX_AMOUNT, cur)}`, "line_items", "amount_too_large");
    if (total < minimumAmount(cur)) {
      throw paramError(
        `The Checkout Session's total amount due must add up to at least ${formatMinor(minimumAmount(cur), cur)}`,
        "line_items",
        "amount_too_small",
      );
    }
    let expiresAt = now + SESSION_MAX_LIFETIME_S;
    if (params.expires_at !== undefined) {
      expiresAt = params.expires_at as number;
      if (expiresAt < now + SESSION_MIN_LIFETIME_S)
        throw paramError("The `expires_at` timestamp must be at least 30 minutes from Checkout Session creation.", "expires_at");
      if (expiresAt > now + SESSION_MAX_LIFETIME_S)
        throw paramError("The `expires_at` timestamp must be less than 24 hours from Checkout Session creation.", "expires_at");
    }
    // Every check passed: from here on the endpoint creates objects.
    const id = newId.checkoutSession();
    const lineItems = items.map((item) => {
      const pd = item.price_data as ParamObject;
      const prd = pd.product_data as ParamObject;
      const product: ProductRecord = {
        id: newId.product(),
        created: now,
        name: prd.name as string,
        description: str(prd.description),
        images: (prd.images as string[] | undefined) ?? [],
        metadata: metadataOf(prd.metadata),
      };
      this.products.set(product.id, product);
      const price: PriceRecord = { id: newId.price(), created: now, currency: cur, unitAmount: pd.unit_amount as number, productId: product.id };
      this.prices.set(price.id, price);
      const quantity = item.quantity as number;
      return { id: newId.lineItem(), priceId: price.id, description: product.name, quantity, currency: cur, amount: price.unitAmount * quantity };
    });
    const session: SessionRecord = {
      id,
      created: now,
      expiresAt,
      status: "open",
      paymentStatus: "unpaid",
      currency: cur,
      amountTotal: total,
      successUrl: params.success_url as string,
      cancelUrl: str(params.cancel_url),
      clientReferenceId: str(params.client_reference_id),
      customerEmail: str(params.customer_email),
      locale: str(params.locale),
      submitType: str(params.submit_type),
      metadata: metadataOf(params.metadata),
      paymentIntentData: { description: str(pid?.description), metadata: metadataOf(pid?.metadata), receiptEmail: str(pid?.receipt_email) },
      lineItems,
      paymentIntentId: null,
      customerDetails: null,
      url: `${this.publicBase()}/checkout/${id}`,
    };
    this.sessions.set(id, session);
    return session;
  }

  /** A session by id, expired first if its time has passed. */
  getSession(id: string, param = "session"): SessionRecord {
    const s = this.sessions.get(id);
    if (!s) throw noSuch("checkout.session", id, param);
    this.expireIfDue(s);
    return s;
  }

  sessionJson(s: SessionRecord): JsonObject {
    return sessionJson(s);
  }

  /** Where a paid session sends the payer: `success_url` with `{CHECKOUT_SESSION_ID}` filled in. */
  successRedirect(s: SessionRecord): string {
    return s.successUrl.replaceAll("{CHECKOUT_SESSION_ID}", s.id);
  }

  unitAmount(priceId: string): number {
    return this.prices.get(priceId)?.unitAmount ?? 0;
  }

  lineItemJsons(s: SessionRecord): JsonObject[] {
    return s.lineItems.map((li) => lineItemJson(li, priceJson(this.prices.get(li.priceId) as PriceRecord)));
  }

  expireSession(id: string, cause: Cause): SessionRecord {
    const s = this.getSession(id);
    if (s.status !== "open") {
      throw stateError(
        `Only Checkout Sessions with a status in ["open"] can be expired. This Checkout Session has a status of "${s.status}".`,
        undefined,
        "session",
      );
    }
    this.expire(s, cause);
    return s;
  }

  private expireIfDue(s: SessionRecord): void {
    if (s.status === "open" && this.now() >= s.expiresAt) this.expire(s, NO_REQUEST);
  }

  /** Expires every open session whose time has passed (called on a timer and after the clock moves). */
  sweepExpired(): void {
    for (const s of this.sessions.values()) this.expireIfDue(s);
  }

  private expire(s: SessionRecord, cause: Cause): void {
    const previous = { status: s.status };
    s.status = "expired";
    const pi = s.paymentIntentId ? this.paymentIntents.get(s.paymentIntentId) : undefined;
    if (pi && pi.status === "requires_payment_method") {
      const before = { status: pi.status, canceled_at: null, cancellation_reason: null };
      pi.status = "canceled";
      pi.canceledAt = this.now();
      this.emit("payment_intent.canceled", paymentIntentJson(pi), cause, before);
    }
    this.emit("checkout.session.expired", sessionJson(s), cause, previous);
  }

  /**
   * Pays an open session with a test card, exactly as the hosted page does. The declining card
   * throws a 402 card_error and leaves the session open.
   */
  pay(id: string, card: TestCard, payer: PayerDetails = {}): SessionRecord {
    const s = this.getSession(id);
    if (s.status !== "open") {
      throw stateError(
        `This Checkout Session is ${s.status === "complete" ? "already paid" : "expired"} and cannot be paid.`,
        "checkout_session_not_open",
        "session",
      );
    }
    const now = this.now();
    let pi = s.paymentIntentId ? this.paymentIntents.get(s.paymentIntentId) : undefined;
    if (!pi) {
      pi = {
        id: newId.paymentIntent(),
        created: now,
        amount: s.amountTotal,
        currency: s.currency,
        status: "requires_payment_method",
        description: s.paymentIntentData.description,
        metadata: { ...s.paymentIntentData.metadata },
        receiptEmail: s.paymentIntentData.receiptEmail,
        clientSecret: "",
        latestChargeId: null,
        paymentMethodId: null,
        lastPaymentError: null,
        canceledAt: null,
      };
      pi.clientSecret = `${pi.id}_secret_${newId.secret()}`;
      this.paymentIntents.set(pi.id, pi);
      s.paymentIntentId = pi.id;
      this.emit("payment_intent.created", paymentIntentJson(pi), NO_REQUEST);
    }
    const email = payer.email?.trim() || s.customerEmail;
    const name = payer.name?.trim() || null;
    const charge: ChargeRecord = {
      id: newId.charge(),
      created: now,
      amount: pi.amount,
      amountRefunded: 0,
      currency: pi.currency,
      status: card === "success" ? "succeeded" : "failed",
      paymentIntentId: pi.id,
      paymentMethodId: newId.paymentMethod(),
      description: pi.description,
      metadata: { ...pi.metadata },
      billing: { email, name },
      receiptEmail: pi.receiptEmail,
      failure: card === "success" ? null : { code: DECLINE.code, declineCode: DECLINE.declineCode, message: DECLINE.message },
      last4: card === "success" ? "4242" : "0002",
    };
    this.charges.set(charge.id, charge);
    const piBefore = { status: pi.status, latest_charge: pi.latestChargeId, payment_method: pi.paymentMethodId };
    pi.latestChargeId = charge.id;
    pi.paymentMethodId = charge.paymentMethodId;
    if (card === "decline") {
      pi.lastPaymentError = { ...DECLINE, chargeId: charge.id };
      this.emit("charge.failed", chargeJson(charge), NO_REQUEST);
      this.emit("payment_intent.payment_failed", paymentIntentJson(pi), NO_REQUEST, piBefore);
      throw new StripeApiError(402, {
        type: "card_error",
        code: DECLINE.code,
        decline_code: DECLINE.declineCode,
        message: DECLINE.message,
        charge: charge.id,
        payment_intent: paymentIntentJson(pi),
      });
    }
    pi.status = "succeeded";
    pi.lastPaymentError = null;
    this.emit("charge.succeeded", chargeJson(charge), NO_REQUEST);
    this.emit("payment_intent.succeeded", paymentIntentJson(pi), NO_REQUEST, piBefore);
    s.status = "complete";
    s.paymentStatus = "paid";
    s.customerDetails = { email, name };
    this.emit("checkout.session.completed", sessionJson(s), NO_REQUEST);
    return s;
  }

  // ---- payment intents and charges ----------------------------------------------------------

  getPaymentIntent(id: string, param = "intent"): PaymentIntentRecord {
    const pi = this.paymentIntents.get(id);
    if (!pi) throw noSuch("payment_intent", id, param);
    return pi;
  }

  paymentIntentJson(pi: PaymentIntentRecord): JsonObject {
    return paymentIntentJson(pi);
  }

  // ---- refunds ------------------------------------------------------------------------------

  createRefund(params: Params, cause: Cause): RefundRecord {
    checkMetadata(params.metadata, "metadata");
    const piId = params.payment_intent as string | undefined;
    const chId = params.charge as string | undefined;
    if (piId === undefined && chId === undefined) {
      throw paramError("One of the following params should be provided for this request: payment_intent or charge.", "payment_intent", "parameter_missing");
    }
    if (params.amount !== undefined && (params.amount as number) < 1) {
      throw paramError("Invalid positive integer", "amount", "parameter_invalid_integer");
    }
    let charge: ChargeRecord | undefined;
    if (chId !== undefined) {
      charge = this.charges.get(chId);
      if (!charge) throw noSuch("charge", chId, "charge");
      if (piId !== undefined && charge.paymentIntentId !== piId)
        throw stateError(`Charge ${chId} does not belong to PaymentIntent ${piId}.`, undefined, "charge");
    } else {
      const pi = this.getPaymentIntent(piId as string, "payment_intent");
      const latest = pi.latestChargeId ? this.charges.get(pi.latestChargeId) : undefined;
      if (pi.status !== "succeeded" || !latest) {
        throw stateError(`This PaymentIntent (${pi.id}) does not have a successful charge to refund.`, "charge_not_refundable", "payment_intent");
      }
      charge = latest;
    }
    if (charge.status !== "succeeded") throw stateError(`Charge ${charge.id} did not succeed and cannot be refunded.`, "charge_not_refundable", "charge");
    const left = charge.amount - charge.amountRefunded;
    if (left === 0) throw stateError(`Charge ${charge.id} has already been refunded.`, "charge_already_refunded");
    const amount = (params.amount as number | undefined) ?? left;
    if (amount > left) {
      throw stateError(
        `Refund amount (${formatMinor(amount, charge.currency)}) is greater than unrefunded amount on charge (${formatMinor(left, charge.currency)})`,
        "amount_too_large",
        "amount",
      );
    }
    const refund: RefundRecord = {
      id: newId.refund(),
      created: this.now(),
      amount,
      currency: charge.currency,
      chargeId: charge.id,
      paymentIntentId: charge.paymentIntentId,
      reason: (params.reason as RefundReason | undefined) ?? null,
      metadata: metadataOf(params.metadata),
    };
    this.refunds.set(refund.id, refund);
    const before = chargeJson(charge);
    charge.amountRefunded += amount;
    const after = chargeJson(charge);
    const previous: JsonObject = { amount_refunded: before.amount_refunded as number };
    if (before.refunded !== after.refunded) previous.refunded = before.refunded as boolean;
    this.emit("charge.refunded", after, cause, previous);
    this.emit("refund.created", refundJson(refund), cause);
    return refund;
  }

  getRefund(id: string): RefundRecord {
    const r = this.refunds.get(id);
    if (!r) throw noSuch("refund", id, "refund");
    return r;
  }

  /** Newest first, filtered as `GET /v1/refunds` filters. */
  listRefunds(params: Params): RefundRecord[] {
    if (params.payment_intent !== undefined) this.getPaymentIntent(params.payment_intent as string, "payment_intent");
    if (params.charge !== undefined && !this.charges.has(params.charge as string)) throw noSuch("charge", params.charge as string, "charge");
    return [...this.refunds.values()]
      .filter((r) => params.payment_intent === undefined || r.paymentIntentId === params.payment_intent)
      .filter((r) => params.charge === undefined || r.chargeId === params.charge)
      .filter((r) => matchesCreated(r.created, params.created))
      .reverse();
  }

  refundJson(r: RefundRecord): JsonObject {
    return refundJson(r);
  }

  // ---- expansion ----------------------------------------------------------------------------

  readonly resolver: Resolver = {
    object: (kind: Kind, id: string): JsonObject | null => {
      switch (kind) {
        case "payment_intent": {
          const pi = this.paymentIntents.get(id);
          return pi ? paymentIntentJson(pi) : null;
        }
        case "charge": {
          const c = this.charges.get(id);
          return c ? chargeJson(c) : null;
        }
        case "product": {
          const p = this.products.get(id);
          return p ? productJson(p) : null;
        }
        default:
          return null;
      }
    },
    list: (kind: Kind, field: string, parent: JsonObject): JsonObject => {
      const id = parent.id as string;
      if (kind === "checkout.session" && field === "line_items") {
        const s = this.sessions.get(id);
        const items = s ? this.lineItemJsons(s) : [];
        return listJson(items.slice(0, EMBEDDED_LIST_LIMIT) as Json[], items.length > EMBEDDED_LIST_LIMIT, `/v1/checkout/sessions/${id}/line_items`);
      }
      const refunds = [...this.refunds.values()].filter((r) => r.chargeId === id).reverse();
      return listJson(refunds.slice(0, EMBEDDED_LIST_LIMIT).map(refundJson) as Json[], refunds.length > EMBEDDED_LIST_LIMIT, `/v1/charges/${id}/refunds`);
    },
  };
}
