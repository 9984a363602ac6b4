import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { getShopIdentity } from "@/db/queries/shops";
import {
  cancelPendingDeliveries,
  listManagerContacts,
  lockDueDelivery,
  markEndpointHealth,
  recordDeliveryAttempt,
  updateWebhookEndpoint,
} from "@/db/queries/webhooks";
import { withShop, type Tx } from "@/db/tx";
import { dispatchOutbox } from "@/lib/mail/outbox";
import type { WebhookDeliveryState } from "@/lib/vocabulary";
import { retryDelayMs, webhookSettings } from "./config";
import { decryptSecret } from "./secrets";
import { postWebhook, type AttemptResult } from "./send";
import { signWebhook, WEBHOOK_HEADERS } from "./signature";
import { enqueueWebhookStopped } from "./stopped-notice";

/** What a receiver gets: the event with its stable id (the one to dedupe on) and the shop's data about it. */
export function webhookBody(e: { eventId: string; eventType: string; eventCreatedAt: Date; shopSlug: string; payload: Record<string, unknown> }): string {
  return JSON.stringify({ id: e.eventId, type: e.eventType, createdAt: e.eventCreatedAt.toISOString(), shop: e.shopSlug, data: e.payload });
}

/** Stops an endpoint that has failed for too long: no more attempts, an audit entry, an e-mail to each manager. */
async function stopFailingEndpoint(tx: Tx, shopId: string, endpointId: string, failingSince: Date, lastError: string) {
  const stoppedAt = new Date();
  const days = Math.max(1, Math.round((stoppedAt.getTime() - failingSince.getTime()) / 86_400_000));
  const reason = `Every attempt has failed since ${failingSince.toISOString().slice(0, 16).replace("T", " ")} UTC; last: ${lastError}`;
  const endpoint = await updateWebhookEndpoint(tx, shopId, endpointId, { state: "disabled", disabledAt: stoppedAt, disabledReason: reason });
  await cancelPendingDeliveries(tx, shopId, endpointId);
  await recordAudit(tx, shopId, {
    actorUserId: null,
    action: "webhook-endpoint.stop",
    subjectType: "webhook-endpoint",
    subjectId: endpointId,
    summary: `Stopped sending to ${endpoint?.url ?? "an endpoint"} after ${days} day${days === 1 ? "" : "s"} of failed deliveries`,
    changes: { state: { from: "active", to: "disabled" } },
  });
  const shop = await getShopIdentity(shopId);
  await enqueueWebhookStopped(tx, shopId, shop?.name ?? "your shop", endpointId, stoppedAt, await listManagerContacts(tx, shopId));
}

/**
 * One attempt of one delivery, at least once: the row is locked while the receiver is called (a
 * second worker skips it), the event is sent signed with the endpoint's secret, and the outcome is
 * recorded with the next attempt's time (exponential back-off) or the end of the delivery. A crash
 * after the receiver's answer and before the commit leaves the delivery due, so it is sent again
 * with the same event id: receivers dedupe on it. Answers the delivery's state after the attempt,
 * or "skipped" when it was not due or another worker held it.
 */
export async function attemptDelivery(shopId: string, deliveryId: string): Promise<WebhookDeliveryState | "skipped"> {
  const s = webhookSettings();
  let stopped = false;
  const outcome = await withShop(shopId, async (tx) => {
    const d = await lockDueDelivery(tx, shopId, deliveryId);
    if (!d) return "skipped" as const;
    if (d.endpointState !== "active") {
      await recordDeliveryAttempt(tx, shopId, d.id, {
        state: "cancelled",
        attempts: d.attempts,
        statusCode: null,
        durationMs: 0,
        error: "The endpoint is stopped.",
        response: null,
        nextAttemptAt: null,
      });
      return "cancelled" as const;
    }
    const body = webhookBody({ ...d, payload: d.payload });
    const secret = decryptSecret(d.secretCiphertext);
    let result: AttemptResult;
    if (secret === null) {
      result = {
        delivered: false,
        status: null,
        durationMs: 0,
        error: "The signing secret cannot be read (WEBHOOK_SECRET_KEY changed): roll the endpoint's secret.",
        response: null,
      };
    } else {
      const timestamp = Math.floor(Date.now() / 1000);
      result = await postWebhook({
        url: d.url,
        body,
        headers: {
          "content-type": "application/json",
          "user-agent": "Faradsmith-Webhooks/1",
          [WEBHOOK_HEADERS.eventId]: d.eventId,
          [WEBHOOK_HEADERS.eventType]: d.eventType,
          [WEBHOOK_HEADERS.deliveryId]: d.id,
          [WEBHOOK_HEADERS.timestamp]: String(timestamp),
          [WEBHOOK_HEADERS.signature]: signWebhook(secret, timestamp, body),
        },
        policy: s,
        timeoutMs: s.timeoutMs,
        maxResponseBytes: s.maxResponseBytes,
        resolve: s.resolve,
      });
    }
    const attempts = d.attempts + 1;
    const state: WebhookDeliveryState = result.delivered ? "delivered" : attempts >= s.maxAttempts ? "failed" : "retrying";
    await recordDeliveryAttempt(tx, shopId, d.id, {
      state,
      attempts,
      statusCode: result.status,
      durationMs: result.durationMs,
      error: result.error,
      response: result.response,
      nextAttemptAt: state === "retrying" ? new Date(Date.now() + retryDelayMs(attempts, s)) : null,
    });
    const failingSince = await markEndpointHealth(tx, shopId, d.endpointId, result.delivered);
    if (!result.delivered && failingSince && Date.now() - failingSince.getTime() >= s.disableAfterMs) {
      await stopFailingEndpoint(tx, shopId, d.endpointId, failingSince, result.error ?? "no answer");
      stopped = true;
    }
    return state;
  });
  if (stopped) await dispatchOutbox();
  return outcome;
}
