"use server";
import { revalidatePath } from "next/cache";
import { invalidFields, shopAction } from "@/lib/auth/guards";
import { readCell } from "@/lib/catalog/cell-fields";
import { readComponent, type ComponentFormText } from "@/lib/catalog/component-fields";
import {
  createCell as addCell,
  createComponent,
  importCells as applyImport,
  previewCellImport as planImport,
  updateCell as changeCell,
  updateComponent,
} from "@/lib/catalog/edit";
import { createCellSchema, importCellsSchema, saveComponentSchema, updateCellSchema } from "@/lib/validation/catalog";

/** Adds a cell from the desk's form (every field typed with its unit). */
export const createCell = shopAction(createCellSchema, "catalog:write", async (ctx, input) => {
  const read = readCell(input.values);
  if (!read.ok) return invalidFields(read.issues);
  const r = await addCell(ctx, read.record);
  if (r.ok) revalidatePath(`/desk/${ctx.shop.slug}/catalog`);
  return r.ok ? { ok: true, data: { sku: r.data.record.sku, version: r.data.version } } : r;
});

/** Changes a cell: only the fields the estimator changed, from the version the form was opened at (a newer one is a conflict). */
export const updateCell = shopAction(updateCellSchema, "catalog:write", async (ctx, input) => {
  const r = await changeCell(ctx, input.sku, input.changes, input.version);
  if (r.ok) revalidatePath(`/desk/${ctx.shop.slug}/catalog`);
  return r.ok ? { ok: true, data: { sku: r.data.record.sku, version: r.data.version, changed: r.data.changes.map((c) => c.field) } } : r;
});

/** What importing a CSV would do, row by row; nothing is written. */
export const previewCellImport = shopAction(importCellsSchema, "catalog:write", async (ctx, input) => {
  return { ok: true, data: await planImport(ctx.shop.id, input.csv) };
});

/** Imports a CSV in one transaction (re-planned against the catalog as it is now); refused whole when a row has errors, unless applyValid. */
export const importCells = shopAction(importCellsSchema, "catalog:write", async (ctx, input) => {
  const outcome = await applyImport(ctx, input.csv, { applyValid: input.applyValid });
  if (outcome.applied) revalidatePath(`/desk/${ctx.shop.slug}/catalog`);
  return { ok: true, data: outcome };
});

/** Adds a component, or changes one from the version its form was opened at. */
export const saveComponent = shopAction(saveComponentSchema, "catalog:write", async (ctx, input) => {
  const read = readComponent(input.values as ComponentFormText);
  if (!read.ok) return invalidFields(read.issues);
  const r = input.sku && input.version ? await updateComponent(ctx, input.sku, read.values, input.version) : await createComponent(ctx, read.values);
  if (r.ok) revalidatePath(`/desk/${ctx.shop.slug}/catalog/components`);
  return r;
});
