import { and, eq } from "drizzle-orm";
import { db } from "@/db";
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

export async function shopBySlug(slug: string) {
  const [shop] = await db.select().from(shops).where(eq(shops.slug, slug));
  if (!shop) throw new Error(`no shop ${slug}`);
  return shop;
}

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
