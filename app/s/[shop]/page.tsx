import { count, eq, and } from "drizzle-orm";
import { notFound } from "next/navigation";
import { Placeholder } from "@/components/ui/placeholder";
import { db } from "@/db";
import { catalogCells } from "@/db/schema";
import { getShopSettings } from "@/db/queries/shops";
import { getShopBySlug } from "@/lib/auth/context";

const TECH_LABELS = { edlc: "Supercapacitor (EDLC)", hybrid: "Hybrid lithium-ion capacitor", electrolytic: "Aluminium electrolytic", film: "Film" } as const;

export default async function StorefrontPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop: slug } = await params;
  const shop = await getShopBySlug(slug);
  if (!shop) notFound();
  const settings = await getShopSettings(shop.id);
  const families = await db
    .select({ technology: catalogCells.technology, n: count() })
    .from(catalogCells)
    .where(and(eq(catalogCells.shopId, shop.id), eq(catalogCells.isActive, true)))
    .groupBy(catalogCells.technology);
  return (
    <div className="space-y-8">
      <section>
        <h1 className="text-3xl font-semibold tracking-tight">{shop.name}</h1>
        {settings?.tagline ? <p className="mt-2 text-lg text-ink-600">{settings.tagline}</p> : null}
        {settings?.description ? <p className="mt-3 max-w-3xl text-sm text-ink-600">{settings.description}</p> : null}
      </section>
      <section aria-labelledby="stock">
        <h2 id="stock" className="text-sm font-semibold uppercase tracking-wide text-ink-500">Cells in stock to build from</h2>
        <ul className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          {families.map((f) => (
            <li key={f.technology} className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
              <p className="text-2xl font-semibold num">{f.n}</p>
              <p className="text-sm text-ink-600">{TECH_LABELS[f.technology]}</p>
            </li>
          ))}
        </ul>
      </section>
      <Placeholder title="Describe your bank">
        <p>
          Here you will state what the bank must do — working and minimum voltage; capacitance, usable energy or backup power for a
          time; peak current and allowed voltage drop; size and mass limits; quantity — and compare the arrangements this shop can
          build, with charts, cautions and prices. Exploring needs no account; choosing an arrangement asks you to sign in.
        </p>
        <p>
          Until then the arrangement engine answers at <code className="font-mono text-xs">POST /api/v1/shops/{slug}/arrangements</code>.
        </p>
      </Placeholder>
    </div>
  );
}
