import "server-only";
import { and, asc, count, desc, eq, inArray, lte, sql } from "drizzle-orm";
import { members, shopEvents, shops, users, webhookDeliveries, webhookEndpoints, type WebhookEndpointRow } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import { db } from "@/db";
import type { WebhookDeliveryListQuery, WebhookEndpointListQuery } from "@/lib/validation/lists";
import type { ShopEventType, WebhookDeliveryState } from "@/lib/vocabulary";
import { containsText, ranked, readPage, sortedBy, type Page } from "./paging";

/** An endpoint as the desk shows it: never its secret, only the hint. */
const endpointColumns = {
  id: webhookEndpoints.id,
  url: webhookEndpoints.url,
  description: webhookEndpoints.description,
  events: webhookEndpoints.events,
  secretHint: webhookEndpoints.secretHint,
  state: webhookEndpoints.state,
  failingSince: webhookEndpoints.failingSince,
  disabledAt: webhookEndpoints.disabledAt,
  disabledReason: webhookEndpoints.disabledReason,
  createdAt: webhookEndpoints.createdAt,
  updatedAt: webhookEndpoints.updatedAt,
};
export type WebhookEndpointView = Omit<WebhookEndpointRow, "shopId" | "secretCiphertext" | "createdByUserId">;

const ENDPOINT_SORTS = {
  created: webhookEndpoints.createdAt,
  url: webhookEndpoints.url,
  // stopped ones first
  state: ranked(webhookEndpoints.state, ["disabled", "active"]),
  failing: webhookEndpoints.failingSince,
};

/** A page of the shop's endpoints. */
export async function listWebhookEndpoints(shopId: string, q: WebhookEndpointListQuery): Promise<Page<WebhookEndpointView>> {
  return withShop(shopId, (tx) => {
    const where = and(
      eq(webhookEndpoints.shopId, shopId),
      q.state === "all" ? undefined : eq(webhookEndpoints.state, q.state),
      containsText(q.q, webhookEndpoints.url, webhookEndpoints.description),
    );
    return readPage(
      q,
      () => tx.select({ n: count() }).from(webhookEndpoints).where(where),
      (limit, offset) =>
        tx
          .select(endpointColumns)
          .from(webhookEndpoints)
          .where(where)
          .orderBy(...sortedBy(ENDPOINT_SORTS, q, desc(webhookEndpoints.createdAt), asc(webhookEndpoints.id)))
          .limit(limit)
          .offset(offset),
    );
  });
}

export async function countWebhookEndpoints(tx: Tx, shopId: string): Promise<number> {
  const [row] = await tx.select({ n: count() }).from(webhookEndpoints).where(eq(webhookEndpoints.shopId, shopId));
  return row?.n ?? 0;
}

/** One endpoint of the shop (null for another shop's id or none). */
export async function getWebhookEndpoint(shopId: string, id: string, tx?: Tx): Promise<WebhookEndpointView | null> {
  const read = async (t: Tx) => {
    const [row] = await t
      .select(endpointColumns)
      .from(webhookEndpoints)
      .where(and(eq(webhookEndpoints.shopId, shopId), eq(webhookEndpoints.id, id)))
      .limit(1);
    return row ?? null;
  };
  return tx ? read(tx) : withShop(shopId, read);
}

export interface NewWebhookEndpoint {
  url: string;
  description: string;
  events: ShopEventType[];
  secretCiphertext: string;
  secretHint: string;
  createdByUserId: string;
}

export async function insertWebhookEndpoint(tx: Tx, shopId: string, values: NewWebhookEndpoint): Promise<WebhookEndpointView> {
  const [row] = await tx
    .insert(webhookEndpoints)
    .values({ shopId, ...values })
    .returning(endpointColumns);
  if (!row) throw new Error("webhook endpoint insert returned no row");
  return row;
}

export type WebhookEndpointPatch = Partial<{
  url: string;
  description: string;
  events: ShopEventType[];
  secretCiphertext: string;
  secretHint: string;
  state: "active" | "disabled";
  failingSince: Date | null;
  disabledAt: Date | null;
  disabledReason: string | null;
}>;

export async function updateWebhookEndpoint(tx: Tx, shopId: string, id: string, patch: WebhookEndpointPatch): Promise<WebhookEndpointView | null> {
  const [row] = await tx
    .update(webhookEndpoints)
    .set({ ...patch, updatedAt: sql`now()` })
    .where(and(eq(webhookEndpoints.shopId, shopId), eq(webhookEndpoints.id, id)))
    .returning(endpointColumns);
  return row ?? null;
}

/** Deletes the endpoint and, with it, its log and every delivery still waiting. */
export async function deleteWebhookEndpoint(tx: Tx, shopId: string, id: string): Promise<WebhookEndpointView | null> {
  const [row] = await tx
    .delete(webhookEndpoints)
    .where(and(eq(webhookEndpoints.shopId, shopId), eq(webhookEndpoints.id, id)))
    .returning(endpointColumns);
  return row ?? null;
}

/** Deliveries still to be attempted for an endpoint that stopped: marked as not sent. */
export async function cancelPendingDeliveries(tx: Tx, shopId: string, endpointId: string): Promise<number> {
  const rows = await tx
    .update(webhookDeliveries)
    .set({ state: "cancelled", nextAttemptAt: null, updatedAt: sql`now()` })
    .where(and(eq(webhookDeliveries.shopId, shopId), eq(webhookDeliveries.endpointId, endpointId), inArray(webhookDeliveries.state, ["waiting", "retrying"])))
    .returning({ id: webhookDeliveries.id });
  return rows.length;
}

/**
 * One delivery per active endpoint that takes this event's type, in the transaction that records
 * the event (db/queries/shop-events.ts): the deliveries exist exactly when the event does.
 */
export async function fanOutShopEvent(tx: Tx, shopId: string, eventId: string, type: ShopEventType): Promise<void> {
  await tx.execute(sql`
    insert into ${webhookDeliveries} (shop_id, endpoint_id, event_id, event_type, next_attempt_at)
    select ${webhookEndpoints.shopId}, ${webhookEndpoints.id}, ${eventId}::uuid, ${type}, now()
    from ${webhookEndpoints}
    where ${webhookEndpoints.shopId} = ${shopId} and ${webhookEndpoints.state} = 'active' and ${type} = any(${webhookEndpoints.events})
    on conflict do nothing`);
}

const deliveryColumns = {
  id: webhookDeliveries.id,
  eventId: webhookDeliveries.eventId,
  eventType: webhookDeliveries.eventType,
  isReplay: webhookDeliveries.isReplay,
  state: webhookDeliveries.state,
  attempts: webhookDeliveries.attempts,
  lastStatusCode: webhookDeliveries.lastStatusCode,
  lastDurationMs: webhookDeliveries.lastDurationMs,
  lastError: webhookDeliveries.lastError,
  lastResponse: webhookDeliveries.lastResponse,
  nextAttemptAt: webhookDeliveries.nextAttemptAt,
  lastAttemptAt: webhookDeliveries.lastAttemptAt,
  deliveredAt: webhookDeliveries.deliveredAt,
  createdAt: webhookDeliveries.createdAt,
};

const DELIVERY_SORTS = {
  created: webhookDeliveries.createdAt,
  // what needs attention first
  state: ranked(webhookDeliveries.state, ["failed", "retrying", "waiting", "cancelled", "delivered"]),
  attempts: webhookDeliveries.attempts,
  code: webhookDeliveries.lastStatusCode,
  duration: webhookDeliveries.lastDurationMs,
  next: webhookDeliveries.nextAttemptAt,
};

/** A page of one endpoint's delivery log (the search matches the event id or type). */
export async function listWebhookDeliveries(shopId: string, endpointId: string, q: WebhookDeliveryListQuery) {
  return withShop(shopId, (tx) => {
    const where = and(
      eq(webhookDeliveries.shopId, shopId),
      eq(webhookDeliveries.endpointId, endpointId),
      q.state === "all" ? undefined : eq(webhookDeliveries.state, q.state),
      q.event === "all" ? undefined : eq(webhookDeliveries.eventType, q.event),
      q.q
        ? sql`(${webhookDeliveries.eventId}::text ilike ${`%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`} or ${webhookDeliveries.eventType} ilike ${`%${q.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`})`
        : undefined,
    );
    return readPage(
      q,
      () => tx.select({ n: count() }).from(webhookDeliveries).where(where),
      (limit, offset) =>
        tx
          .select(deliveryColumns)
          .from(webhookDeliveries)
          .where(where)
          .orderBy(...sortedBy(DELIVERY_SORTS, q, desc(webhookDeliveries.createdAt), asc(webhookDeliveries.id)))
          .limit(limit)
          .offset(offset),
    );
  });
}

export type WebhookDeliveryView = Awaited<ReturnType<typeof listWebhookDeliveries>>["rows"][number];

/** How many of an endpoint's deliveries are in each state. */
export async function countDeliveriesByState(shopId: string, endpointId: string): Promise<Record<WebhookDeliveryState, number>> {
  const rows = await withShop(shopId, (tx) =>
    tx
      .select({ state: webhookDeliveries.state, n: count() })
      .from(webhookDeliveries)
      .where(and(eq(webhookDeliveries.shopId, shopId), eq(webhookDeliveries.endpointId, endpointId)))
      .groupBy(webhookDeliveries.state),
  );
  const out = { waiting: 0, retrying: 0, delivered: 0, failed: 0, cancelled: 0 };
  for (const r of rows) out[r.state] = r.n;
  return out;
}

/** The delivery of the shop with its endpoint id (null for another shop's id or none). */
export async function getWebhookDelivery(tx: Tx, shopId: string, id: string) {
  const [row] = await tx
    .select({ id: webhookDeliveries.id, endpointId: webhookDeliveries.endpointId, eventId: webhookDeliveries.eventId, eventType: webhookDeliveries.eventType })
    .from(webhookDeliveries)
    .where(and(eq(webhookDeliveries.shopId, shopId), eq(webhookDeliveries.id, id)))
    .limit(1);
  return row ?? null;
}

/** The same event to the same endpoint once more, due now; answers the new delivery's id. */
export async function insertReplay(tx: Tx, shopId: string, d: { endpointId: string; eventId: string; eventType: ShopEventType }): Promise<string> {
  const [row] = await tx
    .insert(webhookDeliveries)
    .values({ shopId, endpointId: d.endpointId, eventId: d.eventId, eventType: d.eventType, isReplay: true, nextAttemptAt: sql`now()` })
    .returning({ id: webhookDeliveries.id });
  if (!row) throw new Error("webhook replay insert returned no row");
  return row.id;
}

/**
 * Deliveries due now across every shop, oldest first, for the dispatcher: the one read across
 * shops (it runs for the job queue, never for a member, and hands out only ids).
 */
export async function listDueDeliveries(limit = 200): Promise<{ id: string; shopId: string }[]> {
  // a SECURITY DEFINER function (drizzle/0013_cross-shop-lookups.sql): the policies keep the app's role to one shop
  const { rows } = await db.execute<{ id: string; shop_id: string }>(sql`select id, shop_id from due_webhook_deliveries(${limit})`);
  return rows.map((r) => ({ id: r.id, shopId: r.shop_id }));
}

/**
 * Locks a due delivery for one attempt (FOR UPDATE SKIP LOCKED: a second worker skips it) and reads
 * what the attempt needs: the endpoint with its encrypted secret, the event, the shop's address.
 * Null when it is locked, not due, or gone.
 */
export async function lockDueDelivery(tx: Tx, shopId: string, id: string) {
  const [row] = await tx
    .select({
      id: webhookDeliveries.id,
      attempts: webhookDeliveries.attempts,
      endpointId: webhookEndpoints.id,
      url: webhookEndpoints.url,
      endpointState: webhookEndpoints.state,
      secretCiphertext: webhookEndpoints.secretCiphertext,
      failingSince: webhookEndpoints.failingSince,
      eventId: shopEvents.id,
      eventType: shopEvents.type,
      payload: shopEvents.payload,
      eventCreatedAt: shopEvents.createdAt,
      shopSlug: shops.slug,
    })
    .from(webhookDeliveries)
    .innerJoin(webhookEndpoints, and(eq(webhookEndpoints.shopId, webhookDeliveries.shopId), eq(webhookEndpoints.id, webhookDeliveries.endpointId)))
    .innerJoin(shopEvents, and(eq(shopEvents.shopId, webhookDeliveries.shopId), eq(shopEvents.id, webhookDeliveries.eventId)))
    .innerJoin(shops, eq(shops.id, webhookDeliveries.shopId))
    .where(
      and(
        eq(webhookDeliveries.shopId, shopId),
        eq(webhookDeliveries.id, id),
        inArray(webhookDeliveries.state, ["waiting", "retrying"]),
        lte(webhookDeliveries.nextAttemptAt, sql`now()`),
      ),
    )
    .for("update", { of: webhookDeliveries, skipLocked: true })
    .limit(1);
  return row ?? null;
}

export interface AttemptRecord {
  state: WebhookDeliveryState;
  attempts: number;
  statusCode: number | null;
  durationMs: number;
  error: string | null;
  response: string | null;
  nextAttemptAt: Date | null;
}

export async function recordDeliveryAttempt(tx: Tx, shopId: string, id: string, a: AttemptRecord): Promise<void> {
  await tx
    .update(webhookDeliveries)
    .set({
      state: a.state,
      attempts: a.attempts,
      lastStatusCode: a.statusCode,
      lastDurationMs: a.durationMs,
      lastError: a.error,
      lastResponse: a.response,
      nextAttemptAt: a.nextAttemptAt,
      lastAttemptAt: sql`now()`,
      deliveredAt: a.state === "delivered" ? sql`now()` : null,
      updatedAt: sql`now()`,
    })
    .where(and(eq(webhookDeliveries.shopId, shopId), eq(webhookDeliveries.id, id)));
}

/**
 * After an attempt: a success clears the endpoint's failing mark; a failure sets it (kept from the
 * first failure on). Answers since when it has been failing (null when it is healthy).
 */
export async function markEndpointHealth(tx: Tx, shopId: string, endpointId: string, delivered: boolean): Promise<Date | null> {
  const [row] = await tx
    .update(webhookEndpoints)
    .set({ failingSince: delivered ? null : sql`coalesce(${webhookEndpoints.failingSince}, now())` })
    .where(and(eq(webhookEndpoints.shopId, shopId), eq(webhookEndpoints.id, endpointId)))
    .returning({ failingSince: webhookEndpoints.failingSince });
  return row?.failingSince ?? null;
}

/** The shop's managers' names and e-mail addresses (who hears that an endpoint was stopped). */
export async function listManagerContacts(tx: Tx, shopId: string): Promise<{ name: string; email: string }[]> {
  return tx
    .select({ name: users.name, email: users.email })
    .from(members)
    .innerJoin(users, eq(users.id, members.userId))
    .where(and(eq(members.shopId, shopId), eq(members.role, "manager")))
    .orderBy(asc(users.email));
}
