import "server-only";
import { and, asc, count, eq } from "drizzle-orm";
import { members, shops, users } from "@/db/schema";
import { withShop, withUser, type Tx } from "@/db/tx";
import type { Role } from "@/lib/auth/permissions";
import type { MemberListQuery } from "@/lib/validation/lists";
import { containsText, readPage, sortedBy, type Page } from "./paging";

interface MemberRow {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: Date;
}

const MEMBER_SORTS = { name: users.name, email: users.email, role: members.role, joined: members.createdAt };

/** A page of the shop's members, filtered and sorted; `total` counts the filtered set. */
export async function listMembers(shopId: string, q: MemberListQuery): Promise<Page<MemberRow>> {
  const where = and(eq(members.shopId, shopId), q.role === "all" ? undefined : eq(members.role, q.role), containsText(q.q, users.name, users.email));
  return withShop(shopId, (tx) =>
    readPage(
      q,
      () => tx.select({ n: count() }).from(members).innerJoin(users, eq(users.id, members.userId)).where(where),
      (limit, offset) =>
        tx
          .select({ id: members.id, userId: members.userId, name: users.name, email: users.email, role: members.role, joinedAt: members.createdAt })
          .from(members)
          .innerJoin(users, eq(users.id, members.userId))
          .where(where)
          .orderBy(...sortedBy(MEMBER_SORTS, q, asc(users.name), asc(members.id)))
          .limit(limit)
          .offset(offset),
    ),
  );
}

/** The member's role in the shop, read from the database on every request; null when not a member. */
export async function getMemberRole(shopId: string, userId: string): Promise<Role | null> {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({ role: members.role })
      .from(members)
      .where(and(eq(members.shopId, shopId), eq(members.userId, userId)))
      .limit(1),
  );
  return row?.role ?? null;
}

/** How many members a shop has (its founder is the first). */
export async function countMembers(shopId: string): Promise<number> {
  const [row] = await withShop(shopId, (tx) => tx.select({ n: count() }).from(members).where(eq(members.shopId, shopId)));
  return row?.n ?? 0;
}

/**
 * Every shop a person belongs to, with their role there. The one read across shops: it runs in
 * `withUser`, where the members table shows only this person's own rows (DEVELOPERS.md,
 * "Row-level security").
 */
export async function listShopsOfUser(userId: string): Promise<{ slug: string; name: string; role: Role }[]> {
  return withUser(userId, (tx) =>
    tx
      .select({ slug: shops.slug, name: shops.name, role: members.role })
      .from(members)
      .innerJoin(shops, eq(shops.id, members.shopId))
      .where(eq(members.userId, userId))
      .orderBy(asc(shops.name)),
  );
}

export async function getMember(shopId: string, memberId: string) {
  const [row] = await withShop(shopId, (tx) =>
    tx
      .select({ id: members.id, userId: members.userId, role: members.role, name: users.name, email: users.email })
      .from(members)
      .innerJoin(users, eq(users.id, members.userId))
      .where(and(eq(members.shopId, shopId), eq(members.id, memberId)))
      .limit(1),
  );
  return row ?? null;
}

/** Changes a member's role within the shop's transaction; another shop's member id is simply not found. */
export async function updateMemberRole(tx: Tx, shopId: string, memberId: string, role: Role) {
  const [row] = await tx
    .update(members)
    .set({ role })
    .where(and(eq(members.shopId, shopId), eq(members.id, memberId)))
    .returning({ id: members.id, role: members.role });
  return row ?? null;
}
