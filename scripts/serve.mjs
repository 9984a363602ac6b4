// The production server: `next start`'s job, plus one thing Next.js cannot do for us. A route
// handler or server action sees a Web Request without the connection's address, and Next.js
// only fills X-Forwarded-For when the client sent none, so a client could name any address it
// liked. Here every request gets the connection's own address appended to X-Forwarded-For, as a
// reverse proxy appends it, and lib/http/client-address.ts reads the chain from the right
// (skipping TRUSTED_PROXIES). Used by `npm start`, the browser tests and the bench.
// It also answers the build's static files in brotli (see `precompressStatic` below).
//   node scripts/serve.mjs [-H host] [-p port]
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import zlib from "node:zlib";

const args = process.argv.slice(2);
const flag = (name, fallback) => {
  const i = args.indexOf(name);
  return i >= 0 && args[i + 1] ? args[i + 1] : fallback;
};
const hostname = flag("-H", process.env.HOSTNAME ?? "127.0.0.1");
const port = Number(flag("-p", process.env.PORT ?? 3000));

process.env.NODE_ENV = "production";
// read by lib/env.ts: the right-most X-Forwarded-For entry is the connection, not the client's word
process.env.PEER_ADDRESS_APPENDED = "true";

// imported after the environment is set, as `next start` does
const { default: next } = await import("next");
const app = next({ dev: false, hostname, port });
await app.prepare();
const handle = app.getRequestHandler();

// Static files in brotli. Next.js compresses with gzip only, and on a phone's slow link every
// kilobyte of script shows in the time to a usable page; brotli at its highest quality makes the
// build's scripts and styles about 14 % smaller than gzip. The files under /_next/static never
// change (their names carry a hash of their content), so each is compressed once per build (kept in
// the build folder's brotli/, so a second server or a restart reads it back in a moment; the first
// start after a build spends a few seconds on it before it listens) and held in memory with the
// headers Next.js gives it (the build's own header rules from routes-manifest.json, the immutable
// cache policy, its type). A client that does not accept brotli gets Next.js's own answer.
const distDir = path.resolve(process.env.NEXT_DIST_DIR || ".next");
const STATIC_TYPES = {
  ".js": "application/javascript; charset=UTF-8",
  ".css": "text/css; charset=UTF-8",
  ".svg": "image/svg+xml",
};
/** url path ("/_next/static/chunks/….js") → its brotli body and headers */
const precompressed = new Map();

async function precompressStatic() {
  const manifest = JSON.parse(fs.readFileSync(path.join(distDir, "routes-manifest.json"), "utf8"));
  const rules = (manifest.headers ?? []).map((rule) => ({ regex: new RegExp(rule.regex), headers: rule.headers }));
  const root = path.join(distDir, "static");
  const files = fs.readdirSync(root, { recursive: true }).map(String);
  for (const rel of files) {
    const type = STATIC_TYPES[path.extname(rel)];
    if (!type) continue;
    const data = fs.readFileSync(path.join(root, rel));
    const kept = path.join(distDir, "brotli", rel + ".br");
    let body = fs.existsSync(kept) ? fs.readFileSync(kept) : null;
    if (!body) {
      body = await new Promise((resolve, reject) =>
        zlib.brotliCompress(
          data,
          { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: data.length } },
          (error, out) => (error ? reject(error) : resolve(out)),
        ),
      );
      // written whole under another name, then renamed: a server starting alongside never reads half a file
      fs.mkdirSync(path.dirname(kept), { recursive: true });
      const partial = `${kept}.${process.pid}`;
      fs.writeFileSync(partial, body);
      fs.renameSync(partial, kept);
    }
    if (body.length >= data.length) continue;
    const urlPath = "/_next/static/" + rel.split(path.sep).map(encodeURIComponent).join("/");
    const headers = {};
    for (const rule of rules) if (rule.regex.test(urlPath)) for (const { key, value } of rule.headers) headers[key] = value;
    Object.assign(headers, {
      "Cache-Control": "public, max-age=31536000, immutable",
      "Content-Type": type,
      "Content-Encoding": "br",
      "Content-Length": String(body.length),
      Vary: "Accept-Encoding",
    });
    precompressed.set(urlPath, { body, headers });
  }
}

/** Whether an Accept-Encoding header accepts brotli (named, without q=0). */
function acceptsBrotli(header) {
  return String(header ?? "")
    .split(",")
    .some((part) => {
      const [coding, ...params] = part.trim().split(";");
      return coding.trim().toLowerCase() === "br" && !params.some((p) => /^\s*q\s*=\s*0(\.0*)?\s*$/i.test(p));
    });
}

/** Answers a static file in brotli when it can; false leaves the request to Next.js. */
function servePrecompressed(req, res) {
  if ((req.method !== "GET" && req.method !== "HEAD") || !req.url?.startsWith("/_next/static/")) return false;
  const entry = precompressed.get(req.url.split("?")[0]);
  if (!entry || !acceptsBrotli(req.headers["accept-encoding"])) return false;
  res.writeHead(200, entry.headers);
  res.end(req.method === "HEAD" ? undefined : entry.body);
  return true;
}

const compressing = Date.now();
await precompressStatic().then(
  () => console.log(`[faradsmith] ${precompressed.size} static files ready in brotli (${Date.now() - compressing} ms)`),
  (error) => console.error("[faradsmith] static files stay with Next.js's own compression:", error),
);

const server = http.createServer((req, res) => {
  if (servePrecompressed(req, res)) return;
  const peer = req.socket.remoteAddress ?? "";
  const forwarded = req.headers["x-forwarded-for"];
  const chain = (Array.isArray(forwarded) ? forwarded.join(", ") : (forwarded ?? "")).trim();
  req.headers["x-forwarded-for"] = chain ? `${chain}, ${peer}` : peer;
  handle(req, res).catch((error) => {
    console.error(error);
    if (!res.headersSent) res.writeHead(500, { "content-type": "text/plain" });
    res.end("Internal error");
  });
});
// the same keep-alive behaviour as `next start` behind a load balancer
server.keepAliveTimeout = 65_000;
server.listen(port, hostname, () => {
  console.log(`[faradsmith] serving on http://${hostname}:${port}`);
});

const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
