import "server-only";
import { and, asc, count, eq, inArray, isNull, lt, sql, sum } from "drizzle-orm";
import { db } from "@/db";
import { requestAttachments } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";

export interface NewAttachment {
  id: string;
  uploadedByUserId: string;
  fileName: string;
  contentType: string;
  sizeBytes: number;
  sha256: string;
  storageKey: string;
}

export async function createAttachment(shopId: string, a: NewAttachment) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .insert(requestAttachments)
      .values({ shopId, ...a })
      .returning({
        id: requestAttachments.id,
        fileName: requestAttachments.fileName,
        sizeBytes: requestAttachments.sizeBytes,
        contentType: requestAttachments.contentType,
      }),
  );
  if (!row) throw new Error("attachment insert returned no row");
  return row;
}

/** One attachment of the shop; null when it is another shop's or does not exist. */
export async function getAttachment(shopId: string, attachmentId: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select()
      .from(requestAttachments)
      .where(and(eq(requestAttachments.shopId, shopId), eq(requestAttachments.id, attachmentId)))
      .limit(1),
  );
  return row ?? null;
}

export async function listRequestAttachments(shopId: string, requestId: string) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        id: requestAttachments.id,
        fileName: requestAttachments.fileName,
        sizeBytes: requestAttachments.sizeBytes,
        contentType: requestAttachments.contentType,
      })
      .from(requestAttachments)
      .where(and(eq(requestAttachments.shopId, shopId), eq(requestAttachments.requestId, requestId)))
      .orderBy(asc(requestAttachments.createdAt)),
  );
}

/** Links the uploader's own unlinked files in this shop to a request; anyone else's ids are ignored. */
export async function linkAttachmentsToRequest(tx: Tx, shopId: string, uploadedByUserId: string, requestId: string, attachmentIds: readonly string[]) {
  if (attachmentIds.length === 0) return;
  await tx
    .update(requestAttachments)
    .set({ requestId })
    .where(
      and(
        eq(requestAttachments.shopId, shopId),
        eq(requestAttachments.uploadedByUserId, uploadedByUserId),
        isNull(requestAttachments.requestId),
        inArray(requestAttachments.id, [...attachmentIds]),
      ),
    );
}

/**
 * Serializes uploads into one shop for the rest of the caller's transaction (a transaction-scoped
 * advisory lock), so two uploads at once cannot both pass a quota that has room for one.
 */
export async function lockShopUploads(tx: Tx, shopId: string): Promise<void> {
  await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended(${`uploads:${shopId}`}, 0))`);
}

/** What a shop and one of its people hold now: stored bytes, and the person's files not yet on a request. */
export async function getUploadUsage(tx: Tx, shopId: string, userId: string): Promise<{ shopBytes: number; userBytes: number; userPending: number }> {
  const [shop] = await tx
    .select({ bytes: sum(requestAttachments.sizeBytes).mapWith(Number) })
    .from(requestAttachments)
    .where(eq(requestAttachments.shopId, shopId));
  const [user] = await tx
    .select({
      bytes: sum(requestAttachments.sizeBytes).mapWith(Number),
      pending: count(sql`case when ${requestAttachments.requestId} is null then 1 end`),
    })
    .from(requestAttachments)
    .where(and(eq(requestAttachments.shopId, shopId), eq(requestAttachments.uploadedByUserId, userId)));
  return { shopBytes: shop?.bytes ?? 0, userBytes: user?.bytes ?? 0, userPending: user?.pending ?? 0 };
}

/**
 * Files uploaded before `cutoff` and never attached to a request, in every shop, oldest first: the
 * database function `stale_unlinked_attachments` hands out only ids, shops and storage keys.
 */
export async function listStaleUnlinkedAttachments(olderThanSeconds: number, limit: number): Promise<{ id: string; shopId: string; storageKey: string }[]> {
  const rows = await db.execute<{ id: string; shop_id: string; storage_key: string }>(
    sql`select id, shop_id, storage_key from stale_unlinked_attachments(${olderThanSeconds}, ${limit})`,
  );
  return rows.rows.map((r) => ({ id: r.id, shopId: r.shop_id, storageKey: r.storage_key }));
}

/** Deletes one of the shop's files if it is still unattached and older than `olderThanSeconds`; answers its storage key. */
export async function deleteStaleUnlinkedAttachment(shopId: string, attachmentId: string, olderThanSeconds: number): Promise<string | null> {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .delete(requestAttachments)
      .where(
        and(
          eq(requestAttachments.shopId, shopId),
          eq(requestAttachments.id, attachmentId),
          isNull(requestAttachments.requestId),
          lt(requestAttachments.createdAt, sql`now() - make_interval(secs => ${olderThanSeconds})`),
        ),
      )
      .returning({ storageKey: requestAttachments.storageKey }),
  );
  return row?.storageKey ?? null;
}
