"use server";
import { revalidatePath } from "next/cache";
import { changedFields, recordAudit } from "@/db/queries/audit";
import { getMember, updateMemberRole } from "@/db/queries/members";
import { withShop } from "@/db/tx";
import { shopAction } from "@/lib/auth/guards";
import { changeMemberRoleSchema } from "@/lib/validation/auth";
import { ROLE_LABELS } from "@/lib/vocabulary";

/** A manager moves a member between estimator and customer. Managers and oneself are not changed here. */
export const changeMemberRole = shopAction(changeMemberRoleSchema, "team:update-role", async (ctx, input) => {
  const member = await getMember(ctx.shop.id, input.memberId);
  if (!member) return { ok: false, code: "not-found", message: "No such member in this shop." };
  if (member.userId === ctx.user.id) return { ok: false, code: "forbidden", message: "You cannot change your own role." };
  if (member.role === "manager") return { ok: false, code: "forbidden", message: "A manager's role is not changed from here." };
  const updated = await withShop(ctx.shop.id, async (tx) => {
    const row = await updateMemberRole(tx, ctx.shop.id, input.memberId, input.role);
    const changes = row && changedFields({ role: member.role }, { role: row.role });
    if (row && changes) {
      await recordAudit(tx, ctx.shop.id, {
        actorUserId: ctx.user.id,
        action: "member.role",
        subjectType: "member",
        subjectId: row.id,
        summary: `Role of ${member.name} (${member.email}) from ${ROLE_LABELS[member.role]} to ${ROLE_LABELS[row.role]}`,
        changes,
      });
    }
    return row;
  });
  if (!updated) return { ok: false, code: "not-found", message: "No such member in this shop." };
  revalidatePath(`/desk/${ctx.shop.slug}/team`);
  return { ok: true, data: { id: updated.id, role: updated.role } };
});
