import "server-only";
import http from "node:http";
import https from "node:https";
import type { LookupFunction } from "node:net";
import { resolveAllowed, type AddressPolicy, type Resolver } from "./address-policy";

export interface AttemptResult {
  /** the receiver answered 2xx */
  delivered: boolean;
  /** the receiver's status; null when none came (refused address, timeout, connection error) */
  status: number | null;
  durationMs: number;
  /** why it failed, in a sentence; null when delivered */
  error: string | null;
  /** the start of the answer, for the log */
  response: string | null;
}

const SNIPPET_CHARS = 500;

/**
 * One POST of a webhook: the address checked against the policy when connecting (the connection
 * goes to an address that passed, so a name cannot switch to a private one between check and use),
 * no redirects followed (3xx is a failure), the whole attempt bounded by `timeoutMs` and the answer
 * read to at most `maxResponseBytes`.
 */
export async function postWebhook(input: {
  url: string;
  body: string;
  headers: Record<string, string>;
  policy: AddressPolicy;
  timeoutMs: number;
  maxResponseBytes: number;
  resolve?: Resolver;
}): Promise<AttemptResult> {
  const started = performance.now();
  const elapsed = () => Math.round(performance.now() - started);
  const url = new URL(input.url);
  const fail = (error: string, status: number | null = null, response: string | null = null): AttemptResult => ({
    delivered: false,
    status,
    durationMs: elapsed(),
    error,
    response,
  });
  if (url.protocol !== "https:" && url.protocol !== "http:") return fail("Only http(s) addresses are called.");
  // IP literals never reach the lookup hook: check them here (names are checked again at connect)
  const first = await resolveAllowed(url.hostname, input.policy, input.resolve);
  if (!first.ok) return fail(`Refused: ${first.reason}`);

  const lookup: LookupFunction = (hostname, options, callback) => {
    resolveAllowed(hostname, input.policy, input.resolve).then(
      (r) => {
        if (!r.ok) return callback(Object.assign(new Error(`Refused: ${r.reason}`), { code: "EFARADSMITHREFUSED" }), "", 4);
        const chosen = typeof options.family === "number" && options.family > 0 ? r.addresses.filter((a) => a.family === options.family) : r.addresses;
        if (chosen.length === 0) return callback(Object.assign(new Error(`No usable address for ${hostname}`), { code: "ENOTFOUND" }), "", 4);
        if (options.all) return (callback as unknown as (e: null, a: { address: string; family: number }[]) => void)(null, chosen);
        const [a] = chosen;
        callback(null, a!.address, a!.family);
      },
      (error: NodeJS.ErrnoException) => callback(error, "", 4),
    );
  };

  return new Promise<AttemptResult>((resolve) => {
    let settled = false;
    const finish = (r: AttemptResult) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      resolve(r);
    };
    const client = url.protocol === "https:" ? https : http;
    const request = client.request(
      url,
      {
        method: "POST",
        agent: false,
        lookup,
        headers: { ...input.headers, "content-length": String(Buffer.byteLength(input.body)) },
      },
      (response) => {
        const status = response.statusCode ?? 0;
        const chunks: Buffer[] = [];
        let size = 0;
        const done = () => {
          const text = Buffer.concat(chunks).toString("utf8").slice(0, SNIPPET_CHARS) || null;
          if (status >= 200 && status < 300) finish({ delivered: true, status, durationMs: elapsed(), error: null, response: text });
          else if (status >= 300 && status < 400) finish(fail(`Answered ${status}: redirects are not followed; register the final address.`, status, text));
          else finish(fail(`Answered ${status}.`, status, text));
        };
        response.on("data", (chunk: Buffer) => {
          size += chunk.length;
          if (size <= input.maxResponseBytes) chunks.push(chunk);
          else {
            // enough read: the status is what counts
            response.destroy();
            done();
          }
        });
        response.on("end", done);
        response.on("error", () => done());
      },
    );
    const timer = setTimeout(() => {
      request.destroy();
      finish(fail(`No answer within ${input.timeoutMs / 1000} s.`));
    }, input.timeoutMs);
    request.on("error", (error: NodeJS.ErrnoException) => {
      const message = error.code === "EFARADSMITHREFUSED" ? error.message : `Could not connect: ${error.code ?? error.message}.`;
      finish(fail(message));
    });
    request.end(input.body);
  });
}
