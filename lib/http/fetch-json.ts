/** An error answer from one of our JSON route handlers: `{ error, issues? }` with its status. */
export class FetchJsonError extends Error {
  constructor(
    public readonly status: number,
    message: string,
    public readonly issues: { path: string; message: string }[] = [],
  ) {
    super(message);
  }
}

/**
 * The one typed fetch for client components: same-origin cookies, JSON in and out, and a
 * FetchJsonError carrying the server's message for any status that is not 2xx.
 */
export async function fetchJson<T>(url: string, init: RequestInit = {}): Promise<T> {
  const response = await fetch(url, { credentials: "same-origin", ...init, headers: { accept: "application/json", ...init.headers } });
  if (!response.ok) {
    let message = `Request failed (${response.status}).`;
    let issues: { path: string; message: string }[] = [];
    try {
      const body = (await response.json()) as { error?: unknown; issues?: unknown };
      if (typeof body.error === "string") message = body.error;
      if (Array.isArray(body.issues)) issues = body.issues as typeof issues;
    } catch {
      // not JSON: keep the status message
    }
    throw new FetchJsonError(response.status, message, issues);
  }
  return (await response.json()) as T;
}
