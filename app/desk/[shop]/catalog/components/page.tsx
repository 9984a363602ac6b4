import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { ListView } from "@/components/ui/list-controls";
import { PageHeader } from "@/components/ui/page-header";
import { listCatalogComponents } from "@/db/queries/catalog-edit";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { COMPONENT_KIND_LABELS, COMPONENT_KIND_VALUES, describeSpecs, type ComponentKind } from "@/lib/catalog/component-fields";
import { shopCurrency } from "@/lib/catalog/edit";
import { formatMoney } from "@/lib/pricing";
import { componentList } from "@/lib/validation/lists";

export const metadata: Metadata = { title: "Components" };

/** The parts other than cells: balancing boards, resistors by power class, interconnects, terminals, enclosures. */
export default async function ComponentsPage({
  params,
  searchParams,
}: {
  params: Promise<{ shop: string }>;
  searchParams: Promise<Record<string, string | string[]>>;
}) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:read", `/desk/${shop}/catalog/components`);
  const { query: q } = componentList.parse(await searchParams);
  const [page, currency] = await Promise.all([listCatalogComponents(ctx.shop.id, q), shopCurrency(ctx.shop.id)]);
  const state = componentList.state(`/desk/${shop}/catalog/components`, q, page);
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/catalog`} className="hover:underline">
          Catalog
        </Link>{" "}
        / Components
      </nav>
      <PageHeader title="Components">
        Parts a bank needs besides its cells. Resistors are priced by power class: a bank takes the smallest one rated for twice what it dissipates, and a bank
        that needs a larger one than the catalog holds goes to the estimators.
      </PageHeader>
      {can(ctx.role, "catalog:write") ? (
        <Link href={`/desk/${shop}/catalog/components/new`} className={buttonClass("primary")}>
          New component
        </Link>
      ) : null}
      <ListView
        state={state}
        caption="Catalog components"
        empty={{ none: "No components yet.", noMatch: "No components match." }}
        filters={[
          { name: "q", label: "Part number or name", value: q.q },
          {
            name: "kind",
            label: "Kind",
            value: q.kind,
            options: [{ value: "all", label: "All" }, ...COMPONENT_KIND_VALUES.map((k) => ({ value: k, label: COMPONENT_KIND_LABELS[k] }))],
          },
        ]}
        columns={[
          { label: "Part number", sortKey: "sku" },
          { label: "Kind", sortKey: "kind" },
          { label: "Name", sortKey: "name" },
          { label: "Figures" },
          { label: "Unit cost", sortKey: "cost", align: "right" },
          { label: "Stock", sortKey: "stock", align: "right" },
          { label: "Lead time", sortKey: "lead", align: "right" },
        ]}
      >
        {page.rows.map((c) => (
          <tr key={c.id} className={`border-t border-ink-100 ${c.isActive ? "" : "text-ink-500"}`}>
            <td className="whitespace-nowrap px-3 py-2 font-mono text-xs">
              <Link href={`/desk/${shop}/catalog/components/${encodeURIComponent(c.sku)}`} className="text-copper-600 hover:underline">
                {c.sku}
              </Link>
              {c.isActive ? "" : " (retired)"}
            </td>
            <td className="px-3 py-2">{COMPONENT_KIND_LABELS[c.kind as ComponentKind]}</td>
            <td className="px-3 py-2">{c.name}</td>
            <td className="px-3 py-2 text-ink-600">{describeSpecs(c.kind as ComponentKind, c.specs)}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{formatMoney(c.unitCost, currency)}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{c.stock}</td>
            <td className="num whitespace-nowrap px-3 py-2 text-right">{c.leadTimeDays} d</td>
          </tr>
        ))}
      </ListView>
    </div>
  );
}
