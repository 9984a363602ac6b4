import fs from "node:fs";
import path from "node:path";
import { buildOpenApiDocument } from "@/lib/api/document";
import { exchangeOf, openApiChecker, readRequest, type Described } from "./openapi-check";

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

let checker: ReturnType<typeof openApiChecker> | null = null;
/** The checker for the description the app serves (built once per test file). */
export function apiChecker() {
  checker ??= openApiChecker(buildOpenApiDocument() as unknown as Described);
  return checker;
}

/** Every route module under app/api/v1, as paths from the project root. */
export function apiRouteFiles(dir = path.join("app", "api", "v1")): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? apiRouteFiles(p) : e.name === "route.ts" ? [p] : [];
  });
}

type Handler = (request: Request, context?: unknown) => Promise<Response>;

/**
 * The module with each HTTP handler wrapped: the request and the answer are checked against the
 * description, and a departure fails the call (and so the test) with what departed.
 */
export function withDriftCheck<M extends Record<string, unknown>>(mod: M, file: string): M {
  // app/api/v1/shops/[shop]/quotes/route.ts → /api/v1/shops/{shop}/quotes
  const template = `/${path.dirname(path.relative("app", file)).split(path.sep).join("/")}`.replace(/\[([^\]]+)\]/g, "{$1}");
  const out: Record<string, unknown> = { ...mod };
  for (const method of METHODS) {
    const handler = mod[method];
    if (typeof handler !== "function") continue;
    out[method] = async (request: Request, context?: unknown) => {
      const sent = await readRequest(request);
      const response = await (handler as Handler)(request, context);
      const params = ((await (context as { params?: Promise<Record<string, string>> } | undefined)?.params) ?? {}) as Record<string, string>;
      const problems = apiChecker().check({ ...(await exchangeOf(sent, response)), route: { template, params } });
      if (problems.length > 0) throw new Error(`The answer departs from the API description:\n- ${problems.join("\n- ")}`);
      return response;
    };
  }
  return out as M;
}
