/** An endpoint address's own rules, before any name is resolved. Pure: the desk's form checks them too. */
export const MAX_WEBHOOK_URL_LENGTH = 2000;

export function checkWebhookUrlSyntax(raw: string): { ok: true; url: URL } | { ok: false; reason: string } {
  if (raw.length > MAX_WEBHOOK_URL_LENGTH) return { ok: false, reason: `At most ${MAX_WEBHOOK_URL_LENGTH} characters.` };
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    return { ok: false, reason: "Enter a full address, e.g. https://erp.example.com/hooks/faradsmith." };
  }
  if (url.protocol !== "https:" && url.protocol !== "http:") return { ok: false, reason: "Only http:// and https:// addresses." };
  if (url.username || url.password) return { ok: false, reason: "No user name or password in the address: the signature proves who is calling." };
  if (!url.hostname) return { ok: false, reason: "The address has no host." };
  return { ok: true, url };
}
