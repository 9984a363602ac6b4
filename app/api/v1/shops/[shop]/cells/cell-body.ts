import type { ShopContext } from "@/lib/auth/context";
import type { ActionResult } from "@/lib/auth/guards";
import { readCell, type CellFieldName, type CellRecord } from "@/lib/catalog/cell-fields";
import { cellResponseFor, shopCurrency } from "@/lib/catalog/edit";
import { jsonError } from "@/lib/http/json-error";
import type { DefinedRoute } from "@/lib/api/contract";
import type { cellResponseSchema } from "@/lib/validation/catalog";

/**
 * What the cells routes share: a JSON cell (SI numbers, `unitCost: { amount, currency }`) read
 * through the same lib/catalog reader as the desk's form and the CSV, and a write's result answered
 * with an honest status.
 */

export type ApiCell = Partial<Record<CellFieldName, unknown>> & { unitCost?: { amount: string; currency: string } };

/** The JSON cell as a record (over `base` for a change); 400 naming the field when it does not read. */
export async function readApiCell(
  ctx: ShopContext,
  body: ApiCell,
  base: CellRecord | null,
): Promise<{ ok: true; record: CellRecord } | { ok: false; response: Response }> {
  const raw: Partial<Record<CellFieldName, unknown>> = { ...body };
  if (body.unitCost !== undefined) {
    const currency = await shopCurrency(ctx.shop.id);
    if (body.unitCost.currency !== currency)
      return {
        ok: false,
        response: jsonError(400, `Unit costs are in the shop's currency, ${currency}.`, [
          { path: "unitCost.currency", message: `must be ${currency}, the shop's currency` },
        ]),
      };
    raw.unitCost = body.unitCost.amount;
  }
  const r = readCell(raw, base ?? undefined);
  if (!r.ok) {
    const issues = r.issues.map((i) => ({ path: i.field === "_cell" ? "" : i.field, message: i.message }));
    return {
      ok: false,
      response: jsonError(400, issues[0]?.path ? `${issues[0].path}: ${issues[0].message}` : (issues[0]?.message ?? "Invalid cell."), issues),
    };
  }
  return { ok: true, record: r.record };
}

const STATUS: Record<string, number> = { "not-found": 404, conflict: 409, invalid: 400, forbidden: 403 };

/** A write's answer (by its route's contract): the cell as stored now, or the refusal with its status (409 for a stale version or a taken SKU). */
export async function writeAnswer(
  ctx: ShopContext,
  result: ActionResult<{ record: CellRecord }>,
  contract: DefinedRoute<typeof cellResponseSchema>,
): Promise<Response> {
  if (!result.ok) {
    const issues = Object.entries(result.fieldErrors ?? {}).flatMap(([path, messages]) => messages.map((message) => ({ path, message })));
    return jsonError(STATUS[result.code] ?? 400, result.message ?? "Refused.", issues.length > 0 ? issues : undefined);
  }
  const cell = await cellResponseFor(ctx, result.data.record.sku);
  return cell ? contract.answer(cell) : jsonError(404, "No such cell.");
}
