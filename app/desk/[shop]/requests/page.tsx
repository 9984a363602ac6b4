import type { Metadata } from "next";
import Link from "next/link";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listRequests } from "@/db/queries/requests";
import { requireShopPage } from "@/lib/auth/guards";
import { requestList } from "@/lib/validation/lists";
import { describeRequirement, reasonWords, REQUEST_STATUS_LABELS, REQUEST_STATUSES, type RequestStatus } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Requests" };

const BADGE: Record<RequestStatus, string> = {
  "needs-review": "font-semibold bg-hazard-100 text-hazard-700 ring-1 ring-hazard-500",
  quoted: "font-medium bg-charge-100 text-charge-700",
  closed: "font-medium bg-ink-100 text-ink-700",
};

export default async function DeskRequestsPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "request:read-all", `/desk/${shop}/requests`);
  const { query: q } = requestList.parse(await searchParams);
  const page = await listRequests(ctx.shop.id, q);
  const state = requestList.state(`/desk/${shop}/requests`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="Requests">
        Customers&apos; bank requests. Those beyond the shop&apos;s auto-quote limits, with no option that fits, or whose customer asked for a change to their
        quote, wait here for an estimator: open one to quote it in the workbench.
      </PageHeader>
      <ListView
        state={state}
        caption="Requests"
        empty={{ none: "No requests yet: they appear here when a customer chooses an arrangement or asks for a review.", noMatch: "No requests match." }}
        filters={[
          { name: "q", label: "Customer", value: q.q },
          {
            name: "status",
            label: "Status",
            value: q.status,
            options: [{ value: "all", label: "All" }, ...REQUEST_STATUSES.map((s) => ({ value: s, label: REQUEST_STATUS_LABELS[s] }))],
          },
        ]}
        columns={[
          { label: "Received", sortKey: "created" },
          { label: "Customer", sortKey: "customer" },
          { label: "Requirement", sortKey: "voltage" },
          { label: "Status", sortKey: "status" },
          { label: "Quote or reasons" },
        ]}
      >
        {page.rows.map((r) => (
          <tr
            key={r.id}
            className={`border-t border-ink-100 align-top ${r.status === "needs-review" ? "bg-hazard-100/40" : ""}`}
            data-testid={`request-${r.id}`}
            data-status={r.status}
          >
            <td className="num whitespace-nowrap px-3 py-2 text-ink-600">{r.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
            <td className="px-3 py-2">
              <Link
                href={`/desk/${shop}/requests/${r.id}`}
                className="font-medium text-copper-700 hover:underline"
                aria-label={`Open the request of ${r.customerName} in the workbench`}
              >
                {r.customerName}
              </Link>
              <span className="block text-xs text-ink-500">{r.customerEmail}</span>
            </td>
            <td className="num px-3 py-2">{describeRequirement(r.requirement)}</td>
            <td className="px-3 py-2">
              <span className={`inline-flex whitespace-nowrap rounded-full px-2 py-0.5 text-xs ${BADGE[r.status]}`}>{REQUEST_STATUS_LABELS[r.status]}</span>
              {r.status === "needs-review" ? (
                <Link href={`/desk/${shop}/requests/${r.id}`} className="mt-1 block text-xs font-medium text-copper-700 hover:underline">
                  Review in the workbench
                </Link>
              ) : null}
            </td>
            <td className="px-3 py-2">
              {r.quoteNumber ? (
                <Link href={`/desk/${shop}/quotes/${r.quoteNumber}`} className="font-medium text-copper-700 hover:underline">
                  {r.quoteNumber}
                </Link>
              ) : r.reviewReasons.length > 0 ? (
                <ul className="list-disc space-y-0.5 pl-4 text-ink-700">
                  {r.reviewReasons.map((reason) => (
                    <li key={reason}>{reasonWords(reason)}</li>
                  ))}
                </ul>
              ) : (
                <span className="text-ink-500">—</span>
              )}
            </td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
