import type { Metadata } from "next";
import Link from "next/link";
import { FilterForm, ListTable, Pager } from "@/components/ui/list-controls";
import { listRequests } from "@/db/queries/requests";
import { requireShopPage } from "@/lib/auth/guards";
import { formatQuantity } from "@/lib/quantities";
import { requestListQuerySchema } from "@/lib/validation/quote";
import { REQUEST_STATUS_LABELS, type RequestStatus } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Requests" };

const BADGE: Record<RequestStatus, string> = {
  "needs-review": "font-semibold bg-hazard-100 text-hazard-700 ring-1 ring-hazard-500",
  quoted: "font-medium bg-charge-100 text-charge-700",
  closed: "font-medium bg-ink-100 text-ink-700",
};

function StatusBadge({ status }: { status: RequestStatus }) {
  return <span className={`inline-flex whitespace-nowrap rounded-full px-2 py-0.5 text-xs ${BADGE[status]}`}>{REQUEST_STATUS_LABELS[status]}</span>;
}

export default async function DeskRequestsPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "request:read-all");
  const q = requestListQuerySchema.parse(await searchParams);
  const { rows, total } = await listRequests(ctx.shop.id, q);
  const base = `/desk/${shop}/requests`;
  const keep = { status: q.status === "all" ? undefined : q.status, sort: q.sort, dir: q.dir, size: q.size === 20 ? undefined : q.size };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Requests</h1>
        <p className="mt-1 text-sm text-ink-600">Customers&apos; bank requests. Those beyond the shop&apos;s auto-quote limits, or with no option that fits, wait here for an estimator.</p>
      </div>
      <FilterForm
        fields={[
          { name: "status", label: "Status", value: q.status, options: [{ value: "all", label: "All" }, { value: "needs-review", label: "Needs review" }, { value: "quoted", label: "Quoted" }, { value: "closed", label: "Closed" }] }
        ]}
        sort={q.sort}
        dir={q.dir}
      />
      <ListTable
        base={base} params={keep} sort={q.sort} dir={q.dir}
        columns={[
          { label: "Received", sortKey: "created" },
          { label: "Customer" },
          { label: "Voltage", sortKey: "voltage" },
          { label: "Banks", align: "right" },
          { label: "Status", sortKey: "status" },
          { label: "Quote or reasons" },
        ]}
      >
            {rows.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-6 text-center text-ink-500">No requests match.</td>
              </tr>
            ) : (
              rows.map((r) => (
                <tr key={r.id} className={`border-t border-ink-100 align-top ${r.status === "needs-review" ? "bg-hazard-100/40" : ""}`} data-testid={`request-${r.id}`} data-status={r.status}>
                  <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                  <td className="px-3 py-2">
                    {r.customerName}
                    <span className="block text-xs text-ink-500">{r.customerEmail}</span>
                  </td>
                  <td className="num px-3 py-2">{formatQuantity(r.maxVoltage, "V")}</td>
                  <td className="num px-3 py-2 text-right">{r.quantity}</td>
                  <td className="px-3 py-2"><StatusBadge status={r.status} /></td>
                  <td className="px-3 py-2">
                    {r.quoteNumber ? (
                      <Link href={`/s/${shop}/quotes/${r.quoteNumber}`} className="font-medium text-copper-700 hover:underline">{r.quoteNumber}</Link>
                    ) : r.reviewReasons.length > 0 ? (
                      <ul className="list-disc space-y-0.5 pl-4 text-ink-700">
                        {r.reviewReasons.map((reason) => (
                          <li key={reason}>{reason}</li>
                        ))}
                      </ul>
                    ) : (
                      <span className="text-ink-500">—</span>
                    )}
                  </td>
                </tr>
              ))
            )}
          </ListTable>
      <Pager base={base} params={keep} page={q.page} size={q.size} total={total} />
    </div>
  );
}
