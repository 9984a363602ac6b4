import "server-only";
/** Attachments: the bytes of uploaded files under UPLOAD_DIR, outside public/, one folder per shop. */
import { createHash, randomUUID } from "node:crypto";
import { createReadStream } from "node:fs";
import { mkdir, rm, writeFile } from "node:fs/promises";
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

/** The stored bytes as a web stream for a Response body. */
export function attachmentStream(storageKey: string): ReadableStream<Uint8Array> {
  return Readable.toWeb(createReadStream(fileOf(storageKey))) as ReadableStream<Uint8Array>;
}

/** Removes stored bytes that nothing points at any more (a replaced datasheet); a missing file is fine. */
export async function removeStoredBytes(storageKey: string): Promise<void> {
  await rm(fileOf(storageKey), { force: true });
}
