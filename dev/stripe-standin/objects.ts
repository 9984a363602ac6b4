/**
 * The stand-in's records and their JSON in Stripe's shape for API 2024-04-10 (the version of the
 * published description the tests check every answer against). Fields the stand-in does not model
 * are present with the value a plain card payment in test mode has (null, false, empty list).
 */
import { SPEC_API_VERSION } from "./spec";

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
export type JsonObject = { [key: string]: Json };
export type Metadata = Record<string, string>;

export interface ProductRecord {
  id: string;
  created: number;
  name: string;
  description: string | null;
  images: string[];
  metadata: Metadata;
}

export interface PriceRecord {
  id: string;
  created: number;
  currency: string;
  unitAmount: number;
  productId: string;
}

export interface LineItemRecord {
  id: string;
  priceId: string;
  description: string;
  quantity: number;
  currency: string;
  amount: number;
}

export type SessionStatus = "open" | "complete" | "expired";

export interface SessionRecord {
  id: string;
  created: number;
  expiresAt: number;
  status: SessionStatus;
  paymentStatus: "unpaid" | "paid";
  currency: string;
  amountTotal: number;
  successUrl: string;
  cancelUrl: string | null;
  clientReferenceId: string | null;
  customerEmail: string | null;
  locale: string | null;
  submitType: string | null;
  metadata: Metadata;
  paymentIntentData: { description: string | null; metadata: Metadata; receiptEmail: string | null };
  lineItems: LineItemRecord[];
  paymentIntentId: string | null;
  customerDetails: { email: string | null; name: string | null } | null;
  url: string;
}

export interface CardError {
  code: string;
  declineCode: string;
  message: string;
  chargeId: string;
}

export interface PaymentIntentRecord {
  id: string;
  created: number;
  amount: number;
  currency: string;
  status: "requires_payment_method" | "succeeded" | "canceled";
  description: string | null;
  metadata: Metadata;
  receiptEmail: string | null;
  clientSecret: string;
  latestChargeId: string | null;
  paymentMethodId: string | null;
  lastPaymentError: CardError | null;
  canceledAt: number | null;
}

export interface ChargeRecord {
  id: string;
  created: number;
  amount: number;
  amountRefunded: number;
  currency: string;
  status: "succeeded" | "failed";
  paymentIntentId: string;
  paymentMethodId: string;
  description: string | null;
  metadata: Metadata;
  billing: { email: string | null; name: string | null };
  receiptEmail: string | null;
  failure: { code: string; declineCode: string; message: string } | null;
  last4: string;
}

export type RefundReason = "duplicate" | "fraudulent" | "requested_by_customer";

export interface RefundRecord {
  id: string;
  created: number;
  amount: number;
  currency: string;
  chargeId: string;
  paymentIntentId: string;
  reason: RefundReason | null;
  metadata: Metadata;
}

export interface EventRecord {
  id: string;
  seq: number;
  created: number;
  type: string;
  object: JsonObject;
  previousAttributes: JsonObject | null;
  request: { id: string | null; idempotency_key: string | null };
  pendingWebhooks: number;
}

export function listJson(data: Json[], hasMore: boolean, url: string): JsonObject {
  return { object: "list", data, has_more: hasMore, url };
}

export function productJson(p: ProductRecord): JsonObject {
  return {
    id: p.id,
    object: "product",
    active: false,
    created: p.created,
    default_price: null,
    description: p.description,
    images: [...p.images],
    livemode: false,
    marketing_features: [],
    metadata: { ...p.metadata },
    name: p.name,
    package_dimensions: null,
    shippable: null,
    statement_descriptor: null,
    tax_code: null,
    unit_label: null,
    updated: p.created,
    url: null,
  };
}

export function priceJson(p: PriceRecord): JsonObject {
  return {
    id: p.id,
    object: "price",
    active: false,
    billing_scheme: "per_unit",
    created: p.created,
    currency: p.currency,
    custom_unit_amount: null,
    livemode: false,
    lookup_key: null,
    metadata: {},
    nickname: null,
    product: p.productId,
    recurring: null,
    tax_behavior: "unspecified",
    tiers_mode: null,
    transform_quantity: null,
    type: "one_time",
    unit_amount: p.unitAmount,
    unit_amount_decimal: String(p.unitAmount),
  };
}

export function lineItemJson(li: LineItemRecord, price: JsonObject): JsonObject {
  return {
    id: li.id,
    object: "item",
    amount_discount: 0,
    amount_subtotal: li.amount,
    amount_tax: 0,
    amount_total: li.amount,
    currency: li.currency,
    description: li.description,
    price,
    quantity: li.quantity,
  };
}

export function sessionJson(s: SessionRecord): JsonObject {
  return {
    id: s.id,
    object: "checkout.session",
    after_expiration: null,
    allow_promotion_codes: null,
    amount_subtotal: s.amountTotal,
    amount_total: s.amountTotal,
    automatic_tax: { enabled: false, liability: null, status: null },
    billing_address_collection: null,
    cancel_url: s.cancelUrl,
    client_reference_id: s.clientReferenceId,
    client_secret: null,
    consent: null,
    consent_collection: null,
    created: s.created,
    currency: s.currency,
    currency_conversion: null,
    custom_fields: [],
    custom_text: { after_submit: null, shipping_address: null, submit: null, terms_of_service_acceptance: null },
    customer: null,
    customer_creation: "if_required",
    customer_details: s.customerDetails
      ? { address: null, email: s.customerDetails.email, name: s.customerDetails.name, phone: null, tax_exempt: "none", tax_ids: [] }
      : null,
    customer_email: s.customerEmail,
    expires_at: s.expiresAt,
    invoice: null,
    invoice_creation: {
      enabled: false,
      invoice_data: { account_tax_ids: null, custom_fields: null, description: null, footer: null, issuer: null, metadata: {}, rendering_options: null },
    },
    livemode: false,
    locale: s.locale,
    metadata: { ...s.metadata },
    mode: "payment",
    payment_intent: s.paymentIntentId,
    payment_link: null,
    payment_method_collection: "if_required",
    payment_method_configuration_details: null,
    payment_method_options: {},
    payment_method_types: ["card"],
    payment_status: s.paymentStatus,
    phone_number_collection: { enabled: false },
    recovered_from: null,
    saved_payment_method_options: null,
    setup_intent: null,
    shipping_address_collection: null,
    shipping_cost: null,
    shipping_details: null,
    shipping_options: [],
    status: s.status,
    submit_type: s.submitType,
    subscription: null,
    success_url: s.successUrl,
    total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
    ui_mode: "hosted",
    // The hosted page's address exists only while the session can still be paid.
    url: s.status === "open" ? s.url : null,
  };
}

export function paymentIntentJson(pi: PaymentIntentRecord): JsonObject {
  const e = pi.lastPaymentError;
  return {
    id: pi.id,
    object: "payment_intent",
    amount: pi.amount,
    amount_capturable: 0,
    amount_details: { tip: {} },
    amount_received: pi.status === "succeeded" ? pi.amount : 0,
    application: null,
    application_fee_amount: null,
    automatic_payment_methods: null,
    canceled_at: pi.canceledAt,
    cancellation_reason: pi.status === "canceled" ? "abandoned" : null,
    capture_method: "automatic",
    client_secret: pi.clientSecret,
    confirmation_method: "automatic",
    created: pi.created,
    currency: pi.currency,
    customer: null,
    description: pi.description,
    invoice: null,
    last_payment_error: e
      ? {
          type: "card_error",
          code: e.code,
          decline_code: e.declineCode,
          message: e.message,
          charge: e.chargeId,
          doc_url: `https://stripe.com/docs/error-codes/${e.code.replace(/_/g, "-")}`,
        }
      : null,
    latest_charge: pi.latestChargeId,
    livemode: false,
    metadata: { ...pi.metadata },
    next_action: null,
    on_behalf_of: null,
    payment_method: pi.paymentMethodId,
    payment_method_configuration_details: null,
    payment_method_options: { card: { installments: null, mandate_options: null, network: null, request_three_d_secure: "automatic" } },
    payment_method_types: ["card"],
    processing: null,
    receipt_email: pi.receiptEmail,
    review: null,
    setup_future_usage: null,
    shipping: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: pi.status,
    transfer_data: null,
    transfer_group: null,
  };
}

export function chargeJson(c: ChargeRecord): JsonObject {
  const ok = c.status === "succeeded";
  return {
    id: c.id,
    object: "charge",
    amount: c.amount,
    amount_captured: ok ? c.amount : 0,
    amount_refunded: c.amountRefunded,
    application: null,
    application_fee: null,
    application_fee_amount: null,
    balance_transaction: null,
    billing_details: {
      address: { city: null, country: null, line1: null, line2: null, postal_code: null, state: null },
      email: c.billing.email,
      name: c.billing.name,
      phone: null,
    },
    calculated_statement_descriptor: "FARADSMITH",
    captured: ok,
    created: c.created,
    currency: c.currency,
    customer: null,
    description: c.description,
    disputed: false,
    failure_balance_transaction: null,
    failure_code: c.failure?.code ?? null,
    failure_message: c.failure?.message ?? null,
    fraud_details: {},
    invoice: null,
    livemode: false,
    metadata: { ...c.metadata },
    on_behalf_of: null,
    outcome: ok
      ? { network_status: "approved_by_network", reason: null, risk_level: "normal", risk_score: 20, seller_message: "Payment complete.", type: "authorized" }
      : {
          network_status: "declined_by_network",
          reason: c.failure?.declineCode ?? null,
          risk_level: "normal",
          risk_score: 20,
          seller_message: "The bank did not return any further details with this decline.",
          type: "issuer_declined",
        },
    paid: ok,
    payment_intent: c.paymentIntentId,
    payment_method: c.paymentMethodId,
    payment_method_details: null,
    receipt_email: c.receiptEmail,
    receipt_number: null,
    receipt_url: null,
    refunded: ok && c.amountRefunded === c.amount,
    review: null,
    shipping: null,
    source_transfer: null,
    statement_descriptor: null,
    statement_descriptor_suffix: null,
    status: c.status,
    transfer_data: null,
    transfer_group: null,
  };
}

export function refundJson(r: RefundRecord): JsonObject {
  return {
    id: r.id,
    object: "refund",
    amount: r.amount,
    balance_transaction: null,
    charge: r.chargeId,
    created: r.created,
    currency: r.currency,
    metadata: { ...r.metadata },
    payment_intent: r.paymentIntentId,
    reason: r.reason,
    receipt_number: null,
    source_transfer_reversal: null,
    status: "succeeded",
    transfer_reversal: null,
  };
}

export function eventJson(e: EventRecord): JsonObject {
  return {
    id: e.id,
    object: "event",
    api_version: SPEC_API_VERSION,
    created: e.created,
    data: e.previousAttributes ? { object: e.object, previous_attributes: e.previousAttributes } : { object: e.object },
    livemode: false,
    pending_webhooks: e.pendingWebhooks,
    request: { ...e.request },
    type: e.type,
  };
}
