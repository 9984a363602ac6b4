import { z } from "zod";
import { checkWebhookUrlSyntax, MAX_WEBHOOK_URL_LENGTH } from "../webhooks/url-syntax";
import { SHOP_EVENT_TYPES } from "../vocabulary";
import { text } from "./text";

/** Most endpoints one shop may register. */
export const MAX_WEBHOOK_ENDPOINTS = 10;
/** Longest note on an endpoint. */
export const MAX_WEBHOOK_DESCRIPTION_LENGTH = 200;

/** An endpoint as the manager enters it (the desk's form and the server actions). */
export const webhookEndpointSchema = z.object({
  url: text()
    .trim()
    .min(1, "Enter the address your system listens on.")
    .max(MAX_WEBHOOK_URL_LENGTH, `At most ${MAX_WEBHOOK_URL_LENGTH} characters.`)
    .superRefine((value, ctx) => {
      const r = checkWebhookUrlSyntax(value);
      if (!r.ok) ctx.addIssue({ code: "custom", message: r.reason });
    }),
  description: text().trim().max(MAX_WEBHOOK_DESCRIPTION_LENGTH, `At most ${MAX_WEBHOOK_DESCRIPTION_LENGTH} characters.`),
  events: z
    .array(z.enum(SHOP_EVENT_TYPES))
    .min(1, "Choose at least one event.")
    .max(SHOP_EVENT_TYPES.length)
    .refine((events) => new Set(events).size === events.length, "Each event once."),
});
export type WebhookEndpointInput = z.infer<typeof webhookEndpointSchema>;

export const webhookEndpointIdSchema = z.object({ id: z.uuid() });
export const updateWebhookEndpointSchema = webhookEndpointSchema.extend({ id: z.uuid() });
export const setWebhookEndpointStateSchema = z.object({ id: z.uuid(), state: z.enum(["active", "disabled"]) });
export const replayWebhookDeliverySchema = z.object({ deliveryId: z.uuid() });

/** What a receiver gets in the body of every delivery (lib/webhooks/deliver.ts webhookBody). */
export const webhookEventSchema = z
  .object({
    id: z.uuid().meta({ description: "the event's stable id: the same on every attempt and replay; dedupe on it" }),
    type: z.enum(SHOP_EVENT_TYPES),
    createdAt: z.iso.datetime({ offset: true }).meta({ description: "when it happened" }),
    shop: z.string().meta({ description: "the shop's address name", example: "kestrel-bank-works" }),
    data: z
      .record(z.string(), z.unknown())
      .meta({ description: "what the event is about (quote number and revision, order number and status, amounts as decimal strings)" }),
  })
  .meta({ id: "WebhookEvent" });
