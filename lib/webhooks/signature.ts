import { createHmac } from "node:crypto";

/**
 * How an outbound webhook is signed: HMAC-SHA256 with the endpoint's own secret over
 * `<timestamp>.<body>`, the timestamp being the Unix time in seconds of this attempt. A receiver
 * recomputes it over the raw body it got, compares in constant time, refuses old timestamps
 * (replays) and dedupes on the event id. `VERIFY_SNIPPET` is what the reference page shows; the
 * integration tests verify every delivery with that very text.
 */
export const WEBHOOK_HEADERS = {
  eventId: "faradsmith-event-id",
  eventType: "faradsmith-event-type",
  deliveryId: "faradsmith-delivery-id",
  timestamp: "faradsmith-timestamp",
  signature: "faradsmith-signature",
} as const;

/** The signature header's value: `v1=` and the lowercase hex HMAC-SHA256 of `<timestamp>.<body>`. */
export function signWebhook(secret: string, timestamp: number, body: string): string {
  return `v1=${createHmac("sha256", secret).update(`${timestamp}.${body}`).digest("hex")}`;
}

/** A receiver's check, in Node.js (no dependencies), as the reference page prints it. */
export const VERIFY_SNIPPET = `import { createHmac, timingSafeEqual } from "node:crypto";

/**
 * True when a Faradsmith webhook is genuine and recent. rawBody: the request body exactly as
 * received (a string or Buffer, before any JSON parsing); headers: the request's headers with
 * lowercase names; secret: the endpoint's signing secret.
 */
export function verifyFaradsmithWebhook(rawBody, headers, secret, toleranceSeconds = 300) {
  const timestamp = String(headers["${WEBHOOK_HEADERS.timestamp}"] ?? "");
  const signature = String(headers["${WEBHOOK_HEADERS.signature}"] ?? "");
  if (!/^\\d+$/.test(timestamp)) return false;
  if (Math.abs(Date.now() / 1000 - Number(timestamp)) > toleranceSeconds) return false;
  const expected = createHmac("sha256", secret).update(timestamp + "." + rawBody).digest("hex");
  const given = signature.startsWith("v1=") ? signature.slice(3) : "";
  return given.length === expected.length && timingSafeEqual(Buffer.from(given), Buffer.from(expected));
}
`;
