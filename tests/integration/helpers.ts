import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { Client } from "pg";
import { ownerDb as db } from "./owner-db";
import { members, shops, users } from "@/db/schema";
import { DEMO_PASSWORD } from "@/db/seed/people";
import { auth } from "@/lib/auth/server";

const state = globalThis as unknown as { __requestHeaders?: Headers };

/** Signs in through better-auth and returns the Cookie header a browser would send. */
export async function sessionCookie(email: string, password = DEMO_PASSWORD): Promise<string> {
  const response = await auth.api.signInEmail({ body: { email, password }, asResponse: true });
  if (!response.ok) throw new Error(`sign-in failed for ${email}: ${response.status}`);
  const cookies = response.headers.getSetCookie().map((c) => c.split(";")[0]);
  return cookies.join("; ");
}

/** Makes the following server-action calls run as this person (or signed out with null). */
export async function actAs(email: string | null) {
  state.__requestHeaders = email ? new Headers({ cookie: await sessionCookie(email) }) : new Headers();
  return state.__requestHeaders;
}

/** A demo shop as seeded into this file's copy of the test database (prefer createShop() for new tests). */
export async function shopBySlug(slug: string) {
  const [shop] = await db.select().from(shops).where(eq(shops.slug, slug));
  if (!shop) throw new Error(`no shop ${slug}`);
  return shop;
}

/** A member of a seeded demo shop, by e-mail. */
export async function memberOf(slug: string, email: string) {
  const shop = await shopBySlug(slug);
  const [row] = await db
    .select({ id: members.id, role: members.role, userId: members.userId })
    .from(members)
    .innerJoin(users, eq(users.id, members.userId))
    .where(and(eq(members.shopId, shop.id), eq(users.email, email)));
  if (!row) throw new Error(`no member ${email} in ${slug}`);
  return row;
}

export function request(url: string, init: RequestInit & { cookie?: string } = {}) {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set("cookie", init.cookie);
  return new Request(new URL(url, "http://127.0.0.1:3100"), { ...init, headers });
}

function isElement(node: unknown): node is { type: unknown; props: unknown } {
  return typeof node === "object" && node !== null && "type" in node && "props" in node;
}

/**
 * What a page answers: "ok" when it renders, "403" or "404" for the not-allowed and not-found
 * pages, or "redirect <url>" (pages refuse by throwing Next's control-flow errors).
 */
export async function pageAnswer(render: () => Promise<unknown>): Promise<string> {
  try {
    // a page that hands its work to a server component: render that one too
    let node = await render();
    for (let depth = 0; depth < 3 && isElement(node) && typeof node.type === "function"; depth++)
      node = await (node.type as (p: unknown) => unknown)(node.props);
    return "ok";
  } catch (error) {
    const digest = (error as { digest?: unknown }).digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_HTTP_ERROR_FALLBACK;")) return digest.split(";")[1] ?? digest;
    if (typeof digest === "string" && digest.startsWith("NEXT_REDIRECT;")) return `redirect ${digest.split(";")[2] ?? ""}`;
    throw error;
  }
}

/** Runs one statement on the test cluster's maintenance database (CREATE DATABASE, DROP DATABASE, …). */
export async function adminStatement(statement: string): Promise<void> {
  const url = new URL(process.env.DATABASE_URL ?? "");
  url.pathname = "/postgres";
  const client = new Client({ connectionString: url.toString() });
  await client.connect();
  try {
    await client.query(statement);
  } finally {
    await client.end();
  }
}

/** Polls until `check` holds; the limit only bounds a broken run, it measures nothing. */
export async function waitFor<T>(what: string, read: () => Promise<T> | T, check: (value: T) => boolean, limitMs = 45_000): Promise<T> {
  const until = Date.now() + limitMs;
  for (;;) {
    const value = await read();
    if (check(value)) return value;
    if (Date.now() > until) throw new Error(`gave up waiting for ${what}; last seen ${JSON.stringify(value)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Text of a PDF as poppler's pdftotext (an independent PDF reader) extracts it. */
export function pdfToText(buffer: Buffer): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "quote-pdf-"));
  try {
    fs.writeFileSync(path.join(dir, "q.pdf"), buffer);
    return execFileSync("pdftotext", ["-layout", path.join(dir, "q.pdf"), "-"], { encoding: "utf8" });
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
