import { describe, expect, it } from "vitest";
import { preferPlainZodParsers } from "@/components/providers/browser-zod";

// The root layout sets zod's settings without importing zod (so pages without a form load none of
// it). That relies on zod keeping its settings on globalThis (zod 4's core/core.js,
// `globalThis.__zod_globalConfig`): this fails if a zod upgrade moves them.
describe("BrowserZod", () => {
  it("turns zod's compiled parsers off through zod's own settings, whether zod loads before or after", async () => {
    preferPlainZodParsers();
    const { z } = await import("zod");
    expect(z.config().jitless).toBe(true);
    // an object schema built now parses without the compiled fast path, and still parses
    expect(z.object({ a: z.number() }).parse({ a: 1 })).toEqual({ a: 1 });
  });
});
