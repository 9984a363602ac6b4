import ipaddr from "ipaddr.js";

/**
 * Who is asking, as far as the network can tell: the address rate limits are keyed on.
 *
 * A Web `Request` in a Next.js route handler or server action carries no socket address. The
 * production server (scripts/serve.mjs) therefore appends each connection's own address to
 * `X-Forwarded-For`, exactly as a reverse proxy does, so the right-most entry is always the peer
 * (`peerAppended`). Walking the list from the right, entries that belong to `trustedProxies` are
 * skipped; the first address that is not a trusted proxy is the client. Anything a client writes
 * into the header sits to the left of that and is never believed.
 *
 * Without `peerAppended` (plain `next start` or `next dev`) a client-written header cannot be told
 * from the server's own, so the answer is `null` unless trusted proxies are configured (then the
 * deployment rule is that only those proxies can reach the app). Callers key a `null` on one
 * shared bucket: safe against per-request forgery, at the price of sharing.
 */
export interface ClientAddressOptions {
  /** addresses and CIDR ranges of reverse proxies whose forwarding headers are believed */
  trustedProxies: readonly string[];
  /** whether the server appended the connection's own address to X-Forwarded-For */
  peerAppended: boolean;
}

type Range = [ipaddr.IPv4 | ipaddr.IPv6, number];

const rangeCache = new Map<string, Range[]>();
function ranges(list: readonly string[]): Range[] {
  const key = list.join(",");
  let parsed = rangeCache.get(key);
  if (!parsed) {
    parsed = list.map((entry): Range => {
      if (entry.includes("/")) return ipaddr.parseCIDR(entry);
      const a = ipaddr.process(entry);
      return [a, a.kind() === "ipv4" ? 32 : 128];
    });
    rangeCache.set(key, parsed);
  }
  return parsed;
}

/** A parsed address with IPv4-mapped IPv6 ("::ffff:192.0.2.1") read as IPv4, or null. */
function parse(value: string): ipaddr.IPv4 | ipaddr.IPv6 | null {
  const v = value.trim().replace(/^\[(.*)\]$/, "$1");
  if (!ipaddr.isValid(v)) return null;
  return ipaddr.process(v);
}

function isTrusted(address: ipaddr.IPv4 | ipaddr.IPv6, trusted: Range[]): boolean {
  return trusted.some(([range, bits]) => range.kind() === address.kind() && address.match(range, bits));
}

/**
 * The key an address is counted under: IPv4 as written, IPv6 as its /64 network address (one
 * subscriber usually holds a whole /64, so counting single IPv6 addresses would let one client
 * rotate). Always a valid address, since better-auth checks the header it reads.
 */
export function addressKey(address: ipaddr.IPv4 | ipaddr.IPv6): string {
  if (address.kind() === "ipv4") return address.toString();
  const parts = (address as ipaddr.IPv6).parts;
  return new ipaddr.IPv6([...parts.slice(0, 4), 0, 0, 0, 0]).toString();
}

export function clientAddress(headers: Headers, options: ClientAddressOptions): string | null {
  const chain = (headers.get("x-forwarded-for") ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const trusted = ranges(options.trustedProxies);
  if (!options.peerAppended && trusted.length === 0) return null;
  // With the peer appended, the right-most entry is the connection itself and is checked like
  // any hop. Without it, the trusted proxy is assumed to be the only way in (deployment rule).
  let lastTrusted: ipaddr.IPv4 | ipaddr.IPv6 | null = null;
  for (let i = chain.length - 1; i >= 0; i -= 1) {
    const hop = parse(chain[i] ?? "");
    if (!hop) return null; // a hop nobody can read: believe nothing to its left
    if (!isTrusted(hop, trusted)) return addressKey(hop);
    lastTrusted = hop;
  }
  // Every hop was a trusted proxy: one of them may have said who it talked to.
  const realIp = parse(headers.get("x-real-ip") ?? "");
  if (realIp && lastTrusted) return addressKey(realIp);
  return lastTrusted ? addressKey(lastTrusted) : null;
}
