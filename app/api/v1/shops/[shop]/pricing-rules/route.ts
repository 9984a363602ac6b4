import { getRulesInForce } from "@/db/queries/pricing-rules";
import { withShopApi } from "@/lib/auth/guards";
import { jsonError } from "@/lib/http/json-error";
import { readJsonAs } from "@/lib/http/read-json";
import { savePricingRules } from "@/lib/quoting/pricing-rules";
import { putPricingRulesSchema } from "@/lib/validation/pricing";
import { getPricingRules as contract } from "@/lib/api/contracts/pricing";

async function inForce(shopId: string): Promise<Response> {
  const r = await getRulesInForce(shopId);
  // GET and PUT answer the same shape (lib/api/contracts/pricing.ts)
  return contract.answer({ rules: r.rules, version: r.version, reason: r.reason, savedAt: r.savedAt?.toISOString() ?? null });
}

/**
 * GET /api/v1/shops/{shop}/pricing-rules — { rules, version, reason, savedAt }: the rules in force.
 * PUT — { rules, reason, version? }: the whole rule set and why it changes, saved as a new version
 * (issued quotes keep their prices); with `version`, rules saved by someone else since are a 409.
 */
export async function GET(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(request, shop, "pricing:read", (ctx) => inForce(ctx.shop.id), { outsiders: "not-found" });
}

export async function PUT(request: Request, { params }: { params: Promise<{ shop: string }> }) {
  const { shop } = await params;
  return withShopApi(
    request,
    shop,
    "pricing:write",
    async (ctx) => {
      const parsed = await readJsonAs(request, putPricingRulesSchema);
      if (!parsed.ok) return parsed.response;
      const saved = await savePricingRules(ctx, parsed.value.rules, parsed.value.reason, parsed.value.version ?? null);
      if (!saved.ok) return jsonError(409, saved.message ?? "The rules changed since.");
      return inForce(ctx.shop.id);
    },
    { outsiders: "not-found" },
  );
}
