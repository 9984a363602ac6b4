// A small HTTP client for the bench and the multi-server test: sign in as a demo person, search a
// shop's arrangements, and call a server action over HTTP as the browser does (POST to the page
// with a `Next-Action` header naming the action's id from the build's server-reference manifest,
// the arguments as a JSON array; the answer is a React Server Components stream whose row "1" is
// the action's result). Requests may come from a chosen loopback address (127.x.y.z).
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";

/** The server actions of a build: exported name → action id. */
export function serverActionIds(distDir) {
  const manifest = JSON.parse(fs.readFileSync(path.join(distDir, "server", "server-reference-manifest.json"), "utf8"));
  return Object.fromEntries(Object.entries(manifest.node).map(([id, entry]) => [entry.exportedName, id]));
}

/** One request; resolves { status, headers, text }. */
export function send(base, method, pathname, { headers = {}, body, from } = {}) {
  const url = new URL(pathname, base);
  return new Promise((resolve, reject) => {
    const req = http.request(
      { host: url.hostname, port: url.port, method, path: url.pathname + url.search, headers, localAddress: from, agent: false },
      (res) => {
        const chunks = [];
        res.on("data", (c) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString("utf8") }));
      },
    );
    req.on("error", reject);
    req.setTimeout(60_000, () => req.destroy(new Error(`${method} ${pathname} timed out`)));
    if (body !== undefined) req.write(body);
    req.end();
  });
}

/** Signs in through better-auth; answers the Cookie header a browser would send. */
export async function signIn(base, email, password, from) {
  const res = await send(base, "POST", "/api/auth/sign-in/email", {
    headers: { "content-type": "application/json", origin: new URL(base).origin },
    body: JSON.stringify({ email, password }),
    from,
  });
  if (res.status !== 200) throw new Error(`sign-in ${email}: ${res.status} ${res.text.slice(0, 200)}`);
  return []
    .concat(res.headers["set-cookie"] ?? [])
    .map((c) => c.split(";")[0])
    .join("; ");
}

/** POST /api/v1/shops/{shop}/arrangements; answers { status, body }. */
export async function arrangements(base, shop, requirement, from) {
  const res = await send(base, "POST", `/api/v1/shops/${shop}/arrangements`, {
    headers: { "content-type": "application/json" },
    body: JSON.stringify(requirement),
    from,
  });
  let body = null;
  try {
    body = JSON.parse(res.text);
  } catch {
    /* not JSON */
  }
  return { status: res.status, body };
}

/** Calls a server action on `page` with `args`; answers the action's result (or throws with what came back). */
export async function callAction(base, { page, actionId, args, cookie = "", from }) {
  const res = await send(base, "POST", page, {
    headers: {
      "next-action": actionId,
      "content-type": "text/plain;charset=UTF-8",
      accept: "text/x-component",
      origin: new URL(base).origin,
      ...(cookie ? { cookie } : {}),
    },
    body: JSON.stringify(args),
    from,
  });
  const line = res.text.split("\n").find((l) => l.startsWith("1:"));
  if (res.status !== 200 || !line) throw new Error(`action on ${page}: ${res.status} ${res.text.slice(0, 300)}`);
  return JSON.parse(line.slice(2));
}

/** A quote for the signed-in customer: the cheapest option the shop offers for the requirement. */
export async function chooseCheapest(base, { shop, actionId, cookie, requirement, option, from }) {
  return callAction(base, {
    page: `/s/${shop}`,
    actionId,
    cookie,
    from,
    args: [
      shop,
      {
        idempotencyKey: randomUUID(),
        requirement,
        option: { cellSku: option.cell.sku, topology: option.topology, seriesCount: option.seriesCount, parallelCount: option.parallelCount },
      },
    ],
  });
}

/** Nearest-rank percentile of sorted values. */
export function percentile(sorted, p) {
  if (sorted.length === 0) return NaN;
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length));
  return sorted[Math.min(sorted.length, rank) - 1];
}

/** Whether quote numbers (Q-YYYY-NNNN) are unique and run without a gap. */
export function gapFree(numbers) {
  const n = numbers.map((q) => Number(q.slice(-4))).sort((a, b) => a - b);
  return new Set(n).size === n.length && n.every((v, i) => i === 0 || v === n[i - 1] + 1);
}
