import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { auditEvents, type AuditChange } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";

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
export async function listAuditForSubject(shopId: string, subjectType: string, subjectId: string, limit = 50) {
  return withShop(shopId, (tx) =>
    tx
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.shopId, shopId), eq(auditEvents.subjectType, subjectType), eq(auditEvents.subjectId, subjectId)))
      .orderBy(desc(auditEvents.createdAt))
      .limit(Math.min(Math.max(1, limit), 500)),
  );
}
