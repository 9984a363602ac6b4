import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { countActiveCellsByTechnology } from "@/db/queries/catalog";
import { getShopBySlug, getShopSettings } from "@/db/queries/shops";
import { getShopContext } from "@/lib/auth/context";
import { TECHNOLOGY_LABELS } from "@/lib/vocabulary";
import { StorefrontJourney } from "./_components/storefront-journey";
import type { Viewer } from "./_components/viewer";

export async function generateMetadata({ params }: { params: Promise<{ shop: string }> }): Promise<Metadata> {
  const shop = await getShopBySlug((await params).shop);
  return { title: shop ? `Design a bank with ${shop.name}` : "Design a bank" };
}

export default async function StorefrontPage({ params, searchParams }: { params: Promise<{ shop: string }>; searchParams: Promise<{ resume?: string }> }) {
  const { shop: slug } = await params;
  const sp = await searchParams;
  const r = await getShopContext(slug);
  if (r.status === "no-shop") notFound();
  const shop = r.status === "ok" ? r.ctx.shop : r.shop;
  const viewer: Viewer =
    r.status === "ok"
      ? r.ctx.role === "customer"
        ? { kind: "customer", email: r.ctx.user.email }
        : { kind: "staff", email: r.ctx.user.email }
      : r.status === "not-member"
        ? { kind: "not-member", email: r.user.email }
        : { kind: "visitor" };
  const [settings, families] = await Promise.all([getShopSettings(shop.id), countActiveCellsByTechnology(shop.id)]);
  return (
    <div className="space-y-8">
      <section>
        <h1 className="text-3xl font-semibold tracking-tight">{shop.name}</h1>
        {settings?.tagline ? <p className="mt-2 text-lg text-ink-600">{settings.tagline}</p> : null}
        {settings?.description ? <p className="mt-3 max-w-3xl text-sm text-ink-600">{settings.description}</p> : null}
      </section>
      <section aria-labelledby="stock">
        <h2 id="stock" className="text-sm font-semibold uppercase tracking-wide text-ink-500">
          Cell types in stock to build from
        </h2>
        <ul className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          {families.map((f) => (
            <li key={f.technology} className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
              <p className="text-2xl font-semibold num">{f.lines}</p>
              <p className="text-sm text-ink-600">
                {TECHNOLOGY_LABELS[f.technology]} cell {f.lines === 1 ? "type" : "types"}
              </p>
            </li>
          ))}
        </ul>
      </section>
      <StorefrontJourney slug={slug} shopName={shop.name} viewer={viewer} resume={sp.resume === "1"} />
    </div>
  );
}
