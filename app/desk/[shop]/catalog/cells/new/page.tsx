import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { requireShopPage } from "@/lib/auth/guards";
import { CELL_FIELDS, type CellFieldName } from "@/lib/catalog/cell-fields";
import { shopCurrency } from "@/lib/catalog/edit";
import { CellForm } from "../../_components/cell-form";

export const metadata: Metadata = { title: "New cell" };

/** A new catalog cell: every field typed with its unit. */
export default async function NewCellPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:write", `/desk/${shop}/catalog/cells/new`);
  const empty = Object.fromEntries(CELL_FIELDS.map((f) => [f.name, ""])) as Record<CellFieldName, string>;
  return (
    <div className="space-y-6">
      <PageHeader title="New cell">
        Type each figure with its unit — 2.7 V, 3000 F, 0.29 mΩ, 10 %, 60 mm. The engine offers the cell as soon as it is saved and offered.
      </PageHeader>
      <CellForm
        shop={shop}
        currency={await shopCurrency(ctx.shop.id)}
        initial={{ ...empty, technology: "edlc", shape: "cylinder", stock: "0", leadTimeDays: "0", active: "true" }}
        canWrite
      />
    </div>
  );
}
