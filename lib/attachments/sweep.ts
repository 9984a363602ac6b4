import "server-only";
/**
 * Files uploaded but never attached to a request are deleted after a day: a pg-boss schedule
 * (hourly, on whichever server's worker takes it) finds them in every shop, then deletes each row in
 * its own shop's scope and its bytes after it. A row goes before its file, so nothing points at a
 * missing file; a file whose removal fails is logged (the row is already gone).
 */
import type PgBoss from "pg-boss";
import { deleteStaleUnlinkedAttachment, listStaleUnlinkedAttachments } from "@/db/queries/attachments";
import { removeStoredBytes } from "./storage";

export const ATTACHMENT_SWEEP_QUEUE = "attachment-sweep";
/** A day: time enough to finish a request the files were uploaded for. */
export const UNLINKED_ATTACHMENT_MAX_AGE_SECONDS = 24 * 60 * 60;
const BATCH = 500;

/** Deletes every unattached file older than `maxAgeSeconds`; answers how many. */
export async function sweepUnlinkedAttachments(maxAgeSeconds = UNLINKED_ATTACHMENT_MAX_AGE_SECONDS): Promise<number> {
  let deleted = 0;
  for (let round = 0; round < 100; round++) {
    const stale = await listStaleUnlinkedAttachments(maxAgeSeconds, BATCH);
    let gone = 0;
    for (const a of stale) {
      const storageKey = await deleteStaleUnlinkedAttachment(a.shopId, a.id, maxAgeSeconds);
      if (!storageKey) continue; // attached or removed meanwhile
      gone += 1;
      await removeStoredBytes(storageKey).catch((error: unknown) =>
        console.error(`[attachments] the file of ${a.id} was not removed: ${error instanceof Error ? error.message : String(error)}`),
      );
    }
    deleted += gone;
    if (stale.length < BATCH || gone === 0) break;
  }
  return deleted;
}

/** The sweep's queue, worker and hourly schedule, on the process's job queue. */
export async function startAttachmentSweep(boss: PgBoss): Promise<void> {
  await boss.createQueue(ATTACHMENT_SWEEP_QUEUE, { name: ATTACHMENT_SWEEP_QUEUE, retryLimit: 0, expireInSeconds: 15 * 60 });
  await boss.work(ATTACHMENT_SWEEP_QUEUE, { pollingIntervalSeconds: 60 }, async () => {
    const n = await sweepUnlinkedAttachments();
    if (n > 0) console.info(`[attachments] removed ${n} file${n === 1 ? "" : "s"} never attached to a request`);
  });
  await boss.schedule(ATTACHMENT_SWEEP_QUEUE, "17 * * * *");
}
