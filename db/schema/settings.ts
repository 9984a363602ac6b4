import { jsonb, pgTable, text, timestamp } from "drizzle-orm/pg-core";
import type { DesignFactors } from "@/lib/bank/types";
import type { PricingRules } from "@/lib/pricing/types";
import { shops } from "./auth";

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
  createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});

export type ShopSettingsRow = typeof shopSettings.$inferSelect;
