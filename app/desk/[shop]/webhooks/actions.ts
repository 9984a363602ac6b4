"use server";
import { revalidatePath } from "next/cache";
import { changedFields, recordAudit } from "@/db/queries/audit";
import {
  cancelPendingDeliveries,
  countWebhookEndpoints,
  deleteWebhookEndpoint as deleteEndpointRow,
  getWebhookDelivery,
  getWebhookEndpoint,
  insertReplay,
  insertWebhookEndpoint,
  updateWebhookEndpoint as updateEndpointRow,
} from "@/db/queries/webhooks";
import { withShop } from "@/db/tx";
import { shopAction, type ActionResult } from "@/lib/auth/guards";
import { checkWebhookUrl } from "@/lib/webhooks/address-policy";
import { webhookSettings } from "@/lib/webhooks/config";
import { encryptSecret, newSigningSecret, secretHint } from "@/lib/webhooks/secrets";
import { dispatchWebhooks } from "@/lib/webhooks/worker";
import {
  MAX_WEBHOOK_ENDPOINTS,
  replayWebhookDeliverySchema,
  setWebhookEndpointStateSchema,
  updateWebhookEndpointSchema,
  webhookEndpointIdSchema,
  webhookEndpointSchema,
} from "@/lib/validation/webhooks";

const NOT_FOUND = { ok: false, code: "not-found", message: "No such endpoint in this shop." } as const;

/** The address may be called (scheme, and every address its host resolves to); otherwise the field's message. */
async function refusedUrl(url: string): Promise<ActionResult<never> | null> {
  const s = webhookSettings();
  const r = await checkWebhookUrl(url, s, s.resolve);
  return r.ok ? null : { ok: false, code: "invalid", message: "Please correct the marked fields.", fieldErrors: { url: [r.reason] } };
}

function revalidate(slug: string, id?: string) {
  revalidatePath(`/desk/${slug}/webhooks`);
  if (id) revalidatePath(`/desk/${slug}/webhooks/${id}`);
}

/** A manager registers an endpoint; its signing secret is in the answer, once, and never shown again. */
export const createWebhookEndpoint = shopAction(webhookEndpointSchema, "webhook:manage", async (ctx, input) => {
  const refused = await refusedUrl(input.url);
  if (refused) return refused;
  const secret = newSigningSecret();
  const created = await withShop(ctx.shop.id, async (tx) => {
    if ((await countWebhookEndpoints(tx, ctx.shop.id)) >= MAX_WEBHOOK_ENDPOINTS) return null;
    const row = await insertWebhookEndpoint(tx, ctx.shop.id, {
      url: input.url,
      description: input.description,
      events: input.events,
      secretCiphertext: encryptSecret(secret),
      secretHint: secretHint(secret),
      createdByUserId: ctx.user.id,
    });
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "webhook-endpoint.create",
      subjectType: "webhook-endpoint",
      subjectId: row.id,
      summary: `Added webhook endpoint ${row.url} for ${row.events.join(", ")}`,
    });
    return row;
  });
  if (!created) return { ok: false, code: "conflict", message: `A shop may have at most ${MAX_WEBHOOK_ENDPOINTS} endpoints; delete one first.` };
  revalidate(ctx.shop.slug);
  return { ok: true, data: { id: created.id, secret } };
});

/** A manager changes an endpoint's address, note or events (a new address is checked like a new endpoint's). */
export const updateWebhookEndpoint = shopAction(updateWebhookEndpointSchema, "webhook:manage", async (ctx, input) => {
  const before = await getWebhookEndpoint(ctx.shop.id, input.id);
  if (!before) return NOT_FOUND;
  if (input.url !== before.url) {
    const refused = await refusedUrl(input.url);
    if (refused) return refused;
  }
  const patch = { url: input.url, description: input.description, events: input.events };
  const row = await withShop(ctx.shop.id, async (tx) => {
    const updated = await updateEndpointRow(tx, ctx.shop.id, input.id, patch);
    const changes = changedFields({ url: before.url, description: before.description, events: before.events }, patch);
    if (updated && changes) {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: "webhook-endpoint.update",
        subjectType: "webhook-endpoint",
        subjectId: input.id,
        summary: `Changed webhook endpoint ${updated.url} (${Object.keys(changes).join(", ")})`,
        changes,
      });
    }
    return updated;
  });
  if (!row) return NOT_FOUND;
  revalidate(ctx.shop.slug, input.id);
  return { ok: true, data: { id: row.id } };
});

/** A new signing secret for an endpoint, in the answer once; the old one stops working at once. */
export const rollWebhookSecret = shopAction(webhookEndpointIdSchema, "webhook:manage", async (ctx, { id }) => {
  const secret = newSigningSecret();
  const row = await withShop(ctx.shop.id, async (tx) => {
    const updated = await updateEndpointRow(tx, ctx.shop.id, id, { secretCiphertext: encryptSecret(secret), secretHint: secretHint(secret) });
    if (updated) {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: "webhook-endpoint.roll-secret",
        subjectType: "webhook-endpoint",
        subjectId: id,
        summary: `New signing secret for webhook endpoint ${updated.url}`,
      });
    }
    return updated;
  });
  if (!row) return NOT_FOUND;
  revalidate(ctx.shop.slug, id);
  return { ok: true, data: { id, secret } };
});

/** Stops or starts an endpoint. Stopping marks what was still to be sent as not sent; starting clears the failure mark. */
export const setWebhookEndpointState = shopAction(setWebhookEndpointStateSchema, "webhook:manage", async (ctx, { id, state }) => {
  const row = await withShop(ctx.shop.id, async (tx) => {
    const before = await getWebhookEndpoint(ctx.shop.id, id, tx);
    if (!before) return null;
    const updated =
      state === "active"
        ? await updateEndpointRow(tx, ctx.shop.id, id, { state, failingSince: null, disabledAt: null, disabledReason: null })
        : await updateEndpointRow(tx, ctx.shop.id, id, { state, disabledAt: new Date(), disabledReason: "Stopped by a manager." });
    if (state === "disabled") await cancelPendingDeliveries(tx, ctx.shop.id, id);
    if (before.state !== state) {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: state === "active" ? "webhook-endpoint.start" : "webhook-endpoint.stop",
        subjectType: "webhook-endpoint",
        subjectId: id,
        summary: `${state === "active" ? "Started" : "Stopped"} webhook endpoint ${before.url}`,
        changes: { state: { from: before.state, to: state } },
      });
    }
    return updated;
  });
  if (!row) return NOT_FOUND;
  revalidate(ctx.shop.slug, id);
  return { ok: true, data: { id, state: row.state } };
});

/** Deletes an endpoint with its delivery log; nothing more is sent to it. */
export const deleteWebhookEndpoint = shopAction(webhookEndpointIdSchema, "webhook:manage", async (ctx, { id }) => {
  const row = await withShop(ctx.shop.id, async (tx) => {
    const deleted = await deleteEndpointRow(tx, ctx.shop.id, id);
    if (deleted) {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: "webhook-endpoint.delete",
        subjectType: "webhook-endpoint",
        subjectId: id,
        summary: `Deleted webhook endpoint ${deleted.url}`,
      });
    }
    return deleted;
  });
  if (!row) return NOT_FOUND;
  revalidate(ctx.shop.slug, id);
  return { ok: true, data: { id } };
});

/** Sends a delivered (or given-up) event to its endpoint once more, with the same event id, as a delivery of its own. */
export const replayWebhookDelivery = shopAction(replayWebhookDeliverySchema, "webhook:manage", async (ctx, { deliveryId }) => {
  const replay = await withShop(ctx.shop.id, async (tx) => {
    const d = await getWebhookDelivery(tx, ctx.shop.id, deliveryId);
    if (!d) return null;
    const endpoint = await getWebhookEndpoint(ctx.shop.id, d.endpointId, tx);
    if (!endpoint) return null;
    if (endpoint.state !== "active") return "stopped" as const;
    const id = await insertReplay(tx, ctx.shop.id, d);
    await recordAudit(tx, ctx.shop.id, {
      actorUserId: ctx.user.id,
      action: "webhook-delivery.replay",
      subjectType: "webhook-endpoint",
      subjectId: d.endpointId,
      summary: `Sent event ${d.eventType} (${d.eventId}) to ${endpoint.url} again`,
    });
    return { id, endpointId: d.endpointId };
  });
  if (!replay) return { ok: false, code: "not-found", message: "No such delivery in this shop." };
  if (replay === "stopped") return { ok: false, code: "conflict", message: "The endpoint is stopped: start it first." };
  await dispatchWebhooks().catch(() => undefined);
  revalidate(ctx.shop.slug, replay.endpointId);
  return { ok: true, data: { id: replay.id } };
});
