import type { Metadata } from "next";
import { z } from "zod";
import { FilterForm, ListTable, Pager } from "@/components/ui/list-controls";
import { listCatalogCells } from "@/db/queries/catalog";
import { getShopSettings } from "@/db/queries/shops";
import { requireShopPage } from "@/lib/auth/guards";
import { formatMoney } from "@/lib/pricing";
import { TECHNOLOGIES } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";
import { TECHNOLOGY_LABELS, TECHNOLOGY_SHORT } from "@/lib/vocabulary";

export const metadata: Metadata = { title: "Catalog" };

const querySchema = z.object({
  q: z.string().trim().max(100).optional().default(""),
  technology: z.enum(["all", "edlc", "hybrid", "electrolytic", "film"]).optional().default("all"),
  sort: z.enum(["sku", "capacitance", "voltage", "cost", "stock"]).optional().default("sku"),
  dir: z.enum(["asc", "desc"]).optional().default("asc"),
  page: z.coerce.number().int().min(1).optional().default(1),
  size: z.coerce.number().int().min(5).max(100).optional().default(25),
});


export default async function CatalogPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<Record<string, string>> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:read");
  const parsed = querySchema.safeParse(await searchParams);
  const q = parsed.success ? parsed.data : querySchema.parse({});
  const [{ rows, total }, settings] = await Promise.all([listCatalogCells(ctx.shop.id, q), getShopSettings(ctx.shop.id)]);
  const currency = settings?.currency ?? "EUR";
  const base = `/desk/${shop}/catalog`;
  const keep = { q: q.q, technology: q.technology === "all" ? undefined : q.technology, sort: q.sort, dir: q.dir };
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">Catalog</h1>
        <p className="mt-1 text-sm text-ink-600">Cells the engine builds from. Editing and import arrive with the catalog tools; inactive cells are never offered.</p>
      </div>
      <FilterForm
        fields={[
          { name: "q", label: "SKU, maker or family", value: q.q },
          { name: "technology", label: "Technology", value: q.technology, options: [{ value: "all", label: "All" }, ...TECHNOLOGIES.map((t) => ({ value: t, label: TECHNOLOGY_LABELS[t] }))] },
        ]}
        sort={q.sort}
        dir={q.dir}
      />
      <ListTable
        base={base} params={keep} sort={q.sort} dir={q.dir}
        columns={[
          { label: "SKU", sortKey: "sku" },
          { label: "Maker · family" },
          { label: "Technology" },
          { label: "Capacitance", sortKey: "capacitance" },
          { label: "Rated", sortKey: "voltage" },
          { label: "ESR" },
          { label: "Unit cost", sortKey: "cost" },
          { label: "Stock", sortKey: "stock" },
          { label: "Lead time" },
        ]}
      >
            {rows.length === 0 ? (
              <tr>
                <td colSpan={9} className="px-3 py-6 text-center text-ink-500">No cells match.</td>
              </tr>
            ) : (
              rows.map((c) => (
                <tr key={c.id} className={`border-t border-ink-100 ${c.isActive ? "" : "text-ink-400"}`}>
                  <td className="px-3 py-2 font-mono text-xs">{c.sku}{c.isActive ? "" : " (inactive)"}</td>
                  <td className="px-3 py-2">{c.manufacturer} · {c.series}</td>
                  <td className="px-3 py-2" title={TECHNOLOGY_LABELS[c.technology]}>{TECHNOLOGY_SHORT[c.technology]}</td>
                  <td className="whitespace-nowrap px-3 py-2 num">{formatQuantity(c.capacitanceF, "F")} <span className="text-ink-400">−{c.toleranceMinusPct}/+{c.tolerancePlusPct} %</span></td>
                  <td className="whitespace-nowrap px-3 py-2 num">{formatQuantity(c.ratedVoltageV, "V")}</td>
                  <td className="whitespace-nowrap px-3 py-2 num">{formatQuantity(c.esrOhm, "Ω")}</td>
                  <td className="whitespace-nowrap px-3 py-2 num">{formatMoney(c.unitCost, currency)}</td>
                  <td className="whitespace-nowrap px-3 py-2 num">{c.stock}</td>
                  <td className="whitespace-nowrap px-3 py-2 num">{c.leadTimeDays} d</td>
                </tr>
              ))
            )}
          </ListTable>
      <Pager base={base} params={keep} page={q.page} size={q.size} total={total} />
    </div>
  );
}
