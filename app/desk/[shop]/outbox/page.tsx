import type { Metadata } from "next";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { StateCounts } from "@/components/ui/state-counts";
import { countOutboxByStatus, listOutbox } from "@/db/queries/outbox";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { outboxList } from "@/lib/validation/lists";
import { OUTBOX_STATUS_LABELS, OUTBOX_STATUSES } from "@/lib/vocabulary";
import { OutboxStatus } from "./_components/outbox-status";
import { SendAgainButton } from "./_components/send-again-button";

export const metadata: Metadata = { title: "Outbox" };

function when(d: Date | null): string {
  return d ? `${d.toISOString().slice(0, 16).replace("T", " ")} UTC` : "—";
}

export default async function OutboxPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "outbox:read", `/desk/${shop}/outbox`);
  const { query: q } = outboxList.parse(await searchParams);
  const [page, counts] = await Promise.all([listOutbox(ctx.shop.id, q), countOutboxByStatus(ctx.shop.id)]);
  const state = outboxList.state(`/desk/${shop}/outbox`, q, page);
  const mayRequeue = can(ctx.role, "outbox:requeue");
  return (
    <div className="space-y-6">
      <PageHeader title="Outbox">
        Every e-mail {ctx.shop.name} sends. A message that cannot be delivered waits and is tried again with growing pauses; after the last try it is marked
        failed with the reason{mayRequeue ? ", and you can send it again once the cause is fixed" : ""}.
      </PageHeader>
      <StateCounts label="Messages by state" states={OUTBOX_STATUSES} labels={OUTBOX_STATUS_LABELS} counts={counts} testId="outbox-count" />
      <ListView
        state={state}
        caption="E-mail messages"
        empty={{ none: "No e-mail yet: messages appear here when the shop issues a quote.", noMatch: "No messages match." }}
        filters={[
          { name: "q", label: "Recipient or subject", value: q.q },
          {
            name: "status",
            label: "State",
            value: q.status,
            options: [{ value: "all", label: "All states" }, ...OUTBOX_STATUSES.map((s) => ({ value: s, label: OUTBOX_STATUS_LABELS[s] }))],
          },
        ]}
        columns={[
          { label: "Created", sortKey: "created" },
          { label: "To", sortKey: "to" },
          { label: "Subject", sortKey: "subject" },
          { label: "State", sortKey: "status" },
          { label: "Attempts", sortKey: "attempts", align: "right" },
          { label: "Sent at", sortKey: "sent" },
        ]}
      >
        {page.rows.map((m) => (
          <tr key={m.id} className="border-t border-ink-100 align-top" data-testid={`outbox-${m.id}`}>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(m.createdAt)}</td>
            <td className="px-3 py-2">{m.toEmail}</td>
            <td className="px-3 py-2">{m.subject}</td>
            <td className="px-3 py-2">
              <OutboxStatus status={m.status} attempts={m.attempts} lastError={m.lastError} />
              {mayRequeue && m.status === "failed" ? <SendAgainButton shop={shop} outboxId={m.id} subject={m.subject} /> : null}
            </td>
            <td className="num px-3 py-2 text-right">{m.attempts}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(m.sentAt)}</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
