"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import { CELL_FIELD_BY_NAME, type CellFieldName, type CellRecord } from "@/lib/catalog/cell-fields";
import { cellFormSchema, type CellFormValues } from "@/lib/validation/catalog";
import { TECHNOLOGY_LABELS } from "@/lib/vocabulary";
import { createCell, updateCell } from "../actions";

const GROUPS: { title: string; fields: CellFieldName[] }[] = [
  { title: "Part", fields: ["sku", "manufacturer", "series", "technology"] },
  {
    title: "Electrical",
    fields: ["capacitance", "toleranceMinus", "tolerancePlus", "ratedVoltage", "surgeVoltage", "esr", "leakageCurrent", "continuousCurrent", "peakCurrent"],
  },
  { title: "Size", fields: ["mass", "shape", "diameter", "length", "width", "height"] },
  { title: "Cost and stock", fields: ["unitCost", "stock", "leadTimeDays", "active"] },
];

/**
 * A cell's form: every quantity typed with its unit (`2.7 V`, `0.58 mΩ`, `10 %`, `60 mm`), read by
 * the same lib/catalog code the server and the CSV import use, with the message at the field. An
 * edit sends only the changed fields and the version it was opened at: if someone saved the cell
 * since, nothing is written and the form says so.
 */
export function CellForm({
  shop,
  currency,
  initial,
  version,
  canWrite,
}: {
  shop: string;
  currency: string;
  initial: CellFormValues;
  /** the stored version being edited; absent for a new cell */
  version?: number;
  canWrite: boolean;
}) {
  const router = useRouter();
  const form = useForm<CellFormValues, unknown, CellRecord>({ resolver: zodResolver(cellFormSchema), defaultValues: initial, mode: "onTouched" });
  const { register, formState } = form;
  const shape = useWatch({ control: form.control, name: "shape" });
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string; conflict?: boolean } | null>(null);
  const [saving, start] = useTransition();
  const editing = version !== undefined;

  const onSubmit = form.handleSubmit(() =>
    start(async () => {
      setMessage(null);
      const values = form.getValues();
      const dirty = Object.keys(formState.dirtyFields) as CellFieldName[];
      const r = editing
        ? await updateCell(shop, { sku: initial.sku, version, changes: Object.fromEntries(dirty.map((f) => [f, values[f]])) })
        : await createCell(shop, { values });
      if (!r.ok) {
        for (const [field, messages] of Object.entries(r.fieldErrors ?? {}))
          if (field in initial) form.setError(field as CellFieldName, { message: messages[0] });
        setMessage({ tone: "error", text: r.message ?? "Not saved.", conflict: r.code === "conflict" && !r.fieldErrors });
        return;
      }
      if (!editing || r.data.sku !== initial.sku) {
        router.push(`/desk/${shop}/catalog/cells/${encodeURIComponent(r.data.sku)}?saved=1`);
        return;
      }
      form.reset(values);
      setMessage({ tone: "info", text: `Saved as version ${r.data.version}.` });
      router.refresh();
    }),
  );

  const field = (name: CellFieldName) => {
    const f = CELL_FIELD_BY_NAME[name];
    const error = formState.errors[name]?.message;
    if (name === "technology")
      return (
        <SelectField key={name} id={name} label={f.label} hint={f.help} error={error} disabled={!canWrite} {...register(name)}>
          {(f.choices ?? []).map((c) => (
            <option key={c} value={c}>
              {TECHNOLOGY_LABELS[c as keyof typeof TECHNOLOGY_LABELS] ?? c}
            </option>
          ))}
        </SelectField>
      );
    if (name === "shape" || name === "active")
      return (
        <SelectField key={name} id={name} label={f.label} hint={f.help} error={error} disabled={!canWrite} {...register(name)}>
          {name === "shape" ? (
            <>
              <option value="cylinder">Cylinder</option>
              <option value="box">Box</option>
            </>
          ) : (
            <>
              <option value="true">Offered</option>
              <option value="false">Retired (never offered)</option>
            </>
          )}
        </SelectField>
      );
    if ((name === "diameter" && shape !== "cylinder") || ((name === "length" || name === "width") && shape !== "box")) return null;
    const label = name === "unitCost" ? `${f.label} (${currency})` : f.label;
    return (
      <TextField
        key={name}
        id={name}
        label={label}
        placeholder={f.example || undefined}
        hint={f.help}
        error={error}
        readOnly={!canWrite}
        inputMode={f.kind === "integer" || f.kind === "money" ? "decimal" : undefined}
        {...register(name)}
      />
    );
  };

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label={editing ? `Edit ${initial.sku}` : "New cell"}>
      {GROUPS.map((g) => (
        <fieldset key={g.title} className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-3">
          <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">{g.title}</legend>
          {g.fields.map(field)}
        </fieldset>
      ))}
      {message ? (
        <FormMessage tone={message.tone}>
          {message.text}{" "}
          {message.conflict ? (
            <Link href={`/desk/${shop}/catalog/cells/${encodeURIComponent(initial.sku)}`} className="underline" onClick={() => router.refresh()}>
              Reload the cell
            </Link>
          ) : null}
        </FormMessage>
      ) : null}
      {canWrite ? (
        <div className="flex flex-wrap gap-3">
          <Button type="submit" disabled={saving}>
            {saving ? "Saving…" : editing ? "Save changes" : "Add the cell"}
          </Button>
          <Link href={`/desk/${shop}/catalog`} className="px-2 py-2 text-sm text-ink-600 hover:underline">
            Back to the catalog
          </Link>
        </div>
      ) : null}
    </form>
  );
}
