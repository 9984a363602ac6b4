import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { openApiChecker, type Described } from "../support/openapi-check";
import { expect, test } from "./fixtures";

interface Sample {
  lang: string;
  label: string;
  source: string;
}
type Doc = Described & { info: { description: string }; paths: Record<string, Record<string, { "x-codeSamples"?: Sample[] }>> };

const CUSTOMER = "renske.haddow@tollmere-tramways.example";
// a one-page PDF as the attachment example uploads it (its bytes judged by content, not by name)
const PDF = "%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj 2 0 obj<</Type/Pages/Kids[]/Count 0>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n";

test("the API reference renders in Chromium from the app's own files, with nothing from another origin", async ({ page, baseURL }) => {
  const outside: string[] = [];
  page.on("request", (r) => {
    if (new URL(r.url()).origin !== new URL(baseURL ?? "").origin) outside.push(r.url());
  });
  const doc = (await (await page.request.get("/api/v1/openapi.json")).json()) as Doc;
  const operations = Object.values(doc.paths).reduce((n, item) => n + Object.keys(item).length, 0);

  await page.goto("/docs/api");
  await expect(page.getByRole("heading", { name: "Build on Faradsmith" })).toBeVisible();
  const reference = page.getByTestId("api-reference");
  await expect(reference.locator(".opblock-tag-section .opblock")).toHaveCount(operations);
  // open one operation: its description with the curl example, its schemas
  await reference.locator(".opblock-summary", { hasText: "/api/v1/networks/failures" }).first().click();
  await expect(reference.getByText("curl -s -X POST").first()).toBeVisible();
  await expect(reference.getByText("What one shorted or open cell does").first()).toBeVisible();
  // the webhooks, described and explained
  await expect(page.getByRole("heading", { name: "Checking the signature (Node.js)" })).toBeVisible();
  await expect(page.getByLabel("Signature check in Node.js")).toContainText("timingSafeEqual");
  await page.setViewportSize({ width: 390, height: 844 });
  await expect(page.getByRole("heading", { name: "Build on Faradsmith" })).toBeVisible();
  expect(outside).toEqual([]);
});

test("every curl example on the reference runs against this server, and its answer matches the description", async ({ baseURL }) => {
  const doc = (await (await fetch(`${baseURL}/api/v1/openapi.json`)).json()) as Doc;
  const checker = openApiChecker(doc);
  const signIn = /```sh\n(curl -s -c cookies\.txt[\s\S]*?)\n```/.exec(doc.info.description)?.[1];
  expect(signIn, "the sign-in example").toBeTruthy();
  const dirs = { manager: fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-curl-")), customer: fs.mkdtempSync(path.join(os.tmpdir(), "faradsmith-curl-")) };
  fs.writeFileSync(path.join(dirs.customer, "drawing.pdf"), PDF);
  const sh = (command: string, cwd: string) => execFileSync("bash", ["-c", command], { cwd, encoding: "utf8", timeout: 60_000 });
  sh(signIn as string, dirs.manager);
  sh((signIn as string).replace(/"email":"[^"]+"/, `"email":"${CUSTOMER}"`), dirs.customer);
  for (const dir of Object.values(dirs)) expect(fs.readFileSync(path.join(dir, "cookies.txt"), "utf8")).toContain("session_token");

  let ran = 0;
  for (const [template, item] of Object.entries(doc.paths)) {
    for (const [method, operation] of Object.entries(item)) {
      for (const sample of operation["x-codeSamples"] ?? []) {
        const dir = /as a customer/.test(sample.label) ? dirs.customer : dirs.manager;
        const out = sh(`${sample.source} -w '\\n%{http_code}\\n%{content_type}'`, dir);
        const lines = out.split("\n");
        const contentType = lines.pop() ?? "";
        const status = Number(lines.pop());
        const url = /'(https?:\/\/[^']+)'/.exec(sample.source)?.[1] ?? "";
        expect(status, `${sample.label}: ${lines.join("\n").slice(0, 300)}`).toBeLessThan(300);
        const problems = checker.check(
          {
            method: method.toUpperCase(),
            url,
            requestContentType: null,
            requestBody: null,
            status,
            responseContentType: contentType,
            responseBody: lines.join("\n"),
          },
          { answerOnly: true },
        );
        expect(problems, `${method.toUpperCase()} ${template}: ${sample.label}`).toEqual([]);
        ran++;
      }
    }
  }
  expect(ran).toBeGreaterThanOrEqual(8);
});
