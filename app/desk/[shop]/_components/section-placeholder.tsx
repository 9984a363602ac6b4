import { Placeholder } from "@/components/ui/placeholder";
import { requireShopPage } from "@/lib/auth/guards";
import { sectionFor } from "./desk-sections";

/** A desk page that later work fills: guarded by its permission, saying what it will hold. */
export async function SectionPlaceholder({ shop, path, children }: { shop: string; path: string; children: React.ReactNode }) {
  const section = sectionFor(path);
  await requireShopPage(shop, section.permission);
  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold">{section.label}</h1>
        <p className="mt-1 text-sm text-ink-600">{section.summary}</p>
      </div>
      <Placeholder title="Coming to this page">{children}</Placeholder>
    </div>
  );
}
