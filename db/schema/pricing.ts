import { index, integer, jsonb, pgTable, text, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import type { PricingRules } from "@/lib/pricing/types";
import { users } from "./auth";
import { shopColumn, createdAtColumn } from "./columns";

/**
 * Every saved version of a shop's pricing rules, numbered per shop from 1, with who saved it, when
 * and why. The rules in force are also in shop_settings.pricing_rules (what quoting loads); both are
 * written in one transaction (db/queries/pricing-rules.ts). Rows are never updated.
 */
export const pricingRuleVersions = pgTable(
  "pricing_rule_versions",
  {
    id: uuid().primaryKey().defaultRandom(),
    shopId: shopColumn(),
    version: integer().notNull(),
    rules: jsonb().$type<PricingRules>().notNull(),
    /** why the rules changed, as the person (or the integrator) who saved them wrote it */
    reason: text().notNull(),
    /** the signed-in person, or null for an API key or the rules in force before versions were kept */
    savedByUserId: text().references(() => users.id, { onDelete: "set null" }),
    savedByKeyId: text(),
    createdAt: createdAtColumn(),
  },
  (t) => [
    uniqueIndex("pricing_rule_versions_shop_version_uq").on(t.shopId, t.version),
    index("pricing_rule_versions_shop_created_idx").on(t.shopId, t.createdAt),
  ],
);

export type PricingRuleVersionRow = typeof pricingRuleVersions.$inferSelect;
