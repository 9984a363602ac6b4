import "server-only";
import { and, asc, count, desc, eq, sql } from "drizzle-orm";
import { bankRequests, quotes, users } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { Requirement } from "@/lib/bank/types";
import type { ChosenRecord } from "@/lib/quoting/types";
import type { RequestListQuery } from "@/lib/validation/lists";
import type { RequestStatus } from "@/lib/vocabulary";
import { containsText, ranked, readPage, sortedBy, type Page } from "./paging";

export interface RequestListRow {
  id: string;
  status: RequestStatus;
  customerName: string;
  customerEmail: string;
  requirement: Requirement;
  maxVoltage: number;
  quantity: number;
  reviewReasons: string[];
  quoteNumber: string | null;
  createdAt: Date;
}

const REQUEST_SORTS = {
  created: bankRequests.createdAt,
  customer: users.name,
  voltage: sql<number>`(${bankRequests.requirement}->>'maxVoltage')::float8`,
  // what an estimator must act on first
  status: ranked(bankRequests.status, ["needs-review", "quoted", "closed"]),
};

/** A page of the shop's requests with the customer and the quote made from each, if any; ties newest first. */
export async function listRequests(shopId: string, q: RequestListQuery): Promise<Page<RequestListRow>> {
  const where = and(
    eq(bankRequests.shopId, shopId),
    q.status === "all" ? undefined : eq(bankRequests.status, q.status),
    containsText(q.q, users.name, users.email),
  );
  const page = await withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(bankRequests).innerJoin(users, eq(users.id, bankRequests.customerUserId)).where(where),
      (limit, offset) =>
        tx
          .select({
            id: bankRequests.id,
            status: bankRequests.status,
            customerName: users.name,
            customerEmail: users.email,
            requirement: bankRequests.requirement,
            reviewReasons: bankRequests.reviewReasons,
            quoteNumber: quotes.number,
            createdAt: bankRequests.createdAt,
          })
          .from(bankRequests)
          .innerJoin(users, eq(users.id, bankRequests.customerUserId))
          .leftJoin(quotes, and(eq(quotes.shopId, bankRequests.shopId), eq(quotes.requestId, bankRequests.id)))
          .where(where)
          .orderBy(...sortedBy(REQUEST_SORTS, q, desc(bankRequests.createdAt), asc(bankRequests.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
  return {
    ...page,
    rows: page.rows.map(({ requirement, ...r }) => ({ ...r, requirement, maxVoltage: requirement.maxVoltage, quantity: requirement.quantity ?? 1 })),
  };
}

/** Requests waiting for an estimator, counted for the desk. */
export async function countRequestsNeedingReview(shopId: string): Promise<number> {
  const [t] = await withShop(shopId, (tx) =>
    tx
      .select({ n: count() })
      .from(bankRequests)
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.status, "needs-review"))),
  );
  return t?.n ?? 0;
}

export async function getRequest(shopId: string, requestId: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select()
      .from(bankRequests)
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.id, requestId)))
      .limit(1),
  );
  return row ?? null;
}

export interface NewBankRequest {
  customerUserId: string;
  /** "quoted" when a quote is made in the same transaction; "needs-review" for the estimators */
  status: "quoted" | "needs-review";
  requirement: Requirement;
  notes: string;
  reviewReasons?: string[];
  chosenOption: ChosenRecord | null;
  idempotencyKey: string;
}

/** Records a request; null when the shop already holds one with this idempotency key (a double submit). */
export async function insertBankRequest(tx: Tx, shopId: string, r: NewBankRequest): Promise<string | null> {
  const [row] = await tx
    .insert(bankRequests)
    .values({ shopId, ...r, reviewReasons: r.reviewReasons ?? [] })
    .onConflictDoNothing()
    .returning({ id: bankRequests.id });
  return row?.id ?? null;
}

/** The request an earlier submit with this idempotency key made in the shop, if any. */
export async function getRequestByIdempotencyKey(shopId: string, idempotencyKey: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({ id: bankRequests.id, customerUserId: bankRequests.customerUserId, status: bankRequests.status })
      .from(bankRequests)
      .where(and(eq(bankRequests.shopId, shopId), eq(bankRequests.idempotencyKey, idempotencyKey)))
      .limit(1),
  );
  return row ?? null;
}
