import "server-only";
import { eq } from "drizzle-orm";
import { shopSettings } from "@/db/schema";
import type { Tx } from "@/db/tx";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank/reliability-settings";
import { DEFAULT_DESIGN_FACTORS } from "@/lib/bank/types";
import { DEFAULT_AUTO_QUOTE_LIMITS } from "@/lib/quoting/auto-quote-limits";
import type { ShopSettingsGroups } from "@/lib/validation/design-settings";

/** The shop's settings groups (design factors, auto-quote limits, reliability settings), locked for the transaction; defaults where none are stored. */
export async function lockSettingsGroups(tx: Tx, shopId: string): Promise<ShopSettingsGroups> {
  const [row] = await tx
    .select({ designFactors: shopSettings.designFactors, autoQuoteLimits: shopSettings.autoQuoteLimits, reliabilitySettings: shopSettings.reliabilitySettings })
    .from(shopSettings)
    .where(eq(shopSettings.shopId, shopId))
    .for("update");
  return {
    designFactors: row?.designFactors ?? DEFAULT_DESIGN_FACTORS,
    autoQuoteLimits: row?.autoQuoteLimits ?? DEFAULT_AUTO_QUOTE_LIMITS,
    reliabilitySettings: { ...DEFAULT_RELIABILITY_SETTINGS, ...row?.reliabilitySettings },
  };
}

/** Writes the given settings groups, each a whole object (one column per group). */
export async function writeSettingsGroups(tx: Tx, shopId: string, groups: Partial<ShopSettingsGroups>): Promise<void> {
  await tx
    .update(shopSettings)
    .set({ ...groups, updatedAt: new Date() })
    .where(eq(shopSettings.shopId, shopId));
}
