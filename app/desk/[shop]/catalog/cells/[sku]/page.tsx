import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/ui/page-header";
import { getCellBySku, getDatasheetBySku } from "@/db/queries/catalog-edit";
import { listMemberNames } from "@/db/queries/catalog-names";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { cellFormText, toCellRecord } from "@/lib/catalog/cell-fields";
import { listCostHistory, shopCurrency } from "@/lib/catalog/edit";
import { formatMoney } from "@/lib/pricing";
import { CellForm } from "../../_components/cell-form";
import { DatasheetPanel } from "../../_components/datasheet-panel";

export async function generateMetadata({ params }: { params: Promise<{ sku: string }> }): Promise<Metadata> {
  const { sku } = await params;
  return { title: `Cell ${decodeURIComponent(sku)}` };
}

/** One catalog cell: its form, its datasheet and its unit-cost history (who, when, old → new). */
export default async function CellPage({ params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku: rawSku } = await params;
  const sku = decodeURIComponent(rawSku);
  const ctx = await requireShopPage(shop, "catalog:read", `/desk/${shop}/catalog/cells/${rawSku}`);
  const row = await getCellBySku(ctx.shop.id, sku);
  if (!row) notFound();
  const [currency, history, datasheet, names] = await Promise.all([
    shopCurrency(ctx.shop.id),
    listCostHistory(ctx.shop.id, row.id, 50),
    getDatasheetBySku(ctx.shop.id, sku),
    listMemberNames(ctx.shop.id),
  ]);
  const record = toCellRecord(row);
  const canWrite = can(ctx.role, "catalog:write");
  const money = (a: string) => formatMoney(a, currency);
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/catalog`} className="hover:underline">
          Catalog
        </Link>{" "}
        / {sku}
      </nav>
      <PageHeader title={`${sku}${row.isActive ? "" : " (retired)"}`}>
        {row.manufacturer} {row.series} · version {row.version}. Changes apply to quotes made from now on; issued quotes keep the figures and prices they were
        issued with.
      </PageHeader>
      <CellForm shop={shop} currency={currency} initial={cellFormText(record)} version={row.version} canWrite={canWrite} />
      <div className="grid gap-6 lg:grid-cols-2">
        <DatasheetPanel
          shop={shop}
          sku={sku}
          canWrite={canWrite}
          current={
            datasheet ? { fileName: datasheet.fileName, sizeBytes: datasheet.sizeBytes, uploadedOn: datasheet.createdAt.toISOString().slice(0, 10) } : null
          }
        />
        <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="cost-history">
          <h2 id="cost-history" className="text-sm font-semibold text-ink-800">
            Unit-cost history
          </h2>
          {history.length === 0 ? (
            <p className="mt-2 text-sm text-ink-600">No change recorded yet.</p>
          ) : (
            <div className="scroll-cue" role="region" aria-label="Unit-cost history" tabIndex={0}>
              <table className="mt-2 w-full text-sm" data-testid="cost-history">
                <thead className="text-ink-600">
                  <tr>
                    <th scope="col" className="py-1 pr-3 text-left font-medium">
                      When (UTC)
                    </th>
                    <th scope="col" className="py-1 pr-3 text-left font-medium">
                      Who
                    </th>
                    <th scope="col" className="py-1 text-right font-medium">
                      Old → new
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {history.map((h, i) => (
                    <tr key={`${h.at.toISOString()}-${i}`} className="border-t border-ink-100">
                      <td className="num whitespace-nowrap py-1 pr-3">{h.at.toISOString().slice(0, 16).replace("T", " ")}</td>
                      <td className="py-1 pr-3">{h.actorKeyId ? "API key" : h.actorUserId ? (names.get(h.actorUserId) ?? "A former member") : "—"}</td>
                      <td className="num whitespace-nowrap py-1 text-right">
                        {h.from === null ? "added at" : `${money(h.from)} →`} {money(h.to)}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      </div>
    </div>
  );
}
