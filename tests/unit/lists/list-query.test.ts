import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { MAX_LIST_SEARCH_LENGTH } from "@/lib/validation/limits";
import { MAX_PAGE, MAX_PAGE_SIZE } from "@/lib/validation/list-query";
import { catalogList, quoteList } from "@/lib/validation/lists";

describe("the list-query parser", () => {
  it("reads a page's search params into the list's query", () => {
    const { query, issues } = quoteList.parse({ q: " Q-2026 ", status: "accepted", sort: "total", dir: "asc", page: "3", size: "50" });
    expect(issues).toEqual([]);
    expect(query).toEqual({ q: "Q-2026", status: "accepted", sort: "total", dir: "asc", page: 3, size: 50 });
  });

  it("reads a route's URLSearchParams the same way", () => {
    expect(quoteList.parse(new URLSearchParams("q=Q-2026&status=accepted&sort=total&dir=asc&page=3&size=50")).query).toEqual(
      quoteList.parse({ q: "Q-2026", status: "accepted", sort: "total", dir: "asc", page: "3", size: "50" }).query,
    );
  });

  it("sorts a column its useful way when the URL names no direction", () => {
    expect(quoteList.parse({ sort: "total" }).query.dir).toBe("desc");
    expect(quoteList.parse({ sort: "validUntil" }).query.dir).toBe("asc");
    expect(catalogList.parse({ sort: "cost" }).query.dir).toBe("asc");
  });

  it("falls back to the default for each bad value and names it for a JSON route", () => {
    const { query, issues } = quoteList.parse({ status: "lost", sort: "password", dir: "up", page: "0", size: "1000" });
    expect(query).toEqual(quoteList.defaults);
    expect(issues.map((i) => i.path).sort()).toEqual(["dir", "page", "size", "sort", "status"]);
  });

  it("takes the first of repeated values, strips control characters and bounds the search", () => {
    const { query } = quoteList.parse({ status: ["expired", "sent"], q: `\u0000a\tb${"c".repeat(500)}` });
    expect(query.status).toBe("expired");
    expect(query.q.startsWith("a b")).toBe(true);
    expect(query.q).toHaveLength(MAX_LIST_SEARCH_LENGTH);
  });

  it("never throws and always answers values the list takes, whatever the URL holds", () => {
    const value = fc.oneof(fc.string(), fc.array(fc.string(), { maxLength: 3 }), fc.integer(), fc.constant(null), fc.object());
    const key = fc.constantFrom("q", "status", "sort", "dir", "page", "size", "technology", "__proto__", "constructor");
    fc.assert(
      fc.property(fc.dictionary(key, value), (input) => {
        const { query } = quoteList.parse(input);
        expect(["all", "sent", "accepted", "declined", "expired", "withdrawn"]).toContain(query.status);
        expect(Object.keys(quoteList.spec.sorts)).toContain(query.sort);
        expect(["asc", "desc"]).toContain(query.dir);
        expect(Number.isInteger(query.page) && query.page >= 1 && query.page <= MAX_PAGE).toBe(true);
        expect(Number.isInteger(query.size) && query.size >= 1 && query.size <= MAX_PAGE_SIZE).toBe(true);
        expect(query.q.length).toBeLessThanOrEqual(MAX_LIST_SEARCH_LENGTH);
        // eslint-disable-next-line no-control-regex
        expect(query.q).not.toMatch(/[\u0000-\u001f]/);
      }),
    );
  });

  it("writes a query back into the URL so that reading it gives the same query, keeping only what differs from the defaults", () => {
    const queries = fc.record({
      q: fc.constantFrom("", "Q-2026", "haddow"),
      status: fc.constantFrom("all", "sent", "accepted", "declined", "expired", "withdrawn"),
      sort: fc.constantFrom(...(Object.keys(quoteList.spec.sorts) as (keyof typeof quoteList.spec.sorts)[])),
      dir: fc.constantFrom("asc", "desc"),
      page: fc.integer({ min: 1, max: MAX_PAGE }),
      size: fc.integer({ min: 1, max: MAX_PAGE_SIZE }),
    });
    fc.assert(
      fc.property(queries, (q) => {
        const params = quoteList.params(q);
        expect(quoteList.parse(params).query).toEqual(q);
        // a direction is written relative to the sort's own first direction; everything else only when it differs
        for (const [k, v] of Object.entries(params)) if (k !== "dir") expect(v).not.toBe(String((quoteList.defaults as Record<string, unknown>)[k]));
      }),
    );
    expect(quoteList.params(quoteList.defaults)).toEqual({});
  });
});
