import { toNextJsHandler } from "better-auth/next-js";
import { HTTP_AUTH_PATHS } from "@/lib/auth/plugin-rules";
import { auth, CLIENT_ADDRESS_HEADER } from "@/lib/auth/server";
import { env } from "@/lib/env";
import { clientAddress } from "@/lib/http/client-address";
import { jsonError } from "@/lib/http/json-error";
import { crossOriginRefusal } from "@/lib/http/origin";

const handlers = toNextJsHandler(auth);
const BASE_PATH = "/api/auth";

/**
 * better-auth's endpoints, as the browser may reach them. Before better-auth sees a request:
 * - only the paths the app uses exist (lib/auth/plugin-rules.ts HTTP_AUTH_PATHS); every other one
 *   is a 404 here, before any counting or database work (the plugin's hooks refuse them too);
 * - a write sent by a page of another site is refused (403), as for our other route handlers;
 * - better-auth's rate limits key on one header set here from the client address as the network
 *   reports it (lib/http/client-address.ts), replacing whatever the client sent; an address that
 *   cannot be trusted leaves it unset, and better-auth counts one shared bucket.
 */
async function guarded(request: Request, handle: (r: Request) => Promise<Response>): Promise<Response> {
  const path = new URL(request.url).pathname;
  if (!path.startsWith(`${BASE_PATH}/`) || !HTTP_AUTH_PATHS.has(path.slice(BASE_PATH.length))) return jsonError(404, "Not found.");
  const crossOrigin = crossOriginRefusal(request, env.APP_ORIGINS);
  if (crossOrigin) return crossOrigin;
  const headers = new Headers(request.headers);
  headers.delete(CLIENT_ADDRESS_HEADER);
  const address = clientAddress(request.headers, { trustedProxies: env.TRUSTED_PROXIES, peerAppended: env.PEER_ADDRESS_APPENDED });
  if (address) headers.set(CLIENT_ADDRESS_HEADER, address);
  return handle(new Request(request, { headers }));
}

export const GET = (request: Request) => guarded(request, handlers.GET);
export const POST = (request: Request) => guarded(request, handlers.POST);
