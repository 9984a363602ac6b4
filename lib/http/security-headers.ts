/**
 * The browser-facing security policy, in one place. Pages get a Content-Security-Policy with a
 * fresh script nonce per request (proxy.ts); every response, pages and JSON alike, gets the
 * static headers below (next.config.ts). Pure: no environment read here, the caller says.
 */

/** Static headers for every response. */
export const SECURITY_HEADERS: readonly { key: string; value: string }[] = [
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  // nothing here uses the camera, microphone, location, payment sheets or USB
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(), payment=(), usb=(), interest-cohort=()" },
  // for browsers without CSP frame-ancestors
  { key: "X-Frame-Options", value: "DENY" },
];

/** JSON and file answers render nothing: a policy that lets them load nothing and sit in no frame. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'";

/**
 * The policy for pages. Scripts run only with this request's nonce (Next.js puts it on its own
 * scripts, read from this header on the request) or when loaded by such a script
 * ('strict-dynamic'). Style elements need the nonce too; style attributes stay allowed, as the
 * charts and React set them (style-src-attr only, so injected <style> elements are still refused).
 */
export function contentSecurityPolicy(nonce: string, { development = false, https = false } = {}): string {
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${development ? " 'unsafe-eval'" : ""}`,
    `style-src 'self' 'nonce-${nonce}'`,
    "style-src-attr 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    "connect-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

/** A fresh nonce: 128 random bits, base64. */
export function createNonce(): string {
  const bytes = new Uint8Array(16);
  crypto.getRandomValues(bytes);
  return btoa(String.fromCharCode(...bytes));
}

/** Whether a URL (path and query, as sent) carries a NUL byte, raw or percent-encoded. */
export function urlHasNulByte(url: string): boolean {
  return url.includes("\u0000") || /%00/i.test(url);
}
