import "server-only";
import { and, asc, eq } from "drizzle-orm";
import { members, shops, users } from "@/db/schema";
import { withShop } from "@/db/tx";

/** Whom a shop's e-mail comes from: the shop's name, and its first manager's address for replies. */
export async function getShopSender(shopId: string): Promise<{ shopName: string; replyTo: string | null } | null> {
  return withShop(shopId, async (tx) => {
    const [shop] = await tx.select({ name: shops.name }).from(shops).where(eq(shops.id, shopId));
    if (!shop) return null;
    const [manager] = await tx
      .select({ email: users.email })
      .from(members)
      .innerJoin(users, eq(users.id, members.userId))
      .where(and(eq(members.shopId, shopId), eq(members.role, "manager")))
      .orderBy(asc(members.createdAt), asc(members.id))
      .limit(1);
    return { shopName: shop.name, replyTo: manager?.email ?? null };
  });
}
