import type { Metadata } from "next";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listMembers } from "@/db/queries/members";
import { requireShopPage } from "@/lib/auth/guards";
import { ROLES } from "@/lib/auth/permissions";
import { memberList } from "@/lib/validation/lists";
import { ROLE_LABELS, ROLE_PLURALS } from "@/lib/vocabulary";
import { RoleSelect } from "./_components/role-select";

export const metadata: Metadata = { title: "Team" };

export default async function TeamPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "team:read", `/desk/${shop}/team`);
  const { query: q } = memberList.parse(await searchParams);
  const page = await listMembers(ctx.shop.id, q);
  const state = memberList.state(`/desk/${shop}/team`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="Team">Everyone with access to {ctx.shop.name}. You can move a member between estimator and customer.</PageHeader>
      <ListView
        state={state}
        caption="Members"
        empty={{ none: "No members yet.", noMatch: "No members match." }}
        filters={[
          { name: "q", label: "Name or e-mail", value: q.q },
          {
            name: "role",
            label: "Role",
            value: q.role,
            options: [{ value: "all", label: "All roles" }, ...ROLES.map((r) => ({ value: r, label: ROLE_PLURALS[r] }))],
          },
        ]}
        columns={[
          { label: "Name", sortKey: "name" },
          { label: "E-mail", sortKey: "email" },
          { label: "Role", sortKey: "role" },
          { label: "Joined", sortKey: "joined" },
        ]}
      >
        {page.rows.map((m) => (
          <tr key={m.id} className="border-t border-ink-100" data-testid={`member-${m.email}`}>
            <td className="px-3 py-2 font-medium">{m.name}</td>
            <td className="px-3 py-2">{m.email}</td>
            <td className="px-3 py-2">
              {m.role === "manager" || m.userId === ctx.user.id ? ROLE_LABELS[m.role] : <RoleSelect shop={shop} memberId={m.id} name={m.name} role={m.role} />}
            </td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{m.joinedAt.toISOString().slice(0, 10)}</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
