// The production server: `next start`'s job, plus one thing Next.js cannot do for us. A route
// handler or server action sees a Web Request without the connection's address, and Next.js
// only fills X-Forwarded-For when the client sent none, so a client could name any address it
// liked. Here every request gets the connection's own address appended to X-Forwarded-For, as a
// reverse proxy appends it, and lib/http/client-address.ts reads the chain from the right
// (skipping TRUSTED_PROXIES). Used by `npm start`, the browser tests and the bench.
//   node scripts/serve.mjs [-H host] [-p port]
import http from "node:http";

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

const server = http.createServer((req, res) => {
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
