/**
 * Signing and the secrets behind it. The signature is checked against OpenSSL's own HMAC
 * (`openssl dgst -sha256 -hmac`, Debian's openssl), an implementation that is not ours; the
 * published verification snippet is run as printed.
 */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { pathToFileURL } from "node:url";
import { describe, expect, it } from "vitest";
import { retryDelayMs } from "@/lib/webhooks/config";
import { decryptSecret, encryptSecret, newSigningSecret, secretHint } from "@/lib/webhooks/secrets";
import { signWebhook, VERIFY_SNIPPET, WEBHOOK_HEADERS } from "@/lib/webhooks/signature";

const opensslHmac = (key: string, data: string) =>
  execFileSync("openssl", ["dgst", "-sha256", "-hmac", key], { input: data }).toString().trim().replace(/^.*= /, "");

async function publishedVerifier() {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-verify-")), "verify.mjs");
  fs.writeFileSync(file, VERIFY_SNIPPET);
  return (await import(pathToFileURL(file).href)).verifyFaradsmithWebhook as (b: string, h: Record<string, string>, s: string, t?: number) => boolean;
}

describe("webhook signatures", () => {
  const secret = "fsw_Zm9yIHRlc3RzIG9ubHksIGludmVudGVk";
  const body = JSON.stringify({
    id: "6f1c2b7e-9a54-4c1e-8f0d-2b3a4c5d6e7f",
    type: "quote.accepted",
    data: { quoteNumber: "Q-2026-0042", note: "Ωμ — ünïcode" },
  });

  it("is v1= and the HMAC-SHA256 of <timestamp>.<body>, as OpenSSL computes it", () => {
    const timestamp = 1_786_000_000;
    expect(signWebhook(secret, timestamp, body)).toBe(`v1=${opensslHmac(secret, `${timestamp}.${body}`)}`);
  });

  it("the published snippet accepts a fresh, genuine delivery and refuses a changed body, another secret, an old or a future timestamp", async () => {
    const verify = await publishedVerifier();
    const now = Math.floor(Date.now() / 1000);
    const headers = (t: number, b = body, s = secret) => ({ [WEBHOOK_HEADERS.timestamp]: String(t), [WEBHOOK_HEADERS.signature]: signWebhook(s, t, b) });
    expect(verify(body, headers(now), secret)).toBe(true);
    expect(verify(`${body} `, headers(now), secret)).toBe(false);
    expect(verify(body, headers(now, body, "fsw_another"), secret)).toBe(false);
    expect(verify(body, headers(now - 301), secret)).toBe(false);
    expect(verify(body, headers(now + 301), secret)).toBe(false);
    expect(verify(body, { ...headers(now), [WEBHOOK_HEADERS.signature]: "v1=00" }, secret)).toBe(false);
    expect(verify(body, { [WEBHOOK_HEADERS.signature]: headers(now)[WEBHOOK_HEADERS.signature] as string }, secret)).toBe(false);
  });
});

describe("signing secrets at rest", () => {
  it("are 256 random bits, never stored in clear, readable only with the key they were stored under", () => {
    const a = newSigningSecret();
    const b = newSigningSecret();
    expect(a).toMatch(/^fsw_[A-Za-z0-9_-]{43}$/);
    expect(a).not.toBe(b);
    const stored = encryptSecret(a, "key material one, at least thirty-two characters");
    expect(stored).not.toContain(a.slice(4));
    expect(encryptSecret(a, "key material one, at least thirty-two characters")).not.toBe(stored); // a fresh IV each time
    expect(decryptSecret(stored, "key material one, at least thirty-two characters")).toBe(a);
    expect(decryptSecret(stored, "key material two, at least thirty-two characters")).toBeNull();
    const [v, iv, tag, ct] = stored.split(".");
    const flipped = `${ct?.[0] === "A" ? "B" : "A"}${ct?.slice(1)}`;
    expect(decryptSecret([v, iv, tag, flipped].join("."), "key material one, at least thirty-two characters")).toBeNull();
    expect(secretHint(a)).toBe(`…${a.slice(-4)}`);
  });
});

describe("retry schedule", () => {
  const s = { retryBaseMs: 30_000, retryMaxMs: 6 * 3_600_000 };
  it("doubles from 30 s to a 6 h cap, with at most 10 % jitter", () => {
    const waits = Array.from({ length: 19 }, (_, i) => retryDelayMs(i + 1, s, () => 0));
    expect(waits.slice(0, 4)).toEqual([30_000, 60_000, 120_000, 240_000]);
    expect(waits.at(-1)).toBe(6 * 3_600_000);
    expect(retryDelayMs(3, s, () => 1)).toBe(132_000);
    // 20 attempts reach beyond two and a half days, so a receiver down over a weekend misses nothing
    expect(waits.reduce((a, b) => a + b, 0) / 3_600_000).toBeGreaterThan(60);
  });
});
