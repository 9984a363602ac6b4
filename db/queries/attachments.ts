import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
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
