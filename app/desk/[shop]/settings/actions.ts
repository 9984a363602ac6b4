"use server";
import { revalidatePath } from "next/cache";
import { invalidFields, shopAction } from "@/lib/auth/guards";
import { previewDesignSettings as preview, saveDesignSettings as save } from "@/lib/quoting/design-settings";
import { previewSettingsSchema, readSettingsForm, saveSettingsSchema } from "@/lib/validation/design-settings";
import { EMPTY_REQUEST_FORM, readRequestForm } from "@/lib/validation/request-form";

/** Saves the design factors and auto-quote limits; new searches and quotes use them at once. */
export const saveDesignSettings = shopAction(saveSettingsSchema, "settings:write", async (ctx, input) => {
  const read = readSettingsForm(input.values);
  if (!read.ok) return invalidFields(read.fieldErrors);
  const r = await save(ctx, read.groups);
  revalidatePath(`/desk/${ctx.shop.slug}/settings`);
  return { ok: true, data: r };
});

/** A sample requirement's best options under the settings in force and under the form's; nothing is saved. */
export const previewDesignSettings = shopAction(previewSettingsSchema, "settings:write", async (ctx, input) => {
  const read = readSettingsForm(input.values);
  if (!read.ok) return invalidFields(read.fieldErrors);
  const s = input.sample;
  const req = readRequestForm({
    ...EMPTY_REQUEST_FORM,
    maxVoltage: s.maxVoltage,
    minVoltage: s.minVoltage,
    sizeFor: s.sizeFor,
    capacitance: s.sizeFor === "capacitance" ? s.amount : "",
    energy: s.sizeFor === "energy" ? s.amount : "",
  });
  if (!req.ok)
    return invalidFields(
      Object.fromEntries(req.issues.map((i) => [`sample.${i.field === "capacitance" || i.field === "energy" ? "amount" : i.field}`, i.message])),
    );
  return { ok: true, data: await preview(ctx.shop.id, read.groups, req.data.requirement) };
});
