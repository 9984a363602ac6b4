import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { requireShopPage } from "@/lib/auth/guards";
import { shopCurrency } from "@/lib/catalog/edit";
import { ComponentForm } from "../../_components/component-form";

export const metadata: Metadata = { title: "New component" };

export default async function NewComponentPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "catalog:write", `/desk/${shop}/catalog/components/new`);
  return (
    <div className="space-y-6">
      <PageHeader title="New component">A balancing board, resistor, interconnect, terminal set or enclosure, with the figures its kind needs.</PageHeader>
      <ComponentForm
        shop={shop}
        currency={await shopCurrency(ctx.shop.id)}
        initial={{ kind: "resistor", sku: "", name: "", unitCost: "", stock: "0", leadTimeDays: "0", active: "true", powerRatingW: "" }}
        canWrite
      />
    </div>
  );
}
