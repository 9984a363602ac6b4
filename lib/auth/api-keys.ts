import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { recordAudit } from "@/db/queries/audit";
import { findApiKey, insertApiKey, revokeApiKeyRow, touchApiKey } from "@/db/queries/api-keys";
import { withShop } from "@/db/tx";
import type { ApiKeyScope } from "./api-key-scopes";
import type { ShopContext } from "./context";

/**
 * A shop's API keys. The secret is `fsk_` and 43 characters of base64url (32 random bytes, 256 bits);
 * only its SHA-256 is stored — with that much entropy a plain hash is enough (no slow password hash
 * is needed: nobody can guess through the space), and it lets a request find its key with one
 * indexed lookup. better-auth's API-key plugin was not used: it keeps keys per user in its own
 * table, counts its rate limit on its own and mounts HTTP endpoints of its own, where this shop's
 * keys belong to the shop, are scoped by our own permission mapping (lib/auth/api-key-scopes.ts),
 * count in our PostgreSQL limiter (lib/http/limits.ts) and leave every call in our audit log.
 */

const PREFIX = "fsk_";
/** How much of a secret is kept to tell keys apart ("fsk_" and 8 characters). */
const SHOWN_PREFIX = PREFIX.length + 8;

export function hashApiKeySecret(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/** A new secret, its shown prefix and its hash. */
export function newApiKeySecret(): { secret: string; prefix: string; hash: string } {
  const secret = `${PREFIX}${randomBytes(32).toString("base64url")}`;
  return { secret, prefix: secret.slice(0, SHOWN_PREFIX), hash: hashApiKeySecret(secret) };
}

/** The bearer token of a request, or null when it sends none. A malformed Authorization header counts as a (bad) token. */
export function bearerToken(headers: Headers): string | null {
  const h = headers.get("authorization");
  if (h === null) return null;
  const m = /^Bearer\s+(\S+)\s*$/i.exec(h);
  return m ? (m[1] ?? "") : "";
}

/** Whether a token looks like one of our secrets at all (cheap check before any lookup). */
function wellFormed(token: string): boolean {
  return /^fsk_[A-Za-z0-9_-]{43}$/.test(token);
}

export type KeyResolution = { status: "ok"; ctx: ShopContext } | { status: "invalid" } | { status: "revoked"; keyId: string; actor: ShopContext["user"] };

/** The context a presented key gives in a shop: its creator stands behind it, its scopes limit it. */
export async function resolveApiKey(shop: ShopContext["shop"], token: string): Promise<KeyResolution> {
  if (!wellFormed(token)) return { status: "invalid" };
  const found = await findApiKey(shop.id, hashApiKeySecret(token));
  if (!found) return { status: "invalid" };
  const { key } = found;
  const user = { id: key.createdByUserId ?? "", name: found.creatorName ?? `API key ${key.name}`, email: found.creatorEmail ?? "" };
  if (key.revokedAt !== null) return { status: "revoked", keyId: key.id, actor: user };
  return { status: "ok", ctx: { user, shop, role: "estimator", apiKey: { id: key.id, name: key.name, scopes: key.scopes } } };
}

/** Every call made with a key goes into the audit log, with its answer's status; the key's last use is now. */
export async function recordKeyCall(shopId: string, keyId: string, request: Request, status: number): Promise<void> {
  const url = new URL(request.url);
  await withShop(shopId, async (tx) => {
    await touchApiKey(tx, shopId, keyId);
    await recordAudit(tx, shopId, {
      actorUserId: null,
      actorKeyId: keyId,
      action: "api-key.call",
      subjectType: "api-key",
      subjectId: keyId,
      summary: `${request.method} ${url.pathname}${url.search} → ${status}`,
    });
  });
}

/** Makes a key for the shop; answers its row (without the hash) and the secret, which is never shown again. */
export async function createApiKey(ctx: ShopContext, name: string, scopes: ApiKeyScope[]) {
  const { secret, prefix, hash } = newApiKeySecret();
  const row = await withShop(ctx.shop.id, async (tx) => {
    const made = await insertApiKey(tx, ctx.shop.id, { name, prefix, secretHash: hash, scopes, createdByUserId: ctx.user.id });
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "api-key.create",
      subjectType: "api-key",
      subjectId: made.id,
      summary: `API key "${name}" (${prefix}…) made with ${scopes.join(", ")}`,
    });
    return made;
  });
  return { id: row.id, name: row.name, prefix: row.prefix, scopes: row.scopes, secret };
}

/** Revokes a key: every request with it is refused from now on. Null when the shop has no such live key. */
export async function revokeApiKey(ctx: ShopContext, keyId: string) {
  return withShop(ctx.shop.id, async (tx) => {
    const row = await revokeApiKeyRow(tx, ctx.shop.id, keyId, ctx.user.id);
    if (!row) return null;
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "api-key.revoke",
      subjectType: "api-key",
      subjectId: row.id,
      summary: `API key "${row.name}" (${row.prefix}…) revoked`,
    });
    return { id: row.id, name: row.name };
  });
}
