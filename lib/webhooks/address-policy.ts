import { lookup as dnsLookup } from "node:dns/promises";
import ipaddr from "ipaddr.js";
import { checkWebhookUrlSyntax } from "./url-syntax";

/**
 * Where outbound webhooks may go (SSRF). Only http(s) URLs without credentials; and every address
 * the host resolves to must be a public unicast address: loopback, private (10/8, 172.16/12,
 * 192.168/16, fc00::/7), link-local (169.254/16 with the cloud metadata address, fe80::/10),
 * carrier-grade NAT, multicast, reserved and the other special ranges are refused. Loopback is let
 * through only when the policy allows it (WEBHOOK_ALLOW_LOOPBACK: local development and tests).
 * Checked when an endpoint is saved and again on every delivery, against the address actually
 * connected to (lib/webhooks/send.ts), so a name that later resolves elsewhere is caught.
 */

export interface AddressPolicy {
  allowLoopback: boolean;
}

export type Resolver = (hostname: string) => Promise<{ address: string; family: number }[]>;

const systemResolver: Resolver = (hostname) => dnsLookup(hostname, { all: true, verbatim: true });

const RANGE_WORDS: Record<string, string> = {
  loopback: "loopback",
  private: "private-network",
  uniqueLocal: "private-network",
  linkLocal: "link-local",
  carrierGradeNat: "carrier-grade NAT",
  unspecified: "unspecified",
  broadcast: "broadcast",
  multicast: "multicast",
  reserved: "reserved",
};

/** Whether one IP address may be connected to, and if not, why (in words a manager reads). */
export function addressVerdict(ip: string, policy: AddressPolicy): { ok: true } | { ok: false; reason: string } {
  if (!ipaddr.isValid(ip)) return { ok: false, reason: `${ip} is not an IP address` };
  let address = ipaddr.parse(ip);
  if (address.kind() === "ipv6" && (address as ipaddr.IPv6).isIPv4MappedAddress()) address = (address as ipaddr.IPv6).toIPv4Address();
  const range = address.range();
  if (range === "unicast") return { ok: true };
  if (range === "loopback" && policy.allowLoopback) return { ok: true };
  return { ok: false, reason: `${ip} is a ${RANGE_WORDS[range] ?? `special-purpose (${range})`} address; webhooks go only to public addresses` };
}

/** The host's addresses when every one is allowed; otherwise why not. IP literals are checked as they are. */
export async function resolveAllowed(
  hostname: string,
  policy: AddressPolicy,
  resolve: Resolver = systemResolver,
): Promise<{ ok: true; addresses: { address: string; family: number }[] } | { ok: false; reason: string }> {
  const bare = hostname.replace(/^\[(.*)\]$/, "$1");
  let addresses: { address: string; family: number }[];
  if (ipaddr.isValid(bare)) addresses = [{ address: bare, family: bare.includes(":") ? 6 : 4 }];
  else {
    try {
      addresses = await resolve(bare);
    } catch {
      return { ok: false, reason: `${bare} could not be resolved.` };
    }
    if (addresses.length === 0) return { ok: false, reason: `${bare} could not be resolved.` };
  }
  for (const a of addresses) {
    const verdict = addressVerdict(a.address, policy);
    if (!verdict.ok) return { ok: false, reason: addresses.length === 1 && a.address === bare ? verdict.reason : `${bare} resolves to ${verdict.reason}` };
  }
  return { ok: true, addresses };
}

/** A URL an endpoint may be saved with: its syntax, then every address its host resolves to. */
export async function checkWebhookUrl(raw: string, policy: AddressPolicy, resolve?: Resolver): Promise<{ ok: true; url: URL } | { ok: false; reason: string }> {
  const syntax = checkWebhookUrlSyntax(raw);
  if (!syntax.ok) return syntax;
  const allowed = await resolveAllowed(syntax.url.hostname, policy, resolve);
  return allowed.ok ? syntax : allowed;
}
