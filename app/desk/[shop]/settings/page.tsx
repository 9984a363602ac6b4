import type { Metadata } from "next";
import { PageHeader } from "@/components/ui/page-header";
import { getShopSettings } from "@/db/queries/shops";
import { listRecentQuotedArrangements } from "@/db/queries/pricing-rules";
import { requireShopPage } from "@/lib/auth/guards";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import { settingsFormText, type SampleRequirement } from "@/lib/validation/design-settings";
import { SettingsForm } from "./_components/settings-form";

export const metadata: Metadata = { title: "Settings" };

/** Design factors and auto-quote limits (DESIGN.md §3.2), with a preview on a sample requirement. */
export default async function SettingsPage({ params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  const ctx = await requireShopPage(shop, "settings:write", `/desk/${shop}/settings`);
  const [settings, [last]] = await Promise.all([getShopSettings(ctx.shop.id), listRecentQuotedArrangements(ctx.shop.id, 1)]);
  const r = last?.requirement;
  // the shop's latest quote is the most telling sample; without one, a small module
  const sample: SampleRequirement = r
    ? {
        maxVoltage: formatQuantity(r.maxVoltage, "V", { digits: 6 }),
        minVoltage: r.minVoltage ? formatQuantity(r.minVoltage, "V", { digits: 6 }) : "",
        sizeFor: r.energy !== undefined || r.capacitance === undefined ? "energy" : "capacitance",
        amount:
          r.energy !== undefined
            ? formatQuantity(r.energy, "J", { digits: 6 })
            : r.capacitance !== undefined
              ? formatQuantity(r.capacitance, "F", { digits: 6 })
              : formatQuantity((r.backup?.power ?? 0) * (r.backup?.seconds ?? 0), "J", { digits: 6 }),
      }
    : { maxVoltage: "48 V", minVoltage: "24 V", sizeFor: "energy", amount: "20 kJ" };
  return (
    <div className="space-y-6">
      <PageHeader title="Design factors and limits">
        How conservatively the engine sizes banks, and which requests it quotes at once. Changes apply to searches and quotes from the moment they are saved;
        issued quotes keep the figures they were issued with.
      </PageHeader>
      <SettingsForm
        shop={shop}
        initial={settingsFormText({
          designFactors: settings?.designFactors ?? DEFAULT_DESIGN_FACTORS,
          autoQuoteLimits: settings?.autoQuoteLimits ?? DEFAULT_AUTO_QUOTE_LIMITS,
          reliabilitySettings: { ...DEFAULT_RELIABILITY_SETTINGS, ...settings?.reliabilitySettings },
        })}
        sample={sample}
      />
    </div>
  );
}
