import "server-only";

/** The domain of a sender address: "Faradsmith <quotes@x.example>" → "x.example". */
export function senderDomain(from: string): string {
  const match = /@([A-Za-z0-9.-]+)>?\s*$/.exec(from);
  return match?.[1] ?? "faradsmith.invalid";
}

/**
 * A stable Message-ID per outbox row (RFC 5322 §3.6.4: "<" id-left "@" id-right ">"), so a retry
 * after an ambiguous failure carries the same one and the receiving side can tell.
 */
export function outboxMessageId(outboxId: string, from: string): string {
  return `<outbox-${outboxId}@${senderDomain(from)}>`;
}

/** "2026-08-14" → "14 August 2026": the date as stored, with no time-zone shift. */
export function formatValidity(isoDate: string): string {
  const date = new Date(`${isoDate}T00:00:00Z`);
  if (!/^\d{4}-\d{2}-\d{2}$/.test(isoDate) || Number.isNaN(date.getTime())) return isoDate;
  return new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" }).format(date);
}

/** The storefront address of a quote, as the e-mail links it. */
export function quotePageUrl(appUrl: string, shopSlug: string, quoteNumber: string): string {
  return `${appUrl.replace(/\/+$/, "")}/s/${encodeURIComponent(shopSlug)}/quotes/${encodeURIComponent(quoteNumber)}`;
}

/**
 * A shop's e-mail is sent as the shop through the product's own address:
 * "Kestrel Bank Works via Faradsmith <quotes@faradsmith.example>" (RFC 5322 §3.4 display name,
 * quoted when it holds specials).
 */
export function shopSenderAddress(shopName: string, from: string): string {
  const address = /<([^>]+)>\s*$/.exec(from)?.[1] ?? from.trim();
  const product = /^\s*"?([^"<]*?)"?\s*</.exec(from)?.[1]?.trim() || "Faradsmith";
  const name = `${shopName.replace(/["\\\r\n]/g, "")} via ${product}`;
  return /[()<>@,;:.[\]]/.test(name) ? `"${name}" <${address}>` : `${name} <${address}>`;
}
