/**
 * Every example the API reference shows as a curl command is a request its route answers with
 * success, against the seeded demo shop and as the account the example names — through the handler
 * itself, so the drift check (tests/integration/setup.ts) also holds its answer to the description.
 * The browser tests run the same commands with curl against the built server.
 */
import path from "node:path";
import { describe, expect, it } from "vitest";
import { routeFileOf } from "@/lib/api/contract";
import { CONTRACTS } from "@/lib/api/contracts";
import { request, sessionCookie } from "./helpers";

const ACCOUNTS = { manager: "ottilie.brandvold@kestrel-bank-works.example", customer: "renske.haddow@tollmere-tramways.example" } as const;
// a one-page PDF, as the browser test gives curl for an example's "@file"
const PDF = "%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj 2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n";

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

const examples = CONTRACTS.flatMap((contract) => (contract.examples ?? []).map((example) => ({ contract, example })));

describe("the reference's examples", () => {
  it.each(examples.map(({ contract, example }) => [`${contract.method} ${contract.path}: ${example.title}`, contract, example] as const))(
    "%s",
    async (_name, contract, example) => {
      const url =
        contract.path.replace(/\{([^}]+)\}/g, (_, n: string) => encodeURIComponent(example.params?.[n] ?? "")) +
        (example.query ? `?${new URLSearchParams(example.query)}` : "");
      const headers: Record<string, string> = {};
      let body: BodyInit | undefined;
      if (example.json !== undefined) {
        headers["content-type"] = "application/json";
        body = JSON.stringify(example.json);
      } else if (example.text !== undefined) {
        headers["content-type"] = contract.body?.text?.[0] ?? "text/plain";
        body = example.text;
      } else if (example.form) {
        const form = new FormData();
        for (const [name, value] of Object.entries(example.form))
          form.set(name, value.startsWith("@") ? new File([PDF], value.slice(1), { type: "application/pdf" }) : value);
        body = form;
      }
      const cookie = contract.access === "public" ? undefined : await sessionCookie(ACCOUNTS[example.as ?? "manager"]);
      const route = (await import(path.resolve(routeFileOf(contract.path)))) as Record<string, Handler>;
      const answer = await route[contract.method]!(request(url, { method: contract.method, headers, body, cookie }), {
        params: Promise.resolve(example.params ?? {}),
      });
      expect(answer.status, await answer.clone().text()).toBe(contract.ok.status);
    },
  );
});
