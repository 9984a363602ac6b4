import "server-only";
/** Accepting an upload: the rates, the quotas, then the bytes and their row, together or not at all. */
import { createAttachment, getUploadUsage, lockShopUploads } from "@/db/queries/attachments";
import { withShop } from "@/db/tx";
import { env } from "@/lib/env";
import { limits } from "@/lib/http/limits";
import { MAX_PENDING_ATTACHMENTS_PER_USER } from "@/lib/validation/limits";
import type { AttachmentContentType } from "./content-type";
import { removeStoredBytes, storeAttachmentBytes } from "./storage";

const MB = 1024 * 1024;
const megabytes = (bytes: number) => `${Math.round(bytes / MB)} MB`;

export type UploadOutcome =
  | { ok: true; attachment: { id: string; fileName: string; sizeBytes: number; contentType: AttachmentContentType } }
  | { ok: false; status: 413 | 429; message: string; retryAfterSeconds?: number };

/**
 * Stores one upload for a person in a shop, or says why not:
 * - at most UPLOAD_RATE_PER_USER uploads per person per 10 minutes (whichever shop) and
 *   UPLOAD_RATE_PER_SHOP per shop per hour (429 with Retry-After);
 * - at most UPLOAD_USER_QUOTA_MB stored by the person in the shop, UPLOAD_SHOP_QUOTA_MB by the shop,
 *   and MAX_PENDING_ATTACHMENTS_PER_USER files not yet attached to a request (413).
 * The quotas are checked and the row written under a per-shop lock in one transaction, so uploads
 * racing each other cannot together pass a quota.
 */
export async function acceptUpload(
  shopId: string,
  userId: string,
  file: { fileName: string; contentType: AttachmentContentType; bytes: Uint8Array },
): Promise<UploadOutcome> {
  for (const gate of [await limits.uploadsPerUser.hit(userId), await limits.uploadsPerShop.hit(shopId)]) {
    if (!gate.allowed) {
      return {
        ok: false,
        status: 429,
        message: `Too many uploads for now; try again in ${gate.retryAfterSeconds} s.`,
        retryAfterSeconds: gate.retryAfterSeconds,
      };
    }
  }
  const size = file.bytes.byteLength;
  const userQuota = env.UPLOAD_USER_QUOTA_MB * MB;
  const shopQuota = env.UPLOAD_SHOP_QUOTA_MB * MB;
  return withShop(shopId, async (tx): Promise<UploadOutcome> => {
    await lockShopUploads(tx, shopId);
    const usage = await getUploadUsage(tx, shopId, userId);
    if (usage.userPending >= MAX_PENDING_ATTACHMENTS_PER_USER) {
      return {
        ok: false,
        status: 413,
        message: `You have ${usage.userPending} files not yet sent with a request; send your request first (files not sent within a day are removed).`,
      };
    }
    if (usage.userBytes + size > userQuota) {
      return { ok: false, status: 413, message: `Your files in this shop may take up to ${megabytes(userQuota)}; this one does not fit.` };
    }
    if (usage.shopBytes + size > shopQuota) {
      return { ok: false, status: 413, message: "This shop's storage for drawings is full; please send the file to the shop another way." };
    }
    const stored = await storeAttachmentBytes(shopId, file.bytes);
    try {
      const attachment = await createAttachment(shopId, {
        id: stored.id,
        uploadedByUserId: userId,
        fileName: file.fileName,
        contentType: file.contentType,
        sizeBytes: size,
        sha256: stored.sha256,
        storageKey: stored.storageKey,
      });
      return { ok: true, attachment: { ...attachment, contentType: file.contentType } };
    } catch (error) {
      await removeStoredBytes(stored.storageKey);
      throw error;
    }
  });
}
