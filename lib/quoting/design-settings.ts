import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { loadShopCatalog } from "@/db/queries/catalog";
import { lockSettingsGroups, writeSettingsGroups } from "@/db/queries/settings-edit";
import { withShop } from "@/db/tx";
import { actorOf, type ShopContext } from "@/lib/auth/context";
import type { Requirement } from "@/lib/bank";
import { SETTINGS_GROUPS, settingText, valueAt, type ShopSettingsGroups } from "@/lib/validation/design-settings";
import { checkAutoQuoteLimits } from "./auto-quote-limits";
import { searchPricedOptions } from "./priced-search";

/** Saves the design factors, auto-quote limits and reliability settings, with an audit entry naming each changed setting (old → new). */
export async function saveDesignSettings(ctx: ShopContext, groups: ShopSettingsGroups) {
  return withShop(ctx.shop.id, async (tx) => {
    const before = await lockSettingsGroups(tx, ctx.shop.id);
    const changes: Record<string, { from: string; to: string }> = {};
    for (const g of SETTINGS_GROUPS)
      for (const f of g.fields) {
        const a = settingText(f, valueAt(before[g.key], f.key));
        const b = settingText(f, valueAt(groups[g.key], f.key));
        if (a !== b) changes[`${g.key}.${f.key}`] = { from: a, to: b };
      }
    await writeSettingsGroups(tx, ctx.shop.id, groups);
    const labels = SETTINGS_GROUPS.flatMap((g) => g.fields.filter((f) => changes[`${g.key}.${f.key}`]).map((f) => f.label.toLowerCase()));
    await recordAudit(tx, ctx.shop.id, {
      ...actorOf(ctx),
      action: "settings.design",
      subjectType: "settings",
      summary: labels.length === 0 ? "Design factors saved unchanged" : `Design settings changed: ${labels.join(", ")}`,
      changes,
    });
    return { changed: Object.keys(changes).length };
  });
}

/** One option of the preview, as the estimator compares them. */
export interface SettingsPreviewOption {
  cell: string;
  arrangement: string;
  cellCount: number;
  perBank: string | null;
  usableEnergy: number;
  secondsToSafe: number;
  /** reasons it would go to the estimators under these limits (empty: quoted at once) */
  review: string[];
}

/** A sample requirement's best options under the settings in force and under the proposed ones (the top five each). */
export async function previewDesignSettings(shopId: string, proposed: ShopSettingsGroups, requirement: Requirement) {
  const catalog = await loadShopCatalog(shopId);
  const run = (groups: ShopSettingsGroups) => {
    const found = searchPricedOptions(
      { ...catalog, factors: groups.designFactors, autoQuoteLimits: groups.autoQuoteLimits, reliability: groups.reliabilitySettings },
      requirement,
    );
    return {
      options: found.options.slice(0, 5).map((o): SettingsPreviewOption => ({
        cell: o.cell.sku,
        arrangement: `${o.seriesCount} S × ${o.parallelCount} P`,
        cellCount: o.cellCount,
        perBank: o.price?.perBank ?? null,
        usableEnergy: o.usableEnergy,
        secondsToSafe: o.discharge.secondsToSafe,
        review: checkAutoQuoteLimits({ maxVoltage: requirement.maxVoltage, storedEnergy: o.storedEnergy, cellCount: o.cellCount }, groups.autoQuoteLimits),
      })),
      reasons: found.options.length === 0 ? found.reasons : [],
    };
  };
  return {
    currency: catalog.rules.currency,
    current: run({ designFactors: catalog.factors, autoQuoteLimits: catalog.autoQuoteLimits, reliabilitySettings: catalog.reliability }),
    proposed: run(proposed),
  };
}
