import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { StateCounts } from "@/components/ui/state-counts";
import { countDeliveriesByState, getWebhookEndpoint, listWebhookDeliveries } from "@/db/queries/webhooks";
import { requireShopPage } from "@/lib/auth/guards";
import { webhookDeliveryList } from "@/lib/validation/lists";
import { SHOP_EVENT_TYPES, WEBHOOK_DELIVERY_STATE_LABELS, WEBHOOK_DELIVERY_STATES, WEBHOOK_ENDPOINT_STATE_LABELS } from "@/lib/vocabulary";
import { DeliveryState } from "../_components/delivery-state";
import { EndpointControls, ReplayButton } from "../_components/endpoint-controls";
import { EndpointForm } from "../_components/endpoint-form";
import { when } from "../_components/when";

export const metadata: Metadata = { title: "Webhook endpoint" };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export default async function WebhookEndpointPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string; id: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop, id } = await params;
  const ctx = await requireShopPage(shop, "webhook:manage", `/desk/${shop}/webhooks/${id}`);
  const endpoint = UUID.test(id) ? await getWebhookEndpoint(ctx.shop.id, id) : null;
  if (!endpoint) notFound();
  const { query: q } = webhookDeliveryList.parse(await searchParams);
  const [page, counts] = await Promise.all([listWebhookDeliveries(ctx.shop.id, id, q), countDeliveriesByState(ctx.shop.id, id)]);
  const state = webhookDeliveryList.state(`/desk/${shop}/webhooks/${id}`, q, page);
  return (
    <div className="space-y-6">
      <p className="text-sm">
        <Link href={`/desk/${shop}/webhooks`} className="text-copper-700 hover:underline">
          ← Webhooks
        </Link>
      </p>
      <PageHeader title={<span className="break-all">{endpoint.url}</span>}>
        {WEBHOOK_ENDPOINT_STATE_LABELS[endpoint.state]}
        {endpoint.state === "disabled" && endpoint.disabledReason ? ` — ${endpoint.disabledReason}` : ""}
        {endpoint.state === "active" && endpoint.failingSince ? ` — every attempt has failed since ${when(endpoint.failingSince)}` : ""}
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-2">
        <section aria-labelledby="settings" className="space-y-3 rounded-lg bg-white p-5 ring-1 ring-ink-100">
          <h2 id="settings" className="font-semibold">
            Settings
          </h2>
          <EndpointForm shop={shop} endpoint={{ id: endpoint.id, url: endpoint.url, description: endpoint.description, events: endpoint.events }} />
        </section>
        <section aria-labelledby="sending" className="space-y-3 rounded-lg bg-white p-5 ring-1 ring-ink-100">
          <h2 id="sending" className="font-semibold">
            Sending
          </h2>
          <p className="text-sm text-ink-600">
            A delivery that fails is tried again after 30 s, then after waits that double up to 6 hours, for about three days. An endpoint whose every attempt
            has failed for three days is stopped and the shop&apos;s managers are told by e-mail.
          </p>
          <EndpointControls shop={shop} id={endpoint.id} state={endpoint.state} secretHint={endpoint.secretHint} />
        </section>
      </div>
      <section aria-labelledby="log" className="space-y-3">
        <h2 id="log" className="text-lg font-semibold">
          Delivery log
        </h2>
        <StateCounts label="Deliveries by state" states={WEBHOOK_DELIVERY_STATES} labels={WEBHOOK_DELIVERY_STATE_LABELS} counts={counts} testId="deliveries" />
        <ListView
          state={state}
          caption="Deliveries to this endpoint"
          empty={{ none: "Nothing sent yet: deliveries appear here when the shop has an event this endpoint takes.", noMatch: "No deliveries match." }}
          filters={[
            { name: "q", label: "Event id or type", value: q.q },
            {
              name: "state",
              label: "State",
              value: q.state,
              options: [{ value: "all", label: "All states" }, ...WEBHOOK_DELIVERY_STATES.map((s) => ({ value: s, label: WEBHOOK_DELIVERY_STATE_LABELS[s] }))],
            },
            {
              name: "event",
              label: "Event",
              value: q.event,
              options: [{ value: "all", label: "All events" }, ...SHOP_EVENT_TYPES.map((t) => ({ value: t, label: t }))],
            },
          ]}
          columns={[
            { label: "Created", sortKey: "created" },
            { label: "Event" },
            { label: "State", sortKey: "state" },
            { label: "Attempts", sortKey: "attempts", align: "right" },
            { label: "Response", sortKey: "code", align: "right" },
            { label: "Duration", sortKey: "duration", align: "right" },
            { label: "Next attempt", sortKey: "next" },
            { label: "Actions" },
          ]}
        >
          {page.rows.map((d) => (
            <tr key={d.id} className="border-t border-ink-100 align-top" data-testid={`delivery-${d.id}`}>
              <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(d.createdAt)}</td>
              <td className="px-3 py-2">
                <code className="font-mono text-xs">{d.eventType}</code>
                {d.isReplay ? <span className="ml-1 text-xs text-ink-500">(sent again)</span> : null}
                <p className="font-mono text-[11px] text-ink-500">{d.eventId}</p>
              </td>
              <td className="px-3 py-2">
                <DeliveryState d={d} />
              </td>
              <td className="num px-3 py-2 text-right">{d.attempts}</td>
              <td className="num px-3 py-2 text-right">{d.lastStatusCode ?? "—"}</td>
              <td className="num px-3 py-2 text-right">{d.lastDurationMs === null ? "—" : `${d.lastDurationMs} ms`}</td>
              <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{when(d.nextAttemptAt)}</td>
              <td className="px-3 py-2 text-right">
                {endpoint.state === "active" && d.state !== "waiting" && d.state !== "retrying" ? <ReplayButton shop={shop} deliveryId={d.id} /> : null}
              </td>
            </tr>
          ))}
        </ListView>
      </section>
    </div>
  );
}
