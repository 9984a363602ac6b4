/**
 * A mail stand-in of a test file's own: maildev (npm) on free ports, which a test can stop and
 * start again, and its REST API (GET /api/email) to read what it received. Point the app's mail at
 * it with `configureMail({ smtpHost: "127.0.0.1", smtpPort: maildev.smtpPort })`.
 */
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import { waitFor } from "./helpers";

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      server.close(() => (typeof address === "object" && address ? resolve(address.port) : reject(new Error("no port"))));
    });
  });
}

export function portOpen(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const s = net.connect({ port, host: "127.0.0.1" });
    s.once("connect", () => {
      s.destroy();
      resolve(true);
    });
    s.once("error", () => resolve(false));
  });
}

export interface MaildevEmail {
  id: string;
  subject: string;
  to: { address: string }[];
  headers: Record<string, string>;
  text?: string;
  attachments?: { filename?: string; generatedFileName: string; contentType: string; size: number }[];
}

export interface Maildev {
  smtpPort: number;
  webPort: number;
  start(): Promise<void>;
  stop(): Promise<void>;
  inbox(): Promise<MaildevEmail[]>;
}

/** A maildev on two free ports (not started yet), keeping its mail in `mailDir`. */
export async function maildevOnFreePorts(mailDir: string): Promise<Maildev> {
  const smtpPort = await freePort();
  const webPort = await freePort();
  let child: ChildProcess | null = null;
  return {
    smtpPort,
    webPort,
    async start() {
      child = spawn(
        path.resolve("node_modules/.bin/maildev"),
        ["--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "--smtp", String(smtpPort), "--web", String(webPort), "--mail-directory", mailDir, "--silent"],
        { stdio: "ignore" },
      );
      await waitFor(
        "maildev to listen",
        async () => (await portOpen(smtpPort)) && (await portOpen(webPort)),
        (up) => up,
        20_000,
      );
    },
    async stop() {
      const running = child;
      child = null;
      if (!running || running.exitCode !== null) return;
      const exited = new Promise((r) => running.once("exit", r));
      running.kill("SIGTERM");
      await exited;
    },
    async inbox() {
      const res = await fetch(`http://127.0.0.1:${webPort}/api/email`);
      if (!res.ok) throw new Error(`maildev answered ${res.status}`);
      return (await res.json()) as MaildevEmail[];
    },
  };
}
