import "server-only";
import { createCipheriv, createDecipheriv, createHash, randomBytes } from "node:crypto";
import { env } from "@/lib/env";

/**
 * Endpoint signing secrets. The server must sign with them, so they cannot be hashed like
 * passwords; they are kept encrypted with AES-256-GCM under a key derived (SHA-256) from
 * WEBHOOK_SECRET_KEY, so a copy of the database alone does not give them away. Stored as
 * `v1.<iv>.<tag>.<ciphertext>` (base64url). Changing WEBHOOK_SECRET_KEY makes the stored secrets
 * unreadable: the manager then rolls each endpoint's secret (README, "Secrets").
 */

const PREFIX = "fsw_";

/** A new signing secret: `fsw_` and 32 random bytes (256 bits), base64url. */
export function newSigningSecret(): string {
  return `${PREFIX}${randomBytes(32).toString("base64url")}`;
}

/** What the desk shows of a secret it no longer knows how to show: its last four characters. */
export function secretHint(secret: string): string {
  return `…${secret.slice(-4)}`;
}

function key(material = env.WEBHOOK_SECRET_KEY): Buffer {
  return createHash("sha256").update(`faradsmith webhook secrets\u0000${material}`).digest();
}

export function encryptSecret(secret: string, material?: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", key(material), iv);
  const body = Buffer.concat([cipher.update(secret, "utf8"), cipher.final()]);
  return ["v1", iv.toString("base64url"), cipher.getAuthTag().toString("base64url"), body.toString("base64url")].join(".");
}

/** The secret, or null when it was encrypted under another key (or the text is damaged). */
export function decryptSecret(stored: string, material?: string): string | null {
  const [version, iv, tag, body] = stored.split(".");
  if (version !== "v1" || !iv || !tag || !body) return null;
  try {
    const decipher = createDecipheriv("aes-256-gcm", key(material), Buffer.from(iv, "base64url"));
    decipher.setAuthTag(Buffer.from(tag, "base64url"));
    return Buffer.concat([decipher.update(Buffer.from(body, "base64url")), decipher.final()]).toString("utf8");
  } catch {
    return null;
  }
}
