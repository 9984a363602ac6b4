import "server-only";
import { and, asc, count, desc, eq, inArray, sql } from "drizzle-orm";
import { orderStatusHistory, orderTestRecords, orders, quoteRevisions, quotes, shops, users, type OrderRow } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { OwnerScope } from "@/lib/auth/ownership";
import type { TestCheck, TestLimits, TestMeasurement } from "@/lib/orders/types";
import type { OrderListQuery } from "@/lib/validation/lists";
import { ORDER_STATUSES, type OrderStatus } from "@/lib/vocabulary";
import { containsText, ranked, readPage, sortedBy, type Page } from "./paging";

/**
 * Orders, their status history and their test records. Every function runs in a `withShop`
 * transaction (its own, or the caller's `tx`) and names the shop in every WHERE.
 */

export interface NewOrder {
  number: string;
  quoteId: string;
  quoteRevisionId: string;
  customerUserId: string;
  currency: string;
  total: string;
  quantity: number;
  dueDate: string;
  createdAt: Date;
}

export async function insertOrder(tx: Tx, shopId: string, o: NewOrder): Promise<OrderRow> {
  const [row] = await tx
    .insert(orders)
    .values({ shopId, status: "paid", ...o })
    .returning();
  if (!row) throw new Error("order insert returned no row");
  return row;
}

/** A quote's order, row-locked for the rest of the caller's transaction; null when it has none. */
export async function lockOrderOfQuote(tx: Tx, shopId: string, quoteId: string): Promise<OrderRow | null> {
  const [row] = await tx
    .select()
    .from(orders)
    .where(and(eq(orders.shopId, shopId), eq(orders.quoteId, quoteId)))
    .for("update");
  return row ?? null;
}

/** An order by its number, row-locked for the rest of the caller's transaction. */
export async function lockOrderByNumber(tx: Tx, shopId: string, number: string): Promise<OrderRow | null> {
  const [row] = await tx
    .select()
    .from(orders)
    .where(and(eq(orders.shopId, shopId), eq(orders.number, number)))
    .for("update");
  return row ?? null;
}

export async function updateOrder(
  tx: Tx,
  shopId: string,
  orderId: string,
  set: Partial<Pick<OrderRow, "status" | "heldFrom" | "carrier" | "trackingReference" | "amountPaid" | "amountRefunded">>,
): Promise<void> {
  await tx
    .update(orders)
    .set(set)
    .where(and(eq(orders.shopId, shopId), eq(orders.id, orderId)));
}

export interface NewHistoryEntry {
  orderId: string;
  fromStatus: OrderStatus | null;
  toStatus: OrderStatus;
  /** null: the payment service or the system moved it */
  actorUserId: string | null;
  note: string;
  at?: Date;
}

export async function insertOrderHistory(tx: Tx, shopId: string, h: NewHistoryEntry): Promise<void> {
  await tx.insert(orderStatusHistory).values({ shopId, ...h, at: h.at ?? new Date() });
}

/** One order with everything its pages and documents show: quote, revision (frozen), customer, shop. Null when not in this shop. */
export async function getOrderDetail(shopId: string, number: string) {
  return withShop(shopId, async (tx) => {
    const [row] = await tx
      .select({
        order: orders,
        quoteNumber: quotes.number,
        revision: quoteRevisions.revision,
        requirement: quoteRevisions.requirement,
        arrangement: quoteRevisions.arrangement,
        cell: quoteRevisions.cell,
        pricing: quoteRevisions.pricing,
        customerName: users.name,
        customerEmail: users.email,
        shopName: shops.name,
        shopSlug: shops.slug,
      })
      .from(orders)
      .innerJoin(quotes, and(eq(quotes.shopId, orders.shopId), eq(quotes.id, orders.quoteId)))
      .innerJoin(quoteRevisions, and(eq(quoteRevisions.shopId, orders.shopId), eq(quoteRevisions.id, orders.quoteRevisionId)))
      .innerJoin(users, eq(users.id, orders.customerUserId))
      .innerJoin(shops, eq(shops.id, orders.shopId))
      .where(and(eq(orders.shopId, shopId), eq(orders.number, number)))
      .limit(1);
    return row ?? null;
  });
}

export type OrderDetail = NonNullable<Awaited<ReturnType<typeof getOrderDetail>>>;

/** An order's moves, oldest first, with who made each (null: the payment service or the system). */
export async function listOrderHistory(shopId: string, orderId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        id: orderStatusHistory.id,
        fromStatus: orderStatusHistory.fromStatus,
        toStatus: orderStatusHistory.toStatus,
        note: orderStatusHistory.note,
        at: orderStatusHistory.at,
        actorName: users.name,
      })
      .from(orderStatusHistory)
      .leftJoin(users, eq(users.id, orderStatusHistory.actorUserId))
      .where(and(eq(orderStatusHistory.shopId, shopId), eq(orderStatusHistory.orderId, orderId)))
      .orderBy(asc(orderStatusHistory.at), asc(orderStatusHistory.id))
      .limit(500),
  );
}

export interface NewTestRecord {
  orderId: string;
  bank: number;
  measured: TestMeasurement;
  limits: TestLimits;
  checks: TestCheck[];
  isPassed: boolean;
  note: string;
  testedByUserId: string;
}

export async function insertTestRecord(tx: Tx, shopId: string, r: NewTestRecord): Promise<string> {
  const [row] = await tx
    .insert(orderTestRecords)
    .values({ shopId, ...r })
    .returning({ id: orderTestRecords.id });
  if (!row) throw new Error("test record insert returned no row");
  return row.id;
}

/** The latest test of each bank of an order (what "ready" and the certificate go by). */
export async function latestTestsOfOrder(tx: Tx, shopId: string, orderId: string) {
  return tx
    .selectDistinctOn([orderTestRecords.bank], {
      id: orderTestRecords.id,
      bank: orderTestRecords.bank,
      isPassed: orderTestRecords.isPassed,
      measured: orderTestRecords.measured,
      limits: orderTestRecords.limits,
      checks: orderTestRecords.checks,
      note: orderTestRecords.note,
      createdAt: orderTestRecords.createdAt,
      testedBy: users.name,
    })
    .from(orderTestRecords)
    .leftJoin(users, eq(users.id, orderTestRecords.testedByUserId))
    .where(and(eq(orderTestRecords.shopId, shopId), eq(orderTestRecords.orderId, orderId)))
    .orderBy(asc(orderTestRecords.bank), desc(orderTestRecords.createdAt), desc(orderTestRecords.id));
}

export type LatestTest = Awaited<ReturnType<typeof latestTestsOfOrder>>[number];

/** The latest tests of an order, in their own transaction (pages and PDFs). */
export function listLatestTests(shopId: string, orderId: string) {
  return withShop(shopId, (tx) => latestTestsOfOrder(tx, shopId, orderId));
}

// ---- lists ---------------------------------------------------------------------------------------

export interface OrderListRow {
  id: string;
  number: string;
  quoteNumber: string;
  status: OrderStatus;
  heldFrom: OrderStatus | null;
  customerName: string;
  customerEmail: string;
  currency: string;
  total: string;
  amountPaid: string;
  amountRefunded: string;
  quantity: number;
  dueDate: string;
  createdAt: Date;
}

/** Stages a list shows as "open": still on the floor. */
const OPEN: OrderStatus[] = ["paid", "kitting", "assembling", "testing", "ready", "on-hold"];

const ORDER_SORTS = {
  number: orders.number,
  customer: users.name,
  // the floor's order: earliest stage first
  status: ranked(orders.status, ORDER_STATUSES),
  due: orders.dueDate,
  total: orders.total,
  created: orders.createdAt,
};

const listColumns = {
  id: orders.id,
  number: orders.number,
  quoteNumber: quotes.number,
  status: orders.status,
  heldFrom: orders.heldFrom,
  customerName: users.name,
  customerEmail: users.email,
  currency: orders.currency,
  total: orders.total,
  amountPaid: orders.amountPaid,
  amountRefunded: orders.amountRefunded,
  quantity: orders.quantity,
  dueDate: orders.dueDate,
  createdAt: orders.createdAt,
};

function listWhere(shopId: string, scope: OwnerScope, q: OrderListQuery, today: string) {
  return and(
    eq(orders.shopId, shopId),
    scope.all ? undefined : eq(orders.customerUserId, scope.userId),
    q.status === "all" ? undefined : q.status === "open" ? inArray(orders.status, OPEN) : eq(orders.status, q.status),
    q.timing === "late" ? and(inArray(orders.status, OPEN), sql`${orders.dueDate} < ${today}::date`) : undefined,
    scope.all ? containsText(q.q, orders.number, quotes.number, users.name, users.email) : containsText(q.q, orders.number, quotes.number),
  );
}

/** A page of the shop's orders the member sees (all, or a customer's own), filtered and sorted; ties newest first. */
export async function listOrders(shopId: string, scope: OwnerScope, q: OrderListQuery, today: string): Promise<Page<OrderListRow>> {
  const where = listWhere(shopId, scope, q, today);
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () =>
        tx
          .select({ n: count() })
          .from(orders)
          .innerJoin(quotes, and(eq(quotes.shopId, orders.shopId), eq(quotes.id, orders.quoteId)))
          .innerJoin(users, eq(users.id, orders.customerUserId))
          .where(where),
      (limit, offset) =>
        tx
          .select(listColumns)
          .from(orders)
          .innerJoin(quotes, and(eq(quotes.shopId, orders.shopId), eq(quotes.id, orders.quoteId)))
          .innerJoin(users, eq(users.id, orders.customerUserId))
          .where(where)
          .orderBy(...sortedBy(ORDER_SORTS, q, desc(orders.createdAt), asc(orders.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
}

/** How many open orders the board draws at most (the list view pages through the rest). */
const BOARD_LIMIT = 300;

/** The board: every open order (due soonest first), and those shipped or closed in the last 30 days. */
export async function listBoardOrders(shopId: string): Promise<{ rows: OrderListRow[]; more: boolean }> {
  return withShop(shopId, async (tx) => {
    const rows = await tx
      .select(listColumns)
      .from(orders)
      .innerJoin(quotes, and(eq(quotes.shopId, orders.shopId), eq(quotes.id, orders.quoteId)))
      .innerJoin(users, eq(users.id, orders.customerUserId))
      .where(and(eq(orders.shopId, shopId), sql`(${inArray(orders.status, OPEN)} or ${orders.updatedAt} > now() - interval '30 days')`))
      .orderBy(asc(orders.dueDate), asc(orders.number))
      .limit(BOARD_LIMIT + 1);
    return { rows: rows.slice(0, BOARD_LIMIT), more: rows.length > BOARD_LIMIT };
  });
}

/** The moves of several orders, oldest first per order (the orders API). */
export async function historiesOf(shopId: string, orderIds: readonly string[]) {
  if (orderIds.length === 0) return new Map<string, { status: OrderStatus; at: Date }[]>();
  const rows = await withShop(shopId, (tx) =>
    tx
      .select({ orderId: orderStatusHistory.orderId, status: orderStatusHistory.toStatus, at: orderStatusHistory.at })
      .from(orderStatusHistory)
      .where(and(eq(orderStatusHistory.shopId, shopId), inArray(orderStatusHistory.orderId, [...orderIds])))
      .orderBy(asc(orderStatusHistory.at), asc(orderStatusHistory.id)),
  );
  const out = new Map<string, { status: OrderStatus; at: Date }[]>();
  for (const r of rows) {
    const list = out.get(r.orderId) ?? [];
    list.push({ status: r.status, at: r.at });
    out.set(r.orderId, list);
  }
  return out;
}

/** Orders still on the floor past their due date, soonest due first (the dashboard). */
export async function listLateOrders(shopId: string, today: string, limit = 20) {
  return withShop(shopId, (tx) =>
    tx
      .select(listColumns)
      .from(orders)
      .innerJoin(quotes, and(eq(quotes.shopId, orders.shopId), eq(quotes.id, orders.quoteId)))
      .innerJoin(users, eq(users.id, orders.customerUserId))
      .where(and(eq(orders.shopId, shopId), inArray(orders.status, OPEN), sql`${orders.dueDate} < ${today}::date`))
      .orderBy(asc(orders.dueDate), asc(orders.number))
      .limit(limit),
  );
}

/** Orders per status (the dashboard). */
export async function countOrdersByStatus(shopId: string): Promise<Record<OrderStatus, number>> {
  const rows = await withShop(shopId, (tx) =>
    tx.select({ status: orders.status, n: count() }).from(orders).where(eq(orders.shopId, shopId)).groupBy(orders.status),
  );
  const out = Object.fromEntries(ORDER_STATUSES.map((s) => [s, 0])) as Record<OrderStatus, number>;
  for (const r of rows) out[r.status] = r.n;
  return out;
}

/** What an order is made from: the frozen revision's arrangement, requirement, price build-up and the customer's address. */
export async function getRevisionForOrder(tx: Tx, shopId: string, revisionId: string) {
  const [row] = await tx
    .select({
      id: quoteRevisions.id,
      quoteId: quoteRevisions.quoteId,
      quoteNumber: quotes.number,
      revision: quoteRevisions.revision,
      currency: quoteRevisions.currency,
      quantity: quoteRevisions.quantity,
      total: quoteRevisions.total,
      arrangement: quoteRevisions.arrangement,
      requirement: quoteRevisions.requirement,
      pricing: quoteRevisions.pricing,
      customerUserId: quotes.customerUserId,
      customerEmail: users.email,
    })
    .from(quoteRevisions)
    .innerJoin(quotes, and(eq(quotes.shopId, quoteRevisions.shopId), eq(quotes.id, quoteRevisions.quoteId)))
    .innerJoin(users, eq(users.id, quotes.customerUserId))
    .where(and(eq(quoteRevisions.shopId, shopId), eq(quoteRevisions.id, revisionId)))
    .limit(1);
  return row ?? null;
}

/** An order's number by its id (the outbox keeps ids); null when not in this shop. */
export async function getOrderNumberById(shopId: string, orderId: string): Promise<string | null> {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({ number: orders.number })
      .from(orders)
      .where(and(eq(orders.shopId, shopId), eq(orders.id, orderId)))
      .limit(1),
  );
  return row?.number ?? null;
}
