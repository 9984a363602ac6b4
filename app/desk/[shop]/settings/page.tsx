import { ReliabilitySettingsPanel } from "@/components/settings/reliability-settings-panel";
import { requireShopPage } from "@/lib/auth/guards";
import { SectionPlaceholder } from "../_components/section-placeholder";

export default async function Page({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  await requireShopPage(shop, "settings:write");
  return (
    <div className="space-y-6">
      <SectionPlaceholder shop={shop} path="settings">
        <p>
          Design factors (capacitance fade, ESR growth, voltage derating, cell matching, balancing factor, resistor series, safe voltage and time), auto-quote
          limits and the storefront's text and currency.
        </p>
      </SectionPlaceholder>
      <ReliabilitySettingsPanel shopSlug={shop} />
    </div>
  );
}
