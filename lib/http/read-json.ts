import { jsonError } from "@/lib/http/json-error";
import { fromZod, type ParseResult } from "@/lib/validation/bank";
import { NUL_MESSAGE, findNul } from "@/lib/validation/text";
import type { z } from "zod";

export const MAX_BODY_BYTES = 1024 * 1024;

/**
 * Reads a request body of at most `limit` bytes without trusting Content-Length: the stream is
 * cut off as soon as it passes the limit. Null when the body is larger.
 */
export async function readBodyLimited(request: Request, limit: number): Promise<Uint8Array<ArrayBuffer> | null> {
  if (Number(request.headers.get("content-length") ?? "0") > limit) return null;
  if (!request.body) return new Uint8Array();
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel().catch(() => undefined);
      return null;
    }
    chunks.push(value);
  }
  return new Uint8Array(Buffer.concat(chunks));
}

/**
 * Reads a JSON body of at most `limit` bytes; answers a 400 JSON error for anything unreadable,
 * including a NUL character in any string or key (PostgreSQL could not store it).
 */
export async function readJsonBody(request: Request, limit = MAX_BODY_BYTES): Promise<{ ok: true; value: unknown } | { ok: false; response: Response }> {
  const bytes = await readBodyLimited(request, limit);
  if (bytes === null) {
    return { ok: false, response: jsonError(400, `The body is larger than ${limit / 1024 / 1024} MB.`, [{ path: "", message: "Body too large" }]) };
  }
  const text = Buffer.from(bytes).toString("utf8");
  if (text.trim() === "") return { ok: false, response: jsonError(400, "The body is empty; send a JSON object.", [{ path: "", message: "Empty body" }]) };
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (error) {
    const message = error instanceof Error ? error.message : "not JSON";
    return { ok: false, response: jsonError(400, "The body is not valid JSON.", [{ path: "", message }]) };
  }
  const nulAt = findNul(value);
  if (nulAt !== null) return { ok: false, response: jsonError(400, "A value in the body contains a NUL character.", [{ path: nulAt, message: NUL_MESSAGE }]) };
  return { ok: true, value };
}

/**
 * Reads a JSON body (as `readJsonBody`) and checks it with a zod schema or one of our own parsers;
 * anything that does not fit answers 400 with the first problem as the error and every problem
 * under `issues`, each at its path.
 */
export async function readJsonAs<T>(
  request: Request,
  check: z.ZodType<T> | ((value: unknown) => ParseResult<T>),
  limit = MAX_BODY_BYTES,
): Promise<{ ok: true; value: T } | { ok: false; response: Response }> {
  const body = await readJsonBody(request, limit);
  if (!body.ok) return body;
  const parsed: ParseResult<T> = typeof check === "function" ? check(body.value) : fromZodResult(check.safeParse(body.value));
  if (parsed.ok) return { ok: true, value: parsed.data };
  return { ok: false, response: jsonError(400, parsed.error, parsed.issues) };
}

function fromZodResult<T>(result: z.ZodSafeParseResult<T>): ParseResult<T> {
  return result.success ? { ok: true, data: result.data } : fromZod<T>(result.error);
}
