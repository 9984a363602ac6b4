"use server";
import { revalidatePath } from "next/cache";
import { invalidFields, shopAction } from "@/lib/auth/guards";
import { previewRuleChange, savePricingRules as saveRules } from "@/lib/quoting/pricing-rules";
import { previewPricingRulesSchema, readRulesForm, savePricingRulesSchema } from "@/lib/validation/pricing";

/** Saves the rules as a new version with the reason given; refused when someone saved since the form was opened. */
export const savePricingRules = shopAction(savePricingRulesSchema, "pricing:write", async (ctx, input) => {
  const read = readRulesForm(input.values, { requireReason: true });
  if (!read.ok) return invalidFields(read.fieldErrors);
  const r = await saveRules(ctx, read.rules, read.reason, input.version);
  if (r.ok) revalidatePath(`/desk/${ctx.shop.slug}/pricing`);
  return r;
});

/** The shop's last quotes priced again under the rules in force and under the form's rules; nothing is saved. */
export const previewPricingRules = shopAction(previewPricingRulesSchema, "pricing:read", async (ctx, input) => {
  const read = readRulesForm(input.values, { requireReason: false });
  if (!read.ok) return invalidFields(read.fieldErrors);
  return { ok: true, data: await previewRuleChange(ctx.shop.id, read.rules) };
});
