import "server-only";
/** Attachments: the bytes of uploaded files under UPLOAD_DIR, outside public/, one folder per shop. */
import { createHash, randomUUID } from "node:crypto";
import { mkdir, open, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { env } from "@/lib/env";

const KEY = /^[A-Za-z0-9_-]+\/[0-9a-f-]{36}$/;

function fileOf(storageKey: string): string {
  if (!KEY.test(storageKey)) throw new Error(`bad storage key: ${storageKey}`);
  return path.resolve(env.UPLOAD_DIR, storageKey);
}

/** Writes the bytes under UPLOAD_DIR/<shopId>/<uuid> (outside public/) and answers their key and SHA-256. */
export async function storeAttachmentBytes(shopId: string, bytes: Uint8Array): Promise<{ id: string; storageKey: string; sha256: string }> {
  const id = randomUUID();
  const storageKey = `${shopId}/${id}`;
  const file = fileOf(storageKey);
  await mkdir(path.dirname(file), { recursive: true });
  await writeFile(file, bytes, { flag: "wx", mode: 0o600 });
  return { id, storageKey, sha256: createHash("sha256").update(bytes).digest("hex") };
}

/**
 * The stored bytes as a web stream for a Response body, with their size on disk; null when the
 * file is not there (the file is opened before anything is answered, so a missing one is a 404,
 * never an empty reply).
 */
export async function openAttachment(storageKey: string): Promise<{ stream: ReadableStream<Uint8Array>; sizeBytes: number } | null> {
  let handle;
  try {
    handle = await open(fileOf(storageKey), "r");
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw error;
  }
  const { size } = await handle.stat();
  return { stream: Readable.toWeb(handle.createReadStream()) as ReadableStream<Uint8Array>, sizeBytes: size };
}

/** Removes stored bytes nothing points at any more (an unattached upload, a replaced datasheet); one already gone is no error. */
export async function removeStoredBytes(storageKey: string): Promise<void> {
  await rm(fileOf(storageKey), { force: true });
}
