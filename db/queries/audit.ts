import "server-only";
import { and, asc, count, desc, eq, like, or, sql } from "drizzle-orm";
import { auditEvents, users, type AuditChange } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import type { AuditListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy, type Page } from "./paging";

export interface AuditEntry {
  /** the signed-in person who acted, or null for an API key or the system */
  actorUserId: string | null;
  actorKeyId?: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  summary: string;
  changes?: Record<string, AuditChange> | null;
}

/** Records one staff mutation, in the transaction that makes it (so a rolled-back change leaves no entry). */
export async function recordAudit(tx: Tx, shopId: string, entry: AuditEntry): Promise<void> {
  await tx.insert(auditEvents).values({
    shopId,
    actorUserId: entry.actorUserId,
    actorKeyId: entry.actorKeyId ?? null,
    action: entry.action,
    subjectType: entry.subjectType,
    subjectId: entry.subjectId ?? null,
    summary: entry.summary,
    changes: entry.changes ?? null,
  });
}

/**
 * The fields that differ between two versions of a record, as `{ field: { from, to } }`; null when
 * nothing changed. Values are compared as JSON (numbers, strings, booleans, plain objects).
 */
export function changedFields<T extends Record<string, unknown>>(before: T, after: Partial<T>): Record<string, AuditChange> | null {
  const out: Record<string, AuditChange> = {};
  for (const [key, to] of Object.entries(after)) {
    const from = before[key];
    if (JSON.stringify(from) !== JSON.stringify(to)) out[key] = { from, to };
  }
  return Object.keys(out).length > 0 ? out : null;
}

/** The audit entries of one record, newest first (for a record's own history panel). */
export async function listAuditForSubject(tx: Tx, shopId: string, subjectType: string, subjectId: string, limit = 50) {
  return tx
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.subjectType, subjectType), eq(auditEvents.subjectId, subjectId)))
    .orderBy(desc(auditEvents.createdAt))
    .limit(Math.min(Math.max(1, limit), 500));
}

export interface AuditListRow {
  id: string;
  createdAt: Date;
  action: string;
  subjectType: string;
  subjectId: string | null;
  summary: string;
  changes: Record<string, AuditChange> | null;
  actorUserId: string | null;
  actorKeyId: string | null;
  actorName: string | null;
  actorEmail: string | null;
}

const AUDIT_SORTS = {
  created: auditEvents.createdAt,
  action: auditEvents.action,
  actor: users.name,
  subject: sql`${auditEvents.subjectType} || ':' || coalesce(${auditEvents.subjectId}, '')`,
};

/**
 * A page of the shop's audit log, newest first by default. `action` matches an action or its
 * family (`member` matches `member.role`); the search looks in the summary and the subject's id.
 */
export async function listAudit(shopId: string, q: AuditListQuery): Promise<Page<AuditListRow>> {
  const where = and(
    eq(auditEvents.shopId, shopId),
    q.action ? or(eq(auditEvents.action, q.action), like(auditEvents.action, `${q.action}.%`)) : undefined,
    q.subject ? eq(auditEvents.subjectType, q.subject) : undefined,
    q.actor ? eq(auditEvents.actorUserId, q.actor) : undefined,
    containsText(q.q, auditEvents.summary, auditEvents.subjectId),
  );
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(auditEvents).where(where),
      (limit, offset) =>
        tx
          .select({
            id: auditEvents.id,
            createdAt: auditEvents.createdAt,
            action: auditEvents.action,
            subjectType: auditEvents.subjectType,
            subjectId: auditEvents.subjectId,
            summary: auditEvents.summary,
            changes: auditEvents.changes,
            actorUserId: auditEvents.actorUserId,
            actorKeyId: auditEvents.actorKeyId,
            actorName: users.name,
            actorEmail: users.email,
          })
          .from(auditEvents)
          .leftJoin(users, eq(users.id, auditEvents.actorUserId))
          .where(where)
          .orderBy(...sortedBy(AUDIT_SORTS, q, desc(auditEvents.createdAt), asc(auditEvents.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
}

/** What the audit log's filters offer: the actions, subject types and people that occur in the shop's log. */
export async function getAuditFacets(shopId: string) {
  return withShop(shopId, async (tx) => {
    const actions = await tx
      .selectDistinct({ v: auditEvents.action })
      .from(auditEvents)
      .where(eq(auditEvents.shopId, shopId))
      .orderBy(asc(auditEvents.action))
      .limit(200);
    const subjects = await tx
      .selectDistinct({ v: auditEvents.subjectType })
      .from(auditEvents)
      .where(eq(auditEvents.shopId, shopId))
      .orderBy(asc(auditEvents.subjectType))
      .limit(200);
    const actors = await tx
      .selectDistinct({ id: users.id, name: users.name, email: users.email })
      .from(auditEvents)
      .innerJoin(users, eq(users.id, auditEvents.actorUserId))
      .where(eq(auditEvents.shopId, shopId))
      .orderBy(asc(users.name), asc(users.id))
      .limit(200);
    return { actions: actions.map((a) => a.v), subjectTypes: subjects.map((s) => s.v), actors };
  });
}
