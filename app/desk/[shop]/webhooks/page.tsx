import type { Metadata } from "next";
import Link from "next/link";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listWebhookEndpoints } from "@/db/queries/webhooks";
import { requireShopPage } from "@/lib/auth/guards";
import { webhookEndpointList } from "@/lib/validation/lists";
import { MAX_WEBHOOK_ENDPOINTS } from "@/lib/validation/webhooks";
import { WEBHOOK_ENDPOINT_STATE_LABELS, WEBHOOK_ENDPOINT_STATES } from "@/lib/vocabulary";
import { EndpointForm } from "./_components/endpoint-form";
import { when } from "./_components/when";

export const metadata: Metadata = { title: "Webhooks" };

export default async function WebhooksPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "webhook:manage", `/desk/${shop}/webhooks`);
  const { query: q } = webhookEndpointList.parse(await searchParams);
  const page = await listWebhookEndpoints(ctx.shop.id, q);
  const state = webhookEndpointList.state(`/desk/${shop}/webhooks`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="Webhooks">
        Your own systems (ERP, stock, production planning) hear when a quote is issued or accepted, an order moves, a payment is refunded or a catalog is
        imported: Faradsmith sends each event, signed, to the addresses below and tries again with growing pauses until they answer. How to check a signature is
        in the{" "}
        <Link href="/docs/api#webhooks" className="font-medium text-copper-700 hover:underline">
          API reference
        </Link>
        .
      </PageHeader>
      <section aria-labelledby="add-endpoint" className="max-w-2xl space-y-3 rounded-lg bg-white p-5 ring-1 ring-ink-100">
        <h2 id="add-endpoint" className="font-semibold">
          Add an endpoint
        </h2>
        <p className="text-sm text-ink-600">At most {MAX_WEBHOOK_ENDPOINTS} per shop. Each gets its own signing secret, shown once.</p>
        <EndpointForm shop={shop} />
      </section>
      <ListView
        state={state}
        caption="Webhook endpoints"
        empty={{ none: "No endpoints yet: add the address of a system that should hear of the shop's events.", noMatch: "No endpoints match." }}
        filters={[
          { name: "q", label: "Address or note", value: q.q },
          {
            name: "state",
            label: "State",
            value: q.state,
            options: [{ value: "all", label: "All" }, ...WEBHOOK_ENDPOINT_STATES.map((s) => ({ value: s, label: WEBHOOK_ENDPOINT_STATE_LABELS[s] }))],
          },
        ]}
        columns={[
          { label: "Address", sortKey: "url" },
          { label: "Events" },
          { label: "State", sortKey: "state" },
          { label: "Failing since", sortKey: "failing" },
          { label: "Added", sortKey: "created" },
        ]}
      >
        {page.rows.map((e) => (
          <tr key={e.id} className="border-t border-ink-100 align-top" data-testid={`webhook-${e.id}`}>
            <td className="px-3 py-2">
              <Link href={`/desk/${shop}/webhooks/${e.id}`} className="break-all font-medium text-copper-700 hover:underline">
                {e.url}
              </Link>
              {e.description ? <p className="text-xs text-ink-600">{e.description}</p> : null}
            </td>
            <td className="px-3 py-2 font-mono text-xs">{e.events.join(", ")}</td>
            <td className="px-3 py-2">{WEBHOOK_ENDPOINT_STATE_LABELS[e.state]}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(e.failingSince)}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(e.createdAt)}</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
