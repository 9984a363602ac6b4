import { jsonError } from "./json-error";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * Cross-site request forgery guard for state-changing route handlers, as Next.js guards server
 * actions: a browser names the page that sent a request in `Origin` (and `Sec-Fetch-Site`); a
 * write from any other site is refused with 403 JSON before anything is read or written.
 * Requests without either header come from programs, not browsers, and carry no victim's
 * cookies by accident, so they pass (and still need their own session). `allowedOrigins` are
 * origins like "https://shop.example".
 */
export function crossOriginRefusal(request: Request, allowedOrigins: readonly string[]): Response | null {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return null;
  const origin = request.headers.get("origin");
  const refuse = () => jsonError(403, "This request came from another site and was refused.", [{ path: "", message: "Cross-origin request" }]);
  if (origin !== null) {
    let normalized: string;
    try {
      normalized = new URL(origin).origin;
    } catch {
      return refuse(); // "null" (sandboxed frames, privacy redirects) or not an origin at all
    }
    return allowedOrigins.includes(normalized) && normalized === origin.replace(/\/$/, "").toLowerCase() ? null : refuse();
  }
  const site = request.headers.get("sec-fetch-site");
  if (site !== null && site !== "same-origin" && site !== "none") return refuse();
  return null;
}
