import { render } from "@react-email/render";
import { createElement } from "react";
import { describe, expect, it } from "vitest";
import { AccountExistsEmail, accountExistsSubject, type AccountExistsEmailProps } from "@/emails/account-exists";

// Invented shop and person.
const join: AccountExistsEmailProps = {
  email: "renske.haddow@tollmere-tramways.example",
  attempt: { kind: "join", shopName: "Kestrel Bank Works" },
  signInUrl: "http://127.0.0.1:3000/sign-in?shop=kestrel-bank-works&next=%2Fs%2Fkestrel-bank-works%2Fjoin",
};
const openShop: AccountExistsEmailProps = {
  ...join,
  attempt: { kind: "open-shop", shopName: "North Coast Banks" },
  signInUrl: "http://127.0.0.1:3000/sign-in?next=%2Fmy-shops",
};

const plain = async (p: AccountExistsEmailProps) => (await render(createElement(AccountExistsEmail, p), { plainText: true })).replace(/\s+/g, " ");

describe("account-exists e-mail", () => {
  it("says an account exists for the address, that nothing was created, and where it was tried", async () => {
    const text = await plain(join);
    expect(text.toLowerCase()).toContain("you already have an account");
    expect(text).toContain(join.email);
    expect(text).toContain("create a customer account at Kestrel Bank Works");
    expect(text).toContain("nothing new was created");
    expect(await plain(openShop)).toContain("open a new shop, North Coast Banks");
  });

  it("links the sign-in page, in the button and written out, with its query intact", async () => {
    const html = await render(createElement(AccountExistsEmail, join));
    const hrefs = [...html.matchAll(/href="([^"]+)"/g)].map((m) => m[1]?.replace(/&amp;/g, "&"));
    expect(hrefs.filter((h) => h === join.signInUrl)).toHaveLength(2);
    expect(await plain(join)).toContain(join.signInUrl);
  });

  it("tells someone who did not ask that there is nothing to do", async () => {
    expect(await plain(join)).toContain("If this was not you, you need do nothing");
  });

  it("names the shop in the subject for a join, and escapes markup in names", async () => {
    expect(accountExistsSubject(join)).toBe("You already have an account — Kestrel Bank Works");
    expect(accountExistsSubject(openShop)).toBe("You already have an account — opening a shop");
    const html = await render(createElement(AccountExistsEmail, { ...join, attempt: { kind: "join", shopName: "Volt & <b>Ohm</b>" } }));
    expect(html).toContain("Volt &amp; &lt;b&gt;Ohm&lt;/b&gt;");
    expect(html).not.toContain("<b>Ohm</b>");
  });
});
