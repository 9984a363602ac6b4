import "server-only";
import { render } from "@react-email/render";
import { createElement } from "react";
import { getShopIdentity } from "@/db/queries/shops";
import { insertOutboxMessage } from "@/db/queries/outbox";
import { getWebhookEndpoint } from "@/db/queries/webhooks";
import type { EmailOutboxRow } from "@/db/schema";
import type { Tx } from "@/db/tx";
import { WebhookStoppedEmail, webhookStoppedSubject } from "@/emails/webhook-stopped";
import { mailSettings } from "@/lib/mail/config";
import { outboxMessageId } from "@/lib/mail/format";
import type { OutgoingMessage } from "@/lib/mail/transport";

export const WEBHOOK_STOPPED_KIND = "webhook-stopped";

// The outbox row names what it announces in its dedupe key: webhook-stopped:<endpoint id>:<stopped at, ms>:<address>.
const keyOf = (endpointId: string, stoppedAt: Date, email: string) => `${WEBHOOK_STOPPED_KIND}:${endpointId}:${stoppedAt.getTime()}:${email}`;
function parseKey(key: string): { endpointId: string; stoppedAt: Date } | null {
  const m = /^webhook-stopped:([0-9a-f-]{36}):(\d+):/.exec(key);
  return m ? { endpointId: m[1] as string, stoppedAt: new Date(Number(m[2])) } : null;
}

const when = (d: Date) =>
  new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "long", year: "numeric", hour: "2-digit", minute: "2-digit", timeZone: "UTC" }).format(d) + " UTC";

/** One "endpoint stopped" message per manager, in the transaction that stops the endpoint. */
export async function enqueueWebhookStopped(
  tx: Tx,
  shopId: string,
  shopName: string,
  endpointId: string,
  stoppedAt: Date,
  managers: { email: string }[],
): Promise<void> {
  for (const m of managers) {
    await insertOutboxMessage(tx, shopId, {
      kind: WEBHOOK_STOPPED_KIND,
      dedupeKey: keyOf(endpointId, stoppedAt, m.email),
      toEmail: m.email,
      subject: webhookStoppedSubject({ shopName }),
      quoteRevisionId: null,
    });
  }
}

/** The message a "webhook-stopped" outbox row stands for, from the endpoint as it is now. */
export async function buildWebhookStoppedMessage(row: EmailOutboxRow): Promise<OutgoingMessage> {
  const key = parseKey(row.dedupeKey);
  const shop = await getShopIdentity(row.shopId);
  if (!key || !shop) throw new Error("the endpoint of this message no longer exists");
  const endpoint = await getWebhookEndpoint(row.shopId, key.endpointId);
  if (!endpoint) throw new Error("the endpoint of this message was deleted");
  const settings = mailSettings();
  const endpointUrl = `${settings.appUrl.replace(/\/+$/, "")}/desk/${shop.slug}/webhooks/${endpoint.id}`;
  const email = createElement(WebhookStoppedEmail, {
    shopName: shop.name,
    url: endpoint.url,
    failingSince: endpoint.failingSince ? when(endpoint.failingSince) : "several days",
    stoppedAt: when(key.stoppedAt),
    lastError: endpoint.disabledReason ?? "no answer",
    endpointUrl,
  });
  const [html, text] = await Promise.all([render(email), render(email, { plainText: true })]);
  return { to: row.toEmail, subject: row.subject, html, text, messageId: outboxMessageId(row.id, settings.from) };
}
