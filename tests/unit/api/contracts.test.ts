/**
 * The API description is generated from the route contracts (lib/api/contracts) and nothing else:
 * every route under app/api/v1 has exactly one contract, the document is valid OpenAPI 3.1 (checked
 * by @seriousme/openapi-schema-validator, the OpenAPI Initiative's published JSON schemas), every
 * example is a request it takes, the checker that the integration tests run on every call does
 * refuse what departs from it, and the checked-in client types are what the description generates.
 */
import fs from "node:fs";
import path from "node:path";
import { Validator } from "@seriousme/openapi-schema-validator";
import { describe, expect, it } from "vitest";
import { routeFileOf } from "@/lib/api/contract";
import { CONTRACTS } from "@/lib/api/contracts";
import { buildOpenApiDocument } from "@/lib/api/document";
import { API_KEY_SCOPE_FOR } from "@/lib/auth/api-key-scopes";
import { reads } from "@/lib/auth/ownership";
import type { Permission } from "@/lib/auth/permissions";
import { API_TYPES_FILE, generateApiTypes } from "@/scripts/api-types";
import { openApiChecker, type Described } from "@/tests/support/openapi-check";
import { apiRouteFiles } from "@/tests/support/route-drift";

const doc = buildOpenApiDocument();
const checker = openApiChecker(doc as unknown as Described);

/** "GET /api/v1/shops/{shop}/quotes" for each handler a route file exports. */
function routesInApp(): string[] {
  return apiRouteFiles().flatMap((file) => {
    const source = fs.readFileSync(file, "utf8");
    const methods = [...source.matchAll(/export (?:async function|const) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);
    const route = `/${path.dirname(file).split(path.sep).join("/")}`.replace(/^\/app/, "").replace(/\[([^\]]+)\]/g, "{$1}");
    return methods.map((m) => `${m} ${route}`);
  });
}

describe("route contracts", () => {
  it("every route handler under app/api/v1 has exactly one contract, and every contract a handler", () => {
    const declared = CONTRACTS.map((c) => `${c.method} ${c.path}`);
    expect(new Set(declared).size, "a route declared twice").toBe(declared.length);
    const inApp = routesInApp();
    expect(
      inApp.filter((r) => !declared.includes(r)),
      "handlers without a contract (add one in lib/api/contracts)",
    ).toEqual([]);
    expect(
      declared.filter((r) => !inApp.includes(r)),
      "contracts without a handler",
    ).toEqual([]);
    for (const c of CONTRACTS) expect(fs.existsSync(routeFileOf(c.path)), routeFileOf(c.path)).toBe(true);
  });

  it("operation ids are unique, and member routes describe the guard's refusals", () => {
    const ids = CONTRACTS.map((c) => c.operationId);
    expect(new Set(ids).size).toBe(ids.length);
    for (const c of CONTRACTS.filter((x) => x.access === "member")) {
      expect(Object.keys(c.errors).sort(), c.operationId).toEqual(expect.arrayContaining(["401", "403", "404"]));
    }
  });

  it("a route takes an API key exactly when its handler's permission maps to a key scope, and names that scope", () => {
    // the handler states its permission once (`withShopApi(request, shop, <access>, …)`); the key
    // scope that stands in for it comes from API_KEY_SCOPE_FOR (lib/auth/api-key-scopes.ts)
    const access = (expression: string): Permission[] => {
      const literal = /^"([^"]+)"$/.exec(expression);
      if (literal) return [literal[1] as Permission];
      const list = /^\[(.*)\]$/.exec(expression);
      if (list) return (list[1] ?? "").split(",").flatMap((item) => access(item.trim()));
      const owned = /^reads\("([^"]+)"\)$/.exec(expression);
      if (owned) return [...reads(owned[1] as Parameters<typeof reads>[0])];
      throw new Error(`an access the test cannot read: ${expression}`);
    };
    let checked = 0;
    for (const c of CONTRACTS.filter((x) => x.access === "member")) {
      const source = fs.readFileSync(routeFileOf(c.path), "utf8");
      const handler = source.split(/export async function /).find((chunk) => chunk.startsWith(`${c.method}(`)) ?? "";
      const asked = /withShopApi\(\s*request,\s*\w+,\s*(\[[^\]]*\]|[^,]+?),/.exec(handler)?.[1];
      expect(asked, `${c.operationId}: its handler goes through withShopApi`).toBeDefined();
      const scopes = new Set(access(asked as string).flatMap((p) => API_KEY_SCOPE_FOR[p] ?? []));
      expect(scopes.size, c.operationId).toBeLessThanOrEqual(1);
      expect(c.apiKey, `${c.operationId} asks ${asked}`).toBe([...scopes][0]);
      checked++;
    }
    expect(checked).toBeGreaterThanOrEqual(15);
  });

  it("the description is a valid OpenAPI 3.1 document", async () => {
    const validator = new Validator();
    const result = await validator.validate(JSON.parse(JSON.stringify(doc)));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe("3.1");
  });

  it("every example is a request the description takes", () => {
    const examples = CONTRACTS.flatMap((c) => (c.examples ?? []).map((e) => ({ c, e })));
    expect(examples.length).toBeGreaterThanOrEqual(8);
    for (const { c, e } of examples) {
      const url = c.path.replace(/\{([^}]+)\}/g, (_, n: string) => e.params?.[n] ?? "x") + (e.query ? `?${new URLSearchParams(e.query)}` : "");
      const problems = checker.checkRequest({
        method: c.method,
        url,
        requestContentType:
          e.json !== undefined ? "application/json" : e.form ? "multipart/form-data; boundary=x" : e.text !== undefined ? (c.body?.text?.[0] ?? null) : null,
        requestBody: e.json !== undefined ? JSON.stringify(e.json) : (e.text ?? null),
      });
      expect(problems, `${c.operationId}: ${e.title}`).toEqual([]);
    }
  });

  it("the checked-in client types are what the description generates (npm run api:types)", async () => {
    expect(fs.readFileSync(API_TYPES_FILE, "utf8") === (await generateApiTypes()), "lib/api/openapi-types.ts is stale: run npm run api:types").toBe(true);
    // generating and formatting some 3,000 lines of types takes seconds on a busy machine
  }, 60_000);
});

describe("the drift checker", () => {
  const evaluate = { method: "POST", url: "/api/v1/networks/evaluate", requestContentType: "application/json" } as const;
  const body = JSON.stringify({ appliedVoltage: 5, network: { kind: "cell", id: "a", capacitance: 1, ratedVoltage: 5 } });
  const answer = { capacitance: 1, maxVoltage: 5, energy: 12.5, charge: 5, cells: [{ id: "a", voltage: 5, charge: 5, energy: 12.5 }] };
  const json = (status: number, value: unknown) => ({ status, responseContentType: "application/json", responseBody: JSON.stringify(value) });

  it("passes an answer the description allows", () => {
    expect(checker.check({ ...evaluate, requestBody: body, ...json(200, answer) })).toEqual([]);
    expect(
      checker.check({ ...evaluate, requestBody: "{", ...json(400, { error: "The body is not valid JSON.", issues: [{ path: "", message: "x" }] }) }),
    ).toEqual([]);
  });

  it.each([
    ["a field the answer does not describe", { ...answer, extra: 1 }, 200, body, /must NOT have additional properties/],
    ["a missing field", { ...answer, cells: undefined }, 200, body, /must have required property 'cells'/],
    ["a string for a number", { ...answer, capacitance: "1" }, 200, body, /capacitance must be number/],
    ["a status the route does not give", { error: "x" }, 409, body, /the status is not described/],
    ["an error body without its message", { issues: [] }, 400, body, /must have required property 'error'/],
    [
      "a success for a request the description refuses",
      answer,
      200,
      JSON.stringify({ network: { kind: "cell", id: "a", capacitance: -1, ratedVoltage: 5 } }),
      /refuses/,
    ],
  ])("refuses %s", (_what, value, status, requestBody, message) => {
    expect(checker.check({ ...evaluate, requestBody, ...json(status, value) }).join("\n")).toMatch(message);
  });

  it("refuses a route the description does not hold, and a content type it does not list", () => {
    expect(checker.check({ ...evaluate, url: "/api/v1/networks/unknown", requestBody: body, ...json(200, answer) })[0]).toMatch(/not in the description/);
    expect(checker.check({ ...evaluate, requestBody: body, status: 200, responseContentType: "text/html", responseBody: null }).join("\n")).toMatch(
      /content type text\/html is not described/,
    );
  });
});
