import { describe, expect, it } from "vitest";
import { openShopSchema, slugProblem, suggestSlug } from "@/lib/validation/auth";

describe("shop slug validation", () => {
  it.each(["kestrel-bank-works", "marlow-pulse", "abc", "a1-b2-c3", "x".repeat(40)])("accepts %s", (slug) => {
    expect(slugProblem(slug)).toBeNull();
  });

  it.each([
    ["", /Choose/],
    ["north coast", /No spaces/],
    [" lead", /No spaces/],
    ["North-Coast", /lowercase/],
    ["north_coast", /letters, digits and hyphens/],
    ["ab", /At least 3/],
    ["x".repeat(41), /At most 40/],
    ["-north", /hyphen/],
    ["north-", /hyphen/],
    ["north--coast", /double hyphens/],
    ["api", /reserved/],
    ["desk", /reserved/],
    ["bänk", /letters, digits and hyphens/],
  ])("refuses %j with a message", (slug, message) => {
    expect(slugProblem(slug)).toMatch(message);
  });

  it("suggests a usable slug from a shop name", () => {
    expect(suggestSlug("Kestrel Bank Works")).toBe("kestrel-bank-works");
    expect(suggestSlug("  Ångström & Söhne  Caps ")).toBe("angstrom-sohne-caps");
    expect(slugProblem(suggestSlug("Tidewater Power — Banks!"))).toBeNull();
  });

  it("puts the slug's message on the slug field of the open-shop form", () => {
    const r = openShopSchema.safeParse({
      name: "Ada Quill",
      email: "ada@example.com",
      password: "long-enough-pw",
      shopName: "North Coast",
      slug: "north coast",
      currency: "EUR",
    });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((i) => i.path.join("."))).toEqual(["slug"]);
  });

  it("refuses a malformed e-mail and a short password at their fields", () => {
    const r = openShopSchema.safeParse({ name: "Ada Quill", email: "ada@", password: "short", shopName: "North Coast", slug: "north-coast", currency: "EUR" });
    expect(r.success).toBe(false);
    if (!r.success) expect(r.error.issues.map((i) => i.path.join(".")).sort()).toEqual(["email", "password"]);
  });
});
