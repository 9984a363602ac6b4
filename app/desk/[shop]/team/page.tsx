import type { Metadata } from "next";
import { listMembers } from "@/db/queries/members";
import { requireShopPage } from "@/lib/auth/guards";
import { ROLE_LABELS } from "@/lib/vocabulary";
import { memberListSchema } from "@/lib/validation/auth";
import { FilterForm, ListTable, Pager } from "@/components/ui/list-controls";
import { RoleSelect } from "./_components/role-select";

export const metadata: Metadata = { title: "Team" };

export default async function TeamPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "team:read");
  const parsed = memberListSchema.safeParse(await searchParams);
  const q = parsed.success ? parsed.data : memberListSchema.parse({});
  const { rows, total } = await listMembers(ctx.shop.id, q);
  const base = `/desk/${shop}/team`;
  const keep = { q: q.q, role: q.role === "all" ? undefined : q.role, sort: q.sort, dir: q.dir, size: q.size === 20 ? undefined : q.size };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Team</h1>
        <p className="mt-1 text-sm text-ink-600">Everyone with access to {ctx.shop.name}. You can move a member between estimator and customer.</p>
      </div>
      <FilterForm
        fields={[
          { name: "q", label: "Name or e-mail", value: q.q },
          { name: "role", label: "Role", value: q.role, options: [{ value: "all", label: "All roles" }, { value: "manager", label: "Managers" }, { value: "estimator", label: "Estimators" }, { value: "customer", label: "Customers" }] }
        ]}
        sort={q.sort}
        dir={q.dir}
      />
      <ListTable
        base={base} params={keep} sort={q.sort} dir={q.dir}
        columns={[
          { label: "Name", sortKey: "name" },
          { label: "E-mail", sortKey: "email" },
          { label: "Role", sortKey: "role" },
          { label: "Joined", sortKey: "joined" },
        ]}
      >
            {rows.length === 0 ? (
              <tr>
                <td colSpan={4} className="px-3 py-6 text-center text-ink-500">No members match.</td>
              </tr>
            ) : (
              rows.map((m) => (
                <tr key={m.id} className="border-t border-ink-100" data-testid={`member-${m.email}`}>
                  <td className="px-3 py-2 font-medium">{m.name}</td>
                  <td className="px-3 py-2">{m.email}</td>
                  <td className="px-3 py-2">
                    {m.role === "manager" || m.userId === ctx.user.id ? (
                      ROLE_LABELS[m.role]
                    ) : (
                      <RoleSelect shop={shop} memberId={m.id} name={m.name} role={m.role} />
                    )}
                  </td>
                  <td className="px-3 py-2 num text-ink-600">{m.joinedAt.toISOString().slice(0, 10)}</td>
                </tr>
              ))
            )}
          </ListTable>
      <Pager base={base} params={keep} page={q.page} size={q.size} total={total} />
    </div>
  );
}
