import type { Metadata } from "next";
import Link from "next/link";
import { buttonClass } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { CELL_FIELDS } from "@/lib/catalog/cell-fields";
import { MAX_IMPORT_ROWS } from "@/lib/catalog/cell-csv";
import { shopCurrency } from "@/lib/catalog/edit";
import { ImportPanel } from "../_components/import-panel";

export const metadata: Metadata = { title: "Catalog CSV" };

/** Export the cells as CSV, download the template, read what each column takes, and import with a preview. */
export default async function CatalogCsvPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:read", `/desk/${shop}/catalog/import`);
  const currency = await shopCurrency(ctx.shop.id);
  const base = `/api/v1/shops/${shop}/cells.csv`;
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/catalog`} className="hover:underline">
          Catalog
        </Link>{" "}
        / CSV
      </nav>
      <PageHeader title="Export and import cells">
        Keep the catalog in a spreadsheet: export it, change it, import it back. The import shows what each row would do and changes nothing until you apply it;
        it adds and changes cells, and never deletes one (set active to false to retire a cell).
      </PageHeader>
      <div className="flex flex-wrap gap-3">
        <a href={base} className={buttonClass("secondary")} download>
          Export the catalog (CSV)
        </a>
        <a href={`${base}?template=1`} className={buttonClass("secondary")} download>
          Download the template
        </a>
      </div>
      {can(ctx.role, "catalog:write") ? <ImportPanel shop={shop} /> : null}
      <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:p-5" aria-labelledby="columns-title">
        <h2 id="columns-title" className="text-lg font-semibold">
          The columns
        </h2>
        <p className="mt-1 max-w-3xl text-sm text-ink-600">
          The first row names the columns, in any order; <span className="font-mono">sku</span> is required, and a file may leave out any other column to keep
          those values as they are (a new cell needs them all). Quantities are SI numbers (<span className="font-mono">0.00058</span>) or typed with their unit
          (<span className="font-mono">0.58 mΩ</span>); tolerances as <span className="font-mono">10 %</span> or <span className="font-mono">0.1</span>; money
          as decimals in {currency}, with a point and no currency sign. At most {MAX_IMPORT_ROWS.toLocaleString("en-GB")} rows per file. The API takes the same
          file at <span className="font-mono">POST {base}?dryRun=1</span>.
        </p>
        <dl className="mt-3 divide-y divide-ink-100 text-sm">
          {CELL_FIELDS.map((f) => (
            <div key={f.name} className="grid gap-1 py-2 sm:grid-cols-[12rem_1fr_9rem] sm:gap-3">
              <dt className="font-mono text-xs text-ink-900">{f.name}</dt>
              <dd>
                <span className="font-medium">{f.label}</span>
                {f.unit ? ` (${f.unit})` : f.kind === "money" ? ` (${currency})` : ""}. {f.help}
                {f.optional ? " Empty when the shape does not use it." : ""}
              </dd>
              <dd className="font-mono text-xs text-ink-600">{f.example ? `e.g. ${f.example}` : ""}</dd>
            </div>
          ))}
        </dl>
      </section>
    </div>
  );
}
