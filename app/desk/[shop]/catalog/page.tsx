import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listCatalogCells } from "@/db/queries/catalog";
import { getShopSettings } from "@/db/queries/shops";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { TECHNOLOGIES } from "@/lib/bank/types";
import { formatMoney } from "@/lib/pricing";
import { formatQuantity } from "@/lib/quantities";
import { catalogList } from "@/lib/validation/lists";
import { TECHNOLOGY_LABELS, TECHNOLOGY_SHORT } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Catalog" };

export default async function CatalogPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:read", `/desk/${shop}/catalog`);
  const { query: q } = catalogList.parse(await searchParams);
  const [page, settings] = await Promise.all([listCatalogCells(ctx.shop.id, q), getShopSettings(ctx.shop.id)]);
  const currency = settings?.currency ?? "EUR";
  const state = catalogList.state(`/desk/${shop}/catalog`, q, page);
  return (
    <div className="space-y-6">
      <PageHeader title="Catalog">
        Cells the engine builds from, with their unit costs, stock and lead times. Retired cells are never offered; issued quotes keep the figures they were
        issued with.
      </PageHeader>
      <div className="flex flex-wrap gap-3">
        {can(ctx.role, "catalog:write") ? (
          <Link href={`/desk/${shop}/catalog/cells/new`} className={buttonClass("primary")}>
            New cell
          </Link>
        ) : null}
        <Link href={`/desk/${shop}/catalog/import`} className={buttonClass("secondary")}>
          Export or import CSV
        </Link>
        <Link href={`/desk/${shop}/catalog/components`} className={buttonClass("secondary")}>
          Components: boards, resistors, enclosures…
        </Link>
      </div>
      <ListView
        state={state}
        caption="Catalog cells"
        empty={{ none: "No cells in the catalog yet.", noMatch: "No cells match." }}
        filters={[
          { name: "q", label: "SKU, maker or family", value: q.q },
          {
            name: "technology",
            label: "Technology",
            value: q.technology,
            options: [{ value: "all", label: "All" }, ...TECHNOLOGIES.map((t) => ({ value: t, label: TECHNOLOGY_LABELS[t] }))],
          },
        ]}
        columns={[
          { label: "SKU", sortKey: "sku" },
          { label: "Maker · family" },
          { label: "Technology" },
          { label: "Capacitance", sortKey: "capacitance" },
          { label: "Rated", sortKey: "voltage" },
          { label: "ESR", sortKey: "esr" },
          { label: "Unit cost", sortKey: "cost", align: "right" },
          { label: "Stock", sortKey: "stock", align: "right" },
          { label: "Lead time", sortKey: "lead", align: "right" },
        ]}
      >
        {page.rows.map((c) => (
          <tr key={c.id} className={`border-t border-ink-100 ${c.isActive ? "" : "text-ink-500"}`}>
            <td className="whitespace-nowrap px-3 py-2 font-mono text-xs">
              <Link href={`/desk/${shop}/catalog/cells/${encodeURIComponent(c.sku)}`} className="text-copper-600 hover:underline">
                {c.sku}
              </Link>
              {c.isActive ? "" : " (retired)"}
            </td>
            <td className="px-3 py-2">
              {c.manufacturer} · {c.series}
            </td>
            <td className="px-3 py-2" title={TECHNOLOGY_LABELS[c.technology]}>
              {TECHNOLOGY_SHORT[c.technology]}
            </td>
            <td className="num whitespace-nowrap px-3 py-2">
              {formatQuantity(c.capacitanceF, "F")}{" "}
              <span className="text-ink-500">
                −{c.toleranceMinusPct}/+{c.tolerancePlusPct} %
              </span>
            </td>
            <td className="num whitespace-nowrap px-3 py-2">{formatQuantity(c.ratedVoltageV, "V")}</td>
            <td className="num whitespace-nowrap px-3 py-2">{formatQuantity(c.esrOhm, "Ω")}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(c.unitCost, currency)}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{c.stock}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{c.leadTimeDays} d</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
