import "server-only";
import { Client } from "pg";
import { env } from "@/lib/env";
import { getShopBySlug } from "./shops";

/**
 * Shops looked up by slug, kept in this process for the public search (the arrangements endpoint
 * and the storefront's search), so a search needs no database round trip at all when the shop and
 * its catalog (db/queries/catalog.ts) are already known.
 *
 * Kept only while it is known to be current: the process listens on PostgreSQL's `shop_changed`
 * channel, which a trigger on `shops` notifies when a shop changes or its catalog version moves
 * (drizzle/0013_shop-change-notifications.sql), and forgets that shop at once; every server has
 * its own listener, so a change made through any server is seen by all. While the listener is not
 * connected (starting, or after its connection dropped) nothing is kept and every lookup reads the
 * database; when it reconnects it starts from empty, so a notice missed meanwhile cannot leave a
 * stale entry. As a last guard an entry is read again after a minute.
 */
type Shop = NonNullable<Awaited<ReturnType<typeof getShopBySlug>>>;

const CHANNEL = "shop_changed";
const MAX_AGE_MS = 60_000;
const MAX_ENTRIES = 1000;

interface Directory {
  bySlug: Map<string, { shop: Shop; at: number }>;
  /** moves with every notice: a lookup that raced one is not kept */
  notices: number;
  listening: boolean;
  client: Client | null;
  connecting: boolean;
  retryMs: number;
}

const state = globalThis as unknown as { faradsmithShopDirectory?: Directory };
const dir = (state.faradsmithShopDirectory ??= {
  bySlug: new Map(),
  notices: 0,
  listening: false,
  client: null,
  connecting: false,
  retryMs: 1000,
});

function forget(shopId: string): void {
  dir.notices += 1;
  for (const [slug, entry] of dir.bySlug) if (entry.shop.id === shopId) dir.bySlug.delete(slug);
}

function dropListener(reason: string): void {
  if (!dir.client) return;
  console.error(`[shops] stopped listening for shop changes (${reason}); looking shops up in the database until it is back`);
  const client = dir.client;
  dir.client = null;
  dir.listening = false;
  dir.bySlug.clear();
  void client.end().catch(() => undefined);
  const wait = dir.retryMs;
  dir.retryMs = Math.min(dir.retryMs * 2, 60_000);
  setTimeout(() => void listen(), wait).unref();
}

async function listen(): Promise<void> {
  if (dir.client || dir.connecting) return;
  dir.connecting = true;
  const client = new Client({ connectionString: env.DATABASE_URL, connectionTimeoutMillis: 10_000 });
  client.on("error", (error) => dropListener(error.message));
  client.on("end", () => dropListener("connection ended"));
  client.on("notification", (message) => {
    if (message.channel === CHANNEL && message.payload) forget(message.payload);
  });
  try {
    await client.connect();
    await client.query(`LISTEN ${CHANNEL}`);
    dir.client = client;
    dir.bySlug.clear();
    dir.listening = true;
    dir.retryMs = 1000;
  } catch (error) {
    void client.end().catch(() => undefined);
    const wait = dir.retryMs;
    dir.retryMs = Math.min(dir.retryMs * 2, 60_000);
    setTimeout(() => void listen(), wait).unref();
    console.error(`[shops] could not listen for shop changes (${error instanceof Error ? error.message : String(error)}); trying again in ${wait / 1000} s`);
  } finally {
    dir.connecting = false;
  }
}

/** The shop a slug names, with its catalog version, from this process's directory when it is current. */
export async function getListedShopBySlug(slug: string): Promise<Shop | null> {
  if (!dir.client && !dir.connecting) void listen();
  const hit = dir.listening ? dir.bySlug.get(slug) : undefined;
  if (hit && Date.now() - hit.at < MAX_AGE_MS) return hit.shop;
  const notices = dir.notices;
  const shop = await getShopBySlug(slug);
  // kept only when no notice arrived while it was read (it might have been about this shop)
  if (shop && dir.listening && dir.notices === notices) {
    if (dir.bySlug.size >= MAX_ENTRIES) dir.bySlug.delete(dir.bySlug.keys().next().value as string);
    dir.bySlug.set(slug, { shop, at: Date.now() });
  }
  return shop;
}

/** Whether this process is listening for shop changes now (for tests and health reports). */
export function shopDirectoryListening(): boolean {
  return dir.listening;
}

/** The listener's own connection's backend process id (tests end it to check the recovery). */
export async function shopDirectoryBackendPid(): Promise<number | null> {
  if (!dir.client) return null;
  const { rows } = await dir.client.query<{ pid: number }>("select pg_backend_pid() as pid");
  return rows[0]?.pid ?? null;
}
