import type { Metadata } from "next";
import { FilterForm, ListTable, Pager } from "@/components/ui/list-controls";
import { countOutboxByStatus, listOutbox } from "@/db/queries/outbox";
import { requireShopPage } from "@/lib/auth/guards";
import { outboxListSchema } from "@/lib/validation/outbox";
import { OutboxStatus } from "./_components/outbox-status";

export const metadata: Metadata = { title: "Outbox" };

function when(d: Date | null): string {
  return d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "—";
}

export default async function OutboxPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "outbox:read");
  const parsed = outboxListSchema.safeParse(await searchParams);
  const q = parsed.success ? parsed.data : outboxListSchema.parse({});
  const [{ rows, total }, counts] = await Promise.all([listOutbox(ctx.shop.id, q), countOutboxByStatus(ctx.shop.id)]);
  const base = `/desk/${shop}/outbox`;
  const keep = { q: q.q, status: q.status === "all" ? undefined : q.status, sort: q.sort, dir: q.dir, size: q.size === 20 ? undefined : q.size };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Outbox</h1>
        <p className="mt-1 text-sm text-ink-600">
          Every e-mail {ctx.shop.name} sends. A message that cannot be delivered waits and is tried again with growing pauses; after the last try it is marked failed with the reason.
        </p>
      </div>
      <dl className="flex flex-wrap gap-3 text-sm" aria-label="Messages by state">
        {(["waiting", "sent", "failed"] as const).map((s) => (
          <div key={s} className="rounded-lg bg-white px-4 py-2 ring-1 ring-ink-100">
            <dt className="text-xs text-ink-600">{s === "waiting" ? "Waiting" : s === "sent" ? "Sent" : "Failed"}</dt>
            <dd className="num text-lg font-semibold" data-testid={`outbox-count-${s}`}>{counts[s]}</dd>
          </div>
        ))}
      </dl>
      <FilterForm
        fields={[
          { name: "q", label: "Recipient or subject", value: q.q },
          { name: "status", label: "State", value: q.status, options: [{ value: "all", label: "All states" }, { value: "waiting", label: "Waiting" }, { value: "sent", label: "Sent" }, { value: "failed", label: "Failed" }] }
        ]}
        sort={q.sort}
        dir={q.dir}
      />
      <ListTable
        base={base} params={keep} sort={q.sort} dir={q.dir}
        columns={[
          { label: "Created", sortKey: "created" },
          { label: "To", sortKey: "to" },
          { label: "Subject", sortKey: "subject" },
          { label: "State", sortKey: "status" },
          { label: "Attempts", sortKey: "attempts" },
          { label: "Sent at", sortKey: "sent" },
        ]}
      >
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-6 text-center text-ink-500">{total === 0 && !q.q && q.status === "all" ? "No e-mail yet: messages appear here when the shop issues a quote." : "No messages match."}</td>
              </tr>
            ) : (
              rows.map((m) => (
                <tr key={m.id} className="border-t border-ink-100 align-top" data-testid={`outbox-${m.id}`}>
                  <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(m.createdAt)}</td>
                  <td className="px-3 py-2">{m.toEmail}</td>
                  <td className="px-3 py-2">{m.subject}</td>
                  <td className="px-3 py-2">
                    <OutboxStatus status={m.status} attempts={m.attempts} lastError={m.lastError} />
                  </td>
                  <td className="num px-3 py-2 text-right">{m.attempts}</td>
                  <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(m.sentAt)}</td>
                </tr>
              ))
            )}
          </ListTable>
      <Pager base={base} params={keep} page={q.page} size={q.size} total={total} />
    </div>
  );
}
