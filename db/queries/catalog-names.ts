import "server-only";
import { eq } from "drizzle-orm";
import { members, users } from "@/db/schema";
import { withShop } from "@/db/tx";

/** The names of the shop's members by user id (for "who" columns of histories). */
export async function listMemberNames(shopId: string): Promise<Map<string, string>> {
  const rows = await withShop(shopId, (tx) =>
    tx.select({ id: users.id, name: users.name }).from(members).innerJoin(users, eq(users.id, members.userId)).where(eq(members.shopId, shopId)),
  );
  return new Map(rows.map((r) => [r.id, r.name]));
}
