/**
 * Joining a shop or opening one answers the same whether or not the e-mail already has an
 * account; the owner of an existing account hears about it by e-mail instead, and nothing is
 * created for them. The join notice goes through the shop's outbox; the open-shop notice (there
 * is no shop yet) straight to the mail server, read back here from the mail stand-in's inbox.
 */
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { openShop } from "@/app/(auth)/open-shop/actions";
import { joinShop } from "@/app/s/[shop]/join/actions";
import { ownerDb as db } from "./owner-db";
import { emailOutbox, members, shops, users } from "@/db/schema";
import { demoPeople } from "@/db/seed/people";
import { buildOutboxMessage } from "@/lib/mail/messages";
import { env } from "@/lib/env";
import { actAs, shopBySlug } from "./helpers";

const K = "kestrel-bank-works";
const existing = demoPeople["marlow-pulse"].customers[0];

interface InboxMail {
  subject: string;
  to: { address: string }[];
  text?: string;
}

async function inboxFor(address: string, subject: string): Promise<InboxMail | undefined> {
  const until = Date.now() + 15_000;
  while (Date.now() < until) {
    const res = await fetch(`${env.MAIL_INBOX_URL}/api/email`).catch(() => null);
    if (res?.ok) {
      const mail = ((await res.json()) as InboxMail[]).find((m) => m.subject === subject && m.to.some((t) => t.address === address));
      if (mail) return mail;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  return undefined;
}

describe("join answers alike for a new and an existing e-mail", () => {
  it("same answer; the existing account is not added, not changed, and its owner gets one notice a day", async () => {
    await actAs(null);
    const shop = await shopBySlug(K);
    const fresh = `tobin.searle.${Date.now()}@harl-quarry.example`;
    const forNew = await joinShop(K, { name: "Tobin Searle", email: fresh, password: "quarry-crane-password" });
    await actAs(null);
    const forExisting = await joinShop(K, { name: "Someone Else", email: existing.email, password: "some-other-password" });
    expect(forExisting).toEqual(forNew);

    const [account] = await db.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, existing.email));
    expect(account?.name).toBe(existing.name);
    expect(
      await db
        .select({ id: members.id })
        .from(members)
        .where(and(eq(members.shopId, shop.id), eq(members.userId, account!.id))),
    ).toEqual([]);

    const notices = () =>
      db
        .select()
        .from(emailOutbox)
        .where(and(eq(emailOutbox.shopId, shop.id), eq(emailOutbox.toEmail, existing.email), eq(emailOutbox.kind, "account-exists")));
    expect(await notices()).toHaveLength(1);
    // asking again the same day sends nothing more: the form cannot flood an inbox
    await actAs(null);
    expect(await joinShop(K, { name: "Someone Else", email: existing.email, password: "some-other-password" })).toEqual(forNew);
    const [row] = await notices();
    expect(await notices()).toHaveLength(1);

    const message = await buildOutboxMessage(row!);
    expect(message.subject).toBe("You already have an account — Kestrel Bank Works");
    expect(String(message.text).replace(/\s+/g, " ")).toContain("create a customer account at Kestrel Bank Works");
    expect(String(message.text)).toContain(`/sign-in?shop=${K}&next=%2Fs%2F${K}%2Fjoin`);
  });

  it("an e-mail typed with other case or spaces is the same existing account", async () => {
    await actAs(null);
    const r = await joinShop(K, { name: "Someone Else", email: `  ${existing.email.toUpperCase()} `, password: "some-other-password" });
    expect(r).toEqual({ ok: true, data: { slug: K } });
    expect(await db.select({ id: users.id }).from(users).where(eq(users.email, existing.email.toUpperCase()))).toEqual([]);
  });
});

describe("open-shop answers alike for a new and an existing e-mail", () => {
  it("same answer; no shop and no account for the existing e-mail; its owner is told by e-mail", async () => {
    const id = Date.now().toString(36);
    await actAs(null);
    const forNew = await openShop({
      name: "Ada Quill",
      email: `ada.${id}@north-coast.example`,
      password: "a-long-enough-password",
      shopName: "North Coast Banks",
      slug: `north-coast-${id}`,
      currency: "EUR",
    });
    await actAs(null);
    const slug = `north-coast-${id}-b`;
    const forExisting = await openShop({
      name: "Ada Quill",
      email: existing.email,
      password: "a-long-enough-password",
      shopName: "Westerly Banks",
      slug,
      currency: "EUR",
    });
    expect(forExisting).toEqual({ ok: true, data: { slug } });
    expect(forNew).toEqual({ ok: true, data: { slug: `north-coast-${id}` } });
    expect(await db.select({ id: shops.id }).from(shops).where(eq(shops.slug, slug))).toEqual([]);

    const mail = await inboxFor(existing.email, "You already have an account — opening a shop");
    expect(mail, "the notice in the mail stand-in's inbox").toBeDefined();
    expect(String(mail?.text).replace(/\s+/g, " ")).toContain("open a new shop, Westerly Banks");
  });

  it("still says at the field that a shop address is taken: addresses are public", async () => {
    await actAs(null);
    const r = await openShop({
      name: "Ada Quill",
      email: `ada.${Date.now()}@north-coast.example`,
      password: "a-long-enough-password",
      shopName: "Kestrel Again",
      slug: K,
      currency: "EUR",
    });
    expect(r).toMatchObject({ ok: false, code: "conflict", fieldErrors: { slug: ["That address is taken; choose another."] } });
  });
});
