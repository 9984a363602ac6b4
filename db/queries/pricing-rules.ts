import "server-only";
import { and, asc, count, desc, eq, max } from "drizzle-orm";
import { pricingRuleVersions, quoteRevisions, quotes, shopSettings, users, type PricingRuleVersionRow } from "@/db/schema";
import { withShop, type Tx } from "@/db/tx";
import { DEFAULT_PRICING_RULES, readPricingRules } from "@/lib/pricing/defaults";
import type { PricingRules } from "@/lib/pricing/types";
import type { RuleVersionListQuery } from "@/lib/validation/lists";
import { readPage, sortedBy, type Page } from "./paging";

/**
 * A shop's pricing rules: the rules in force (shop_settings.pricing_rules, what quoting loads) and
 * every saved version with who, when and why (pricing_rule_versions). Saving writes both in one
 * transaction; the first save also keeps the rules the shop had until then as version 1.
 */

export interface RulesInForce {
  rules: PricingRules;
  /** the latest saved version, 0 when the rules were never changed since the shop opened */
  version: number;
  reason: string | null;
  savedAt: Date | null;
}

async function latestVersion(tx: Tx, shopId: string): Promise<PricingRuleVersionRow | null> {
  const [row] = await tx.select().from(pricingRuleVersions).where(eq(pricingRuleVersions.shopId, shopId)).orderBy(desc(pricingRuleVersions.version)).limit(1);
  return row ?? null;
}

export async function getRulesInForce(shopId: string): Promise<RulesInForce> {
  return withShop(shopId, async (tx) => {
    const [settings] = await tx.select({ rules: shopSettings.pricingRules }).from(shopSettings).where(eq(shopSettings.shopId, shopId)).limit(1);
    const latest = await latestVersion(tx, shopId);
    return {
      rules: settings ? readPricingRules(settings.rules) : DEFAULT_PRICING_RULES,
      version: latest?.version ?? 0,
      reason: latest?.reason ?? null,
      savedAt: latest?.createdAt ?? null,
    };
  });
}

export type SaveRulesOutcome = { ok: true; version: number; before: PricingRules } | { ok: false; reason: "stale"; version: number };

/**
 * Saves a new version and puts it in force (the shop's currency follows the rules'). With
 * `expectedVersion`, rules saved by someone else since are "stale" and nothing is written.
 */
export async function saveRulesVersion(
  tx: Tx,
  shopId: string,
  input: { rules: PricingRules; reason: string; savedByUserId: string | null; savedByKeyId: string | null; expectedVersion: number | null },
): Promise<SaveRulesOutcome> {
  const [settings] = await tx.select().from(shopSettings).where(eq(shopSettings.shopId, shopId)).limit(1).for("update");
  const before = settings ? readPricingRules(settings.pricingRules) : DEFAULT_PRICING_RULES;
  const [agg] = await tx
    .select({ v: max(pricingRuleVersions.version) })
    .from(pricingRuleVersions)
    .where(eq(pricingRuleVersions.shopId, shopId));
  let current = agg?.v ?? 0;
  if (input.expectedVersion !== null && input.expectedVersion !== current) return { ok: false, reason: "stale", version: current };
  if (current === 0) {
    await tx
      .insert(pricingRuleVersions)
      .values({ shopId, version: 1, rules: before, reason: "The rules in force before changes were recorded", savedByUserId: null });
    current = 1;
  }
  const version = current + 1;
  await tx.insert(pricingRuleVersions).values({
    shopId,
    version,
    rules: input.rules,
    reason: input.reason,
    savedByUserId: input.savedByUserId,
    savedByKeyId: input.savedByKeyId,
  });
  await tx
    .update(shopSettings)
    .set({ pricingRules: input.rules, currency: input.rules.currency, updatedAt: new Date() })
    .where(eq(shopSettings.shopId, shopId));
  return { ok: true, version, before };
}

export interface RuleVersionRow {
  version: number;
  rules: PricingRules;
  reason: string;
  savedByName: string | null;
  savedByKeyId: string | null;
  createdAt: Date;
}

const VERSION_SORTS = { version: pricingRuleVersions.version };

/** A page of the shop's rule versions, newest first, each with the one before it (for the field-by-field diff). */
export async function listRuleVersions(shopId: string, q: RuleVersionListQuery): Promise<Page<RuleVersionRow & { previous: PricingRules | null }>> {
  return withShop(shopId, async (tx) => {
    const where = eq(pricingRuleVersions.shopId, shopId);
    const page = await readPage(
      q,
      () => tx.select({ n: count() }).from(pricingRuleVersions).where(where),
      (limit, offset) =>
        tx
          .select({
            version: pricingRuleVersions.version,
            rules: pricingRuleVersions.rules,
            reason: pricingRuleVersions.reason,
            savedByName: users.name,
            savedByKeyId: pricingRuleVersions.savedByKeyId,
            createdAt: pricingRuleVersions.createdAt,
          })
          .from(pricingRuleVersions)
          .leftJoin(users, eq(users.id, pricingRuleVersions.savedByUserId))
          .where(where)
          .orderBy(...sortedBy(VERSION_SORTS, q))
          .limit(limit)
          .offset(offset),
    );
    const wanted = page.rows.map((r) => r.version - 1).filter((v) => v >= 1);
    const earlier = wanted.length
      ? await tx
          .select({ version: pricingRuleVersions.version, rules: pricingRuleVersions.rules })
          .from(pricingRuleVersions)
          .where(and(where))
          .orderBy(asc(pricingRuleVersions.version))
      : [];
    const byVersion = new Map(earlier.map((r) => [r.version, r.rules]));
    return {
      ...page,
      rows: page.rows.map((r) => {
        const prev = byVersion.get(r.version - 1);
        return { ...r, rules: readPricingRules(r.rules), previous: prev ? readPricingRules(prev) : null };
      }),
    };
  });
}

/** The shop's last `limit` quotes, each with its current revision's frozen arrangement, cell and prices (newest first). */
export async function listRecentQuotedArrangements(shopId: string, limit = 20) {
  return withShop(shopId, (tx) =>
    tx
      .select({
        number: quotes.number,
        customerName: users.name,
        requirement: quoteRevisions.requirement,
        arrangement: quoteRevisions.arrangement,
        cell: quoteRevisions.cell,
        pricing: quoteRevisions.pricing,
        quantity: quoteRevisions.quantity,
        createdAt: quotes.createdAt,
      })
      .from(quotes)
      .innerJoin(
        quoteRevisions,
        and(eq(quoteRevisions.shopId, quotes.shopId), eq(quoteRevisions.quoteId, quotes.id), eq(quoteRevisions.revision, quotes.currentRevision)),
      )
      .innerJoin(users, eq(users.id, quotes.customerUserId))
      .where(eq(quotes.shopId, shopId))
      .orderBy(desc(quotes.createdAt), desc(quotes.number))
      .limit(Math.min(Math.max(1, limit), 100)),
  );
}
