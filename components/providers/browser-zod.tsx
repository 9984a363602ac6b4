"use client";
import { z } from "zod";

// In the browser, zod first tries `new Function("")` to see whether it may compile fast parsers;
// under the Content-Security-Policy (no 'unsafe-eval', proxy.ts) that try is a policy violation.
// Telling zod up front to use its plain parsers avoids the try. The server keeps the fast ones.
if (typeof window !== "undefined") z.config({ jitless: true });

/** Rendered once in the root layout so the setting above runs before any form validates. */
export function BrowserZod() {
  return null;
}
