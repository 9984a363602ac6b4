import { ROLES } from "@/lib/auth/permissions";
import { TECHNOLOGIES } from "@/lib/bank/types";
import { OUTBOX_STATUSES, QUOTE_LIST_STATUSES, REQUEST_STATUSES } from "@/lib/vocabulary";
import { defineList, type ListQueryOf } from "./list-query";

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

export const memberList = defineList({
  search: true,
  filters: { role: ["all", ...ROLES] },
  sorts: { name: "asc", email: "asc", role: "asc", joined: "desc" },
  sort: "name",
  size: 20,
});
export type MemberListQuery = ListQueryOf<typeof memberList>;

export const outboxList = defineList({
  search: true,
  filters: { status: ["all", ...OUTBOX_STATUSES] },
  sorts: { created: "desc", to: "asc", subject: "asc", status: "asc", attempts: "desc", sent: "desc" },
  sort: "created",
  size: 20,
});
export type OutboxListQuery = ListQueryOf<typeof outboxList>;
