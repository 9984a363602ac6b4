/**
 * Checks one request and its answer against the OpenAPI description (ajv, JSON Schema 2020-12 as
 * OpenAPI 3.1 uses it). Used by the integration tests' route wrapper (tests/integration/setup.ts)
 * on every call of every route under app/api/v1, by the contract tests, and by the browser tests
 * on the curl examples' answers. A problem is a sentence; none means the exchange is described.
 *
 * The rules: the operation must be described; a request the description refuses must be refused
 * (4xx); the status must be one the operation lists; the content type one it lists for that status;
 * a JSON body must match that status's schema.
 */
import Ajv2020, { type ValidateFunction } from "ajv/dist/2020.js";
import addFormats from "ajv-formats";

interface Parameter {
  in: string;
  name: string;
  required?: boolean;
  schema?: object;
}
interface MediaType {
  schema?: object;
}
interface Operation {
  parameters?: Parameter[];
  requestBody?: { required?: boolean; content: Record<string, MediaType> };
  responses: Record<string, { content?: Record<string, MediaType>; headers?: Record<string, { required?: boolean }> }>;
}
export interface Described {
  paths: Record<string, Record<string, Operation>>;
}

export interface Exchange {
  method: string;
  url: string;
  requestContentType: string | null;
  /** the body as text; null when there was none or it was not text (multipart) */
  requestBody: string | null;
  status: number;
  responseContentType: string | null;
  responseHeaders?: Headers;
  /** the JSON answer as text; null for a file */
  responseBody: string | null;
  /** the route the exchange went to and its path parameters, when the caller knows them (a route handler called directly) */
  route?: { template: string; params: Record<string, string> };
}

const pointer = (parts: string[]) => parts.map((p) => p.replace(/~/g, "~0").replace(/\//g, "~1")).join("/");
const mediaOf = (contentType: string | null) => (contentType ?? "").split(";")[0]?.trim().toLowerCase() ?? "";

export function openApiChecker(doc: Described) {
  const ajv = new Ajv2020({ strict: false, allErrors: true });
  addFormats(ajv);
  ajv.addSchema({ ...doc, $id: "openapi.json" });
  // query and path values arrive as text: "2" is an integer there
  const paramsAjv = new Ajv2020({ strict: false, allErrors: true, coerceTypes: true });
  addFormats(paramsAjv);
  paramsAjv.addSchema({ ...doc, $id: "openapi.json" });
  const cache = new Map<string, ValidateFunction>();
  const validator = (instance: Ajv2020, parts: string[]) => {
    const ref = `openapi.json#/${pointer(parts)}`;
    const key = `${instance === ajv ? "b" : "p"}${ref}`;
    let v = cache.get(key);
    if (!v) cache.set(key, (v = instance.compile({ $ref: ref })));
    return v;
  };
  const say = (v: ValidateFunction) => (v.errors ?? []).map((e) => `${e.instancePath || "(root)"} ${e.message ?? ""}`).join("; ");

  const templates = Object.keys(doc.paths).map((template) => ({
    template,
    names: [...template.matchAll(/\{([^}]+)\}/g)].map((m) => m[1] as string),
    pattern: new RegExp(`^${template.replace(/[.*+?^$()|[\]\\]/g, "\\$&").replace(/\\?\{[^}]+\\?\}/g, "([^/]+)")}$`),
  }));

  /** The described operation for a method and URL (or the route named), with its path parameters. */
  function find(method: string, url: string, route?: Exchange["route"]) {
    if (route) {
      const operation = doc.paths[route.template]?.[method.toLowerCase()];
      return operation ? { template: route.template, operation, params: route.params } : null;
    }
    const { pathname } = new URL(url, "http://localhost");
    for (const t of templates) {
      const m = t.pattern.exec(pathname);
      const operation = m ? doc.paths[t.template]?.[method.toLowerCase()] : undefined;
      if (m && operation)
        return { template: t.template, operation, params: Object.fromEntries(t.names.map((n, i) => [n, decodeURIComponent(m[i + 1] ?? "")])) };
    }
    return null;
  }

  /** Why the description refuses the request (empty when it takes it). */
  function requestProblems(x: Exchange, found: NonNullable<ReturnType<typeof find>>): string[] {
    const out: string[] = [];
    const base = ["paths", found.template, x.method.toLowerCase()];
    const query = new URL(x.url, "http://localhost").searchParams;
    (found.operation.parameters ?? []).forEach((p, i) => {
      const value = p.in === "path" ? found.params[p.name] : p.in === "query" ? (query.get(p.name) ?? undefined) : undefined;
      if (value === undefined) {
        if (p.required) out.push(`missing ${p.in} parameter ${p.name}`);
        return;
      }
      const holder = { value };
      const v = validator(paramsAjv, [...base, "parameters", String(i), "schema"]);
      if (!v(holder.value)) out.push(`${p.in} parameter ${p.name}: ${say(v)}`);
    });
    const body = found.operation.requestBody;
    if (body) {
      const media = mediaOf(x.requestContentType);
      if (body.content["application/json"]) {
        let json: unknown;
        try {
          json = JSON.parse(x.requestBody ?? "");
        } catch {
          return [...out, "the body is not JSON"];
        }
        const v = validator(ajv, [...base, "requestBody", "content", "application/json", "schema"]);
        if (!v(json)) out.push(`body: ${say(v)}`);
      } else if (!body.content[media]) out.push(`a ${media || "missing"} body where the description takes ${Object.keys(body.content).join(", ")}`);
    }
    return out;
  }

  /** Every way the exchange departs from the description (`answerOnly`: the answer alone, for a request checked elsewhere). */
  function check(x: Exchange, { answerOnly = false } = {}): string[] {
    const found = find(x.method, x.url, x.route);
    if (!found) return [`${x.method} ${new URL(x.url, "http://localhost").pathname} is not in the description`];
    const where = `${x.method} ${found.template} → ${x.status}`;
    // only an accepted request must be one the description takes (a refused one may be anything, however large)
    const refused = x.status < 400 && !answerOnly ? requestProblems(x, found) : [];
    const out: string[] = [];
    if (refused.length > 0) out.push(`${where}: answered a request the description refuses (${refused.join("; ")})`);
    const response = found.operation.responses[String(x.status)] ?? found.operation.responses.default;
    if (!response) return [...out, `${where}: the status is not described (described: ${Object.keys(found.operation.responses).join(", ")})`];
    for (const [name, header] of Object.entries(response.headers ?? {})) {
      if (header.required && x.responseHeaders && !x.responseHeaders.has(name)) out.push(`${where}: no ${name} header`);
    }
    if (!response.content) return out;
    const media = mediaOf(x.responseContentType);
    if (!response.content[media]) return [...out, `${where}: content type ${media || "none"} is not described (${Object.keys(response.content).join(", ")})`];
    if (media === "application/json") {
      let json: unknown;
      try {
        json = JSON.parse(x.responseBody ?? "");
      } catch {
        return [...out, `${where}: the answer is not JSON`];
      }
      const v = validator(ajv, ["paths", found.template, x.method.toLowerCase(), "responses", String(x.status), "content", media, "schema"]);
      if (!v(json)) out.push(`${where}: ${say(v)}`);
    }
    return out;
  }

  /** Why the description refuses a request (as an example or a client would send it). */
  function checkRequest(x: Pick<Exchange, "method" | "url" | "requestContentType" | "requestBody">): string[] {
    const found = find(x.method, x.url);
    if (!found) return [`${x.method} ${new URL(x.url, "http://localhost").pathname} is not in the description`];
    return requestProblems({ ...x, status: 0, responseContentType: null, responseBody: null }, found);
  }

  return { check, checkRequest, find };
}

/**
 * Reads a request (before its handler runs: a clone read later could hold up a handler that
 * cancels its own copy of the body) and its answer (cloned, left readable) into an Exchange.
 */
export async function readRequest(request: Request): Promise<Pick<Exchange, "method" | "url" | "requestContentType" | "requestBody">> {
  const requestContentType = request.headers.get("content-type");
  const text = request.body ? await request.clone().text() : null;
  return { method: request.method, url: request.url, requestContentType, requestBody: mediaOf(requestContentType).startsWith("multipart/") ? null : text };
}

export async function exchangeOf(sent: Awaited<ReturnType<typeof readRequest>>, response: Response): Promise<Exchange> {
  const responseContentType = response.headers.get("content-type");
  const isJson = (t: string | null) => mediaOf(t) === "application/json";
  return {
    ...sent,
    status: response.status,
    responseContentType,
    responseHeaders: response.headers,
    responseBody: isJson(responseContentType) ? await response.clone().text() : null,
  };
}
