"use server";
import { revalidatePath } from "next/cache";
import { getMember, updateMemberRole } from "@/db/queries/members";
import { shopAction } from "@/lib/auth/guards";
import { changeMemberRoleSchema } from "@/lib/validation/auth";

/** A manager moves a member between estimator and customer. Managers and oneself are not changed here. */
export const changeMemberRole = shopAction(changeMemberRoleSchema, "team:update-role", async (ctx, input) => {
  const member = await getMember(ctx.shop.id, input.memberId);
  if (!member) return { ok: false, code: "not-found", message: "No such member in this shop." };
  if (member.userId === ctx.user.id) return { ok: false, code: "forbidden", message: "You cannot change your own role." };
  if (member.role === "manager") return { ok: false, code: "forbidden", message: "A manager's role is not changed from here." };
  const updated = await updateMemberRole(ctx.shop.id, input.memberId, input.role);
  if (!updated) return { ok: false, code: "not-found", message: "No such member in this shop." };
  revalidatePath(`/desk/${ctx.shop.slug}/team`);
  return { ok: true, data: { id: updated.id, role: updated.role } };
});
