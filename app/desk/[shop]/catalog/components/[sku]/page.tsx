import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/ui/page-header";
import { getComponentBySku } from "@/db/queries/catalog-edit";
import { requireShopPage } from "@/lib/auth/guards";
import { can } from "@/lib/auth/permissions";
import { componentFormText, type ComponentKind } from "@/lib/catalog/component-fields";
import { shopCurrency } from "@/lib/catalog/edit";
import { ComponentForm } from "../../_components/component-form";

export async function generateMetadata({ params }: { params: Promise<{ sku: string }> }): Promise<Metadata> {
  const { sku } = await params;
  return { title: `Component ${decodeURIComponent(sku)}` };
}

export default async function ComponentPage({ params }: { params: Promise<{ shop: string; sku: string }> }) {
  const { shop, sku: rawSku } = await params;
  const sku = decodeURIComponent(rawSku);
  const ctx = await requireShopPage(shop, "catalog:read", `/desk/${shop}/catalog/components/${rawSku}`);
  const row = await getComponentBySku(ctx.shop.id, sku);
  if (!row) notFound();
  return (
    <div className="space-y-6">
      <nav aria-label="Breadcrumb" className="text-sm text-ink-600">
        <Link href={`/desk/${shop}/catalog/components`} className="hover:underline">
          Components
        </Link>{" "}
        / {sku}
      </nav>
      <PageHeader title={`${sku}${row.isActive ? "" : " (retired)"}`}>
        {row.name} · version {row.version}. Issued quotes keep the prices they were issued with.
      </PageHeader>
      <ComponentForm
        shop={shop}
        currency={await shopCurrency(ctx.shop.id)}
        initial={componentFormText({ ...row, kind: row.kind as ComponentKind })}
        version={row.version}
        canWrite={can(ctx.role, "catalog:write")}
      />
    </div>
  );
}
