/** The webhook settings a server reads from its environment: production refuses loopback and the development key. */
import { afterEach, describe, expect, it, vi } from "vitest";

const SECRET = "a-production-session-secret-of-forty-characters";
const KEY = "a-production-webhook-key-of-at-least-32-chars";

async function envWith(vars: Record<string, string | undefined>) {
  vi.resetModules();
  for (const [k, v] of Object.entries(vars)) vi.stubEnv(k, v);
  return (await import("@/lib/env")).env;
}

afterEach(() => {
  vi.unstubAllEnvs();
  vi.resetModules();
});

describe("webhook environment", () => {
  it("refuses loopback in production unless told, and allows it in development and tests", async () => {
    expect(
      (await envWith({ NODE_ENV: "production", BETTER_AUTH_SECRET: SECRET, WEBHOOK_SECRET_KEY: KEY, WEBHOOK_ALLOW_LOOPBACK: undefined }))
        .WEBHOOK_ALLOW_LOOPBACK,
    ).toBe(false);
    expect(
      (await envWith({ NODE_ENV: "production", BETTER_AUTH_SECRET: SECRET, WEBHOOK_SECRET_KEY: KEY, WEBHOOK_ALLOW_LOOPBACK: "true" })).WEBHOOK_ALLOW_LOOPBACK,
    ).toBe(true);
    expect((await envWith({ NODE_ENV: "development", WEBHOOK_ALLOW_LOOPBACK: undefined })).WEBHOOK_ALLOW_LOOPBACK).toBe(true);
    expect((await envWith({ NODE_ENV: "development", WEBHOOK_ALLOW_LOOPBACK: "false" })).WEBHOOK_ALLOW_LOOPBACK).toBe(false);
  });

  it("a production server refuses the built-in development key for signing secrets", async () => {
    await expect(envWith({ NODE_ENV: "production", BETTER_AUTH_SECRET: SECRET, WEBHOOK_SECRET_KEY: undefined })).rejects.toThrow(/WEBHOOK_SECRET_KEY/);
    await expect(envWith({ NODE_ENV: "development", WEBHOOK_SECRET_KEY: "too short" })).rejects.toThrow(/WEBHOOK_SECRET_KEY/);
  });
});
