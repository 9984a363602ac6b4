"use client";

/**
 * In the browser, zod probes `new Function("")` to see whether it may compile fast parsers, and it
 * does so as each object schema is built (at module load); under the Content-Security-Policy (no
 * 'unsafe-eval', proxy.ts) that probe is a policy violation. zod keeps its settings on `globalThis`
 * (`__zod_globalConfig`), so they can be set here, before any schema module loads, without this
 * module loading zod: pages without a form download none of it. The server keeps the fast parsers.
 */
export function preferPlainZodParsers(): void {
  const g = globalThis as { __zod_globalConfig?: Record<string, unknown> };
  g.__zod_globalConfig = Object.assign(g.__zod_globalConfig ?? {}, { jitless: true });
}

if (typeof window !== "undefined") preferPlainZodParsers();

/** Rendered once in the root layout so the setting above runs before any schema module loads. */
export function BrowserZod() {
  return null;
}
