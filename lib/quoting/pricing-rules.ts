import "server-only";
import { recordAudit } from "@/db/queries/audit";
import { loadShopCatalog } from "@/db/queries/catalog";
import { getRulesInForce, listRecentQuotedArrangements, saveRulesVersion } from "@/db/queries/pricing-rules";
import { withShop } from "@/db/tx";
import { actorOf, type ShopContext } from "@/lib/auth/context";
import type { ActionResult } from "@/lib/auth/guards";
import type { PricingRules } from "@/lib/pricing";
import { diffRules, type RuleChange } from "@/lib/pricing/rule-versions";
import { repriceQuotes, type RepricedQuote } from "./reprice";

/** How many recent quotes "what a change does" prices again. */
export const PREVIEW_QUOTES = 20;

/**
 * Saves a shop's pricing rules as a new version (who, when, why) and puts it in force, with an
 * audit entry naming each changed rule. Quote revisions already issued keep their frozen prices:
 * only quotes made from now on use the new rules. With `expectedVersion`, rules saved by someone
 * else since are a "conflict".
 */
export async function savePricingRules(
  ctx: ShopContext,
  rules: PricingRules,
  reason: string,
  expectedVersion: number | null,
): Promise<ActionResult<{ version: number; changes: RuleChange[] }>> {
  const actor = actorOf(ctx);
  return withShop(ctx.shop.id, async (tx) => {
    const saved = await saveRulesVersion(tx, ctx.shop.id, { rules, reason, savedByUserId: actor.actorUserId, savedByKeyId: actor.actorKeyId, expectedVersion });
    if (!saved.ok)
      return {
        ok: false,
        code: "conflict",
        message: `The rules were saved by someone else since you opened them (now version ${saved.version}). Reload to see their change, then make yours again.`,
      };
    const changes = diffRules(saved.before, rules);
    await recordAudit(tx, ctx.shop.id, {
      ...actor,
      action: "pricing-rules.save",
      subjectType: "pricing-rules",
      subjectId: String(saved.version),
      summary: `Pricing rules version ${saved.version}: ${changes.length === 0 ? "saved unchanged" : changes.map((c) => c.label.toLowerCase()).join(", ")} — ${reason}`,
      changes: Object.fromEntries(changes.map((c) => [c.key, { from: c.from, to: c.to }])),
    });
    return { ok: true, data: { version: saved.version, changes } };
  });
}

/** The shop's last quotes priced again under the rules in force and under `proposed`. */
export async function previewRuleChange(shopId: string, proposed: PricingRules): Promise<{ rows: RepricedQuote[]; changes: RuleChange[] }> {
  const [inForce, catalog, quoted] = await Promise.all([
    getRulesInForce(shopId),
    loadShopCatalog(shopId),
    listRecentQuotedArrangements(shopId, PREVIEW_QUOTES),
  ]);
  return { rows: repriceQuotes(quoted, catalog, inForce.rules, proposed), changes: diffRules(inForce.rules, proposed) };
}
