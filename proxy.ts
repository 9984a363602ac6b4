import { NextResponse, type NextRequest } from "next/server";
import { env } from "@/lib/env";
import { crossOriginRefusal } from "@/lib/http/origin";
import { API_CONTENT_SECURITY_POLICY, contentSecurityPolicy, createNonce, urlHasNulByte } from "@/lib/http/security-headers";
import { serverActionBodyProblem } from "@/lib/http/server-action-body";

const plain = (status: number, message: string) => new NextResponse(message, { status, headers: { "content-type": "text/plain; charset=utf-8" } });

/**
 * Runs before every route: refuses a NUL byte anywhere in the path or query (PostgreSQL refuses
 * 0x00 in text, so it could only ever end in an error deeper down); refuses a server-action call
 * from another site (403) or with a body Next.js could not decode (400) instead of letting it end
 * in a 500; and gives every page a Content-Security-Policy with a nonce of its own (Next.js reads
 * it from the request header and puts it on its scripts), and tells the pages which path was asked
 * for (`x-request-path`). Static security headers for all
 * responses are in next.config.ts.
 */
export async function proxy(request: NextRequest) {
  const api = request.nextUrl.pathname.startsWith("/api/");
  if (urlHasNulByte(request.url)) {
    const message = "The address contains a NUL byte.";
    return api ? NextResponse.json({ error: message, issues: [{ path: "", message: "NUL byte in the URL" }] }, { status: 400 }) : plain(400, message);
  }
  if (request.method === "POST" && request.headers.has("next-action")) {
    if (crossOriginRefusal(request, env.APP_ORIGINS)) return plain(403, "This request came from another site and was refused.");
    const problem = await serverActionBodyProblem(request.clone());
    if (problem) return plain(400, problem);
  }
  if (api) {
    const response = NextResponse.next();
    response.headers.set("Content-Security-Policy", API_CONTENT_SECURITY_POLICY);
    return response;
  }
  const nonce = createNonce();
  const policy = contentSecurityPolicy(nonce, {
    development: process.env.NODE_ENV === "development",
    https: request.nextUrl.protocol === "https:",
  });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  // the path asked for, so a layout that sends a signed-out visitor to sign in can bring them back to it
  requestHeaders.set("x-request-path", request.nextUrl.pathname + request.nextUrl.search);
  requestHeaders.set("Content-Security-Policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", policy);
  return response;
}

export const config = {
  // everything but the build's static files (their bytes cannot carry a script of ours)
  matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"],
};
