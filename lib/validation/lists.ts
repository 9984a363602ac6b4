import { ROLES } from "@/lib/auth/permissions";
import { TECHNOLOGIES } from "@/lib/bank/types";
import { COMPONENT_KIND_VALUES } from "@/lib/catalog/component-fields";
import {
  ORDER_STATUSES,
  OUTBOX_STATUSES,
  QUOTE_LIST_STATUSES,
  QUOTE_STATUSES,
  REQUEST_STATUSES,
  SHOP_EVENT_TYPES,
  WEBHOOK_DELIVERY_STATES,
  WEBHOOK_ENDPOINT_STATES,
} from "@/lib/vocabulary";
import { z } from "zod";
import { decimalSchema } from "./bank";
import { defineList, pageSchema, type ListQueryOf } from "./list-query";

/**
 * Every list's URL state: what it can be filtered and sorted by, and which way a column sorts on its
 * first click (dates newest first; quote totals and send attempts largest first; catalog figures,
 * costs and stock smallest first, to find what fits or runs short; names A to Z; statuses by what
 * needs attention). Read with `list.parse(searchParams)` (lib/validation/list-query.ts).
 */

export const catalogList = defineList({
  search: true,
  filters: { technology: ["all", ...TECHNOLOGIES] },
  sorts: { sku: "asc", capacitance: "asc", voltage: "asc", esr: "asc", cost: "asc", stock: "asc", lead: "asc" },
  sort: "sku",
  size: 25,
});
export type CatalogListQuery = ListQueryOf<typeof catalogList>;

export const componentList = defineList({
  search: true,
  filters: { kind: ["all", ...COMPONENT_KIND_VALUES] },
  sorts: { sku: "asc", kind: "asc", name: "asc", cost: "asc", stock: "asc", lead: "asc" },
  sort: "kind",
  size: 25,
});
export type ComponentListQuery = ListQueryOf<typeof componentList>;

export const requestList = defineList({
  search: true,
  filters: { status: ["all", ...REQUEST_STATUSES] },
  sorts: { created: "desc", customer: "asc", voltage: "asc", status: "asc" },
  sort: "created",
  size: 20,
});
export type RequestListQuery = ListQueryOf<typeof requestList>;

export const quoteList = defineList({
  search: true,
  filters: { status: ["all", ...QUOTE_LIST_STATUSES] },
  sorts: { number: "desc", customer: "asc", status: "asc", total: "desc", validUntil: "asc", created: "desc" },
  sort: "created",
  size: 20,
});
export type QuoteListQuery = ListQueryOf<typeof quoteList>;

/** A page of GET /api/v1/shops/{shop}/quotes. */
export const quotePageSchema = pageSchema(
  z.object({
    id: z.uuid(),
    number: z.string().meta({ example: "Q-2026-0001" }),
    status: z.enum(QUOTE_STATUSES),
    revision: z.number().int().min(1),
    customerName: z.string(),
    customerEmail: z.string(),
    currency: z.string().length(3),
    quantity: z.number().int(),
    total: decimalSchema,
    validUntil: z.iso.date(),
    createdAt: z.iso.datetime({ offset: true }),
    /** when the customer asked for a change that no revision has answered yet; null when none is waiting */
    changeRequestedAt: z.iso.datetime({ offset: true }).nullable(),
  }),
).meta({ id: "QuotePage" });

export const memberList = defineList({
  search: true,
  filters: { role: ["all", ...ROLES] },
  sorts: { name: "asc", email: "asc", role: "asc", joined: "desc" },
  sort: "name",
  size: 20,
});
export type MemberListQuery = ListQueryOf<typeof memberList>;

/** A page of GET /api/v1/shops/{shop}/members. */
export const memberPageSchema = pageSchema(
  z.object({
    id: z.string(),
    userId: z.string(),
    name: z.string(),
    email: z.string(),
    role: z.enum(ROLES),
    joinedAt: z.iso.datetime({ offset: true }),
  }),
).meta({ id: "MemberPage" });

export const outboxList = defineList({
  search: true,
  filters: { status: ["all", ...OUTBOX_STATUSES] },
  sorts: { created: "desc", to: "asc", subject: "asc", status: "asc", attempts: "desc", sent: "desc" },
  sort: "created",
  size: 20,
});
export type OutboxListQuery = ListQueryOf<typeof outboxList>;

/** Orders: "open" is every stage still on the floor; "late" those of them past their due date. Soonest due first. */
export const orderList = defineList({
  search: true,
  filters: { status: ["all", "open", ...ORDER_STATUSES], timing: ["all", "late"] },
  sorts: { number: "desc", customer: "asc", status: "asc", due: "asc", total: "desc", created: "desc" },
  sort: "due",
  size: 20,
});
export type OrderListQuery = ListQueryOf<typeof orderList>;

export const webhookEndpointList = defineList({
  search: true,
  filters: { state: ["all", ...WEBHOOK_ENDPOINT_STATES] },
  sorts: { created: "desc", url: "asc", state: "asc", failing: "asc" },
  sort: "created",
  size: 20,
});
export type WebhookEndpointListQuery = ListQueryOf<typeof webhookEndpointList>;

/** One endpoint's delivery log: newest first; failures and the next retry can be brought up first. */
export const webhookDeliveryList = defineList({
  search: true,
  filters: { state: ["all", ...WEBHOOK_DELIVERY_STATES], event: ["all", ...SHOP_EVENT_TYPES] },
  sorts: { created: "desc", state: "asc", attempts: "desc", code: "desc", duration: "desc", next: "asc" },
  sort: "created",
  size: 25,
});
export type WebhookDeliveryListQuery = ListQueryOf<typeof webhookDeliveryList>;

export const apiKeyList = defineList({
  search: true,
  filters: { status: ["all", "live", "revoked"] },
  sorts: { status: "asc", name: "asc", created: "desc", used: "desc" },
  sort: "status",
  size: 20,
});
export type ApiKeyListQuery = ListQueryOf<typeof apiKeyList>;

export const ruleVersionList = defineList({
  search: false,
  filters: {},
  sorts: { version: "desc" },
  sort: "version",
  size: 10,
});
export type RuleVersionListQuery = ListQueryOf<typeof ruleVersionList>;

/**
 * The audit log. Actions, subjects and people come and go with the shop, so they are open filters:
 * an action (`member.role`, or its family `member`), a subject type, a person's user id.
 */
export const auditList = defineList({
  search: true,
  filters: {},
  open: { action: /[a-z][a-z0-9-]*(\.[a-z][a-z0-9-]*)*/, subject: /[a-z][a-z0-9-]*/, actor: /[A-Za-z0-9_-]{1,64}/ },
  sorts: { created: "desc", action: "asc", actor: "asc", subject: "asc" },
  sort: "created",
  size: 25,
});
export type AuditListQuery = ListQueryOf<typeof auditList>;
