import { jsonb, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import { DEFAULT_RELIABILITY_SETTINGS, type ReliabilitySettings } from "@/lib/bank/reliability-settings";
import type { DesignFactors } from "@/lib/bank/types";
import type { PricingRules } from "@/lib/pricing/types";
import { DEFAULT_AUTO_QUOTE_LIMITS, type AutoQuoteLimits } from "@/lib/quoting/auto-quote-limits";
import { shops } from "./auth";
import { createdAtColumn } from "./columns";

/** One row per shop: its design factors (DESIGN.md §3.2), pricing rules (§4) and storefront text. */
export const shopSettings = pgTable("shop_settings", {
  shopId: text()
    .primaryKey()
    .references(() => shops.id, { onDelete: "cascade" }),
  currency: text().notNull().default("EUR"),
  tagline: text().notNull().default(""),
  description: text().notNull().default(""),
  designFactors: jsonb().$type<DesignFactors>().notNull(),
  pricingRules: jsonb().$type<PricingRules>().notNull(),
  /** beyond any of these a request goes to the estimators instead of being quoted at once */
  autoQuoteLimits: jsonb().$type<AutoQuoteLimits>().notNull().default(DEFAULT_AUTO_QUOTE_LIMITS),
  /** failure, yield and life settings (DESIGN.md §3.5): a group of its own beside the design factors */
  reliabilitySettings: jsonb().$type<ReliabilitySettings>().notNull().default(DEFAULT_RELIABILITY_SETTINGS),
  createdAt: createdAtColumn(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export type ShopSettingsRow = typeof shopSettings.$inferSelect;
