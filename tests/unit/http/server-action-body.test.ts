import { describe, expect, it } from "vitest";
import { jsonNesting, MAX_ACTION_NESTING, serverActionBodyProblem } from "@/lib/http/server-action-body";

const post = (body: BodyInit, type = "text/plain;charset=UTF-8") =>
  new Request("http://127.0.0.1:3000/s/x/join", { method: "POST", headers: { "content-type": type, "next-action": "a".repeat(42) }, body });
const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return new Request("http://127.0.0.1:3000/s/x/join", { method: "POST", body: f });
};

describe("JSON nesting", () => {
  it.each([
    ["1", 0],
    ["[]", 1],
    ['[{"a":[1]}]', 3],
    ['["[[[[", {"b": "}}}"}]', 2],
    ['["a\\"[[[", 1]', 1],
  ])("%s → %i", (text, depth) => {
    expect(jsonNesting(text)).toBe(depth);
  });
});

describe("server-action bodies", () => {
  it("lets our actions' arguments through, as text and as form data", async () => {
    expect(await serverActionBodyProblem(post(JSON.stringify(["kestrel-bank-works", { name: "Ada", email: "a@b.example" }])))).toBeNull();
    expect(await serverActionBodyProblem(form({ "0": JSON.stringify(["x", { a: 1 }]) }))).toBeNull();
  });

  it.each([
    ["an empty body", post("")],
    ["a body that is not JSON", post("not json {")],
    ["arguments nested too deep", post(`${"[".repeat(MAX_ACTION_NESTING + 1)}${"]".repeat(MAX_ACTION_NESTING + 1)}`)],
    ["a broken multipart form", post('--x\r\ncontent-disposition: form-data; name="0"\r\n\r\n[', "multipart/form-data; boundary=x")],
    ["form data without its root field", form({ "1": "[]" })],
  ])("refuses %s", async (_label, request) => {
    expect(await serverActionBodyProblem(request)).toEqual(expect.any(String));
  });
});
