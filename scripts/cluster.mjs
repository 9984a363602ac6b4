// More than one app server: `startCluster` runs several production servers (scripts/serve.mjs) on
// loopback behind haproxy (Debian's package), sharing one PostgreSQL. Used by `npm run cluster`
// (scripts/start.mjs --cluster), the multi-server test layer (scripts/test.mjs) and the bench.
// haproxy appends each client's address to X-Forwarded-For (`option forwardfor`) and the servers
// trust it as a proxy (TRUSTED_PROXIES=127.0.0.1), so rate limits key on the real client; each
// answer says which server made it (`x-served-by: app1`); a server that fails its health check
// (GET /api/health) is taken out of the rotation until it passes again.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { log, portOpen, spawnService, waitForPort } from "./services.mjs";

/** haproxy's configuration for a load balancer on `lbPort` in front of `appPorts`. */
export function haproxyConfig({ lbPort, appPorts }) {
  return [
    "global",
    "  maxconn 4096",
    "defaults",
    "  mode http",
    "  timeout connect 5s",
    "  timeout client 120s",
    "  timeout server 120s",
    // a busy machine may take a few seconds to answer a health check: that is not a dead server
    "  timeout check 10s",
    "  option forwardfor",
    "frontend faradsmith",
    `  bind 127.0.0.1:${lbPort}`,
    "  default_backend app",
    "backend app",
    "  balance roundrobin",
    "  option httpchk GET /api/health",
    "  http-check expect status 200",
    "  http-response set-header x-served-by %s",
    ...appPorts.map((port, i) => `  server app${i + 1} 127.0.0.1:${port} check inter 2s fall 3 rise 1`),
    "",
  ].join("\n");
}

async function healthy(port) {
  try {
    const res = await fetch(`http://127.0.0.1:${port}/api/health`);
    return res.ok;
  } catch {
    return false;
  }
}

/**
 * Starts the servers (each with the same environment: the database, the session secret, the mail
 * server) and haproxy in front of them. `env.APP_URL` should be the load balancer's address, which
 * is what browsers use. Resolves once haproxy accepts connections and every server is healthy.
 */
export async function startCluster({ env, lbPort, appPorts, label = "app" }) {
  for (const port of [lbPort, ...appPorts]) {
    if (await portOpen(port)) throw new Error(`port ${port} is already in use`);
  }
  const lbUrl = `http://127.0.0.1:${lbPort}`;
  const serverEnv = { ...env, TRUSTED_PROXIES: "127.0.0.1" };
  appPorts.forEach((port, i) =>
    spawnService(`${label}${i + 1}`, process.execPath, ["scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(port)], {
      env: serverEnv,
      stdio: ["ignore", "ignore", "inherit"],
    }),
  );
  for (const port of appPorts) {
    await waitForPort(port, `app server on ${port}`, 180_000);
    const until = Date.now() + 60_000;
    while (!(await healthy(port))) {
      if (Date.now() > until) throw new Error(`app server on ${port} is not healthy`);
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-haproxy-"));
  const config = path.join(dir, "haproxy.cfg");
  fs.writeFileSync(config, haproxyConfig({ lbPort, appPorts }));
  spawnService("haproxy", "/usr/sbin/haproxy", ["-f", config, "-db"], { stdio: ["ignore", "ignore", "inherit"] });
  await waitForPort(lbPort, "haproxy");
  log(`load balancer at ${lbUrl} in front of ${appPorts.map((p) => `127.0.0.1:${p}`).join(", ")}`);
  return { url: lbUrl, servers: appPorts.map((p) => `http://127.0.0.1:${p}`) };
}
