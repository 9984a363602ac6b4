"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import {
  COMPONENT_KIND_LABELS,
  COMPONENT_KIND_VALUES,
  COMPONENT_SPEC_FIELDS,
  type ComponentFormText,
  type ComponentKind,
} from "@/lib/catalog/component-fields";
import { componentFormSchema } from "@/lib/validation/catalog";
import { saveComponent } from "../actions";

/** A component's form: the common fields and the figures its kind carries, each explained at the field. */
export function ComponentForm({
  shop,
  currency,
  initial,
  version,
  canWrite,
}: {
  shop: string;
  currency: string;
  initial: ComponentFormText;
  version?: number;
  canWrite: boolean;
}) {
  const router = useRouter();
  const form = useForm<ComponentFormText>({ resolver: zodResolver(componentFormSchema) as never, defaultValues: initial, mode: "onTouched" });
  const kind = useWatch({ control: form.control, name: "kind" }) as ComponentKind;
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [saving, start] = useTransition();
  const errors = form.formState.errors as Record<string, { message?: string } | undefined>;
  const editing = version !== undefined;

  const onSubmit = form.handleSubmit((values) =>
    start(async () => {
      setMessage(null);
      const r = await saveComponent(shop, { sku: editing ? initial.sku : undefined, version, values });
      if (!r.ok) {
        for (const [field, messages] of Object.entries(r.fieldErrors ?? {})) form.setError(field, { message: messages[0] });
        setMessage({ tone: "error", text: r.message ?? "Not saved." });
        return;
      }
      if (!editing || r.data.sku !== initial.sku) {
        router.push(`/desk/${shop}/catalog/components/${encodeURIComponent(r.data.sku)}`);
        return;
      }
      setMessage({ tone: "info", text: `Saved as version ${r.data.version}.` });
      router.refresh();
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label={editing ? `Edit ${initial.sku}` : "New component"}>
      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-3">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Part</legend>
        <SelectField
          id="kind"
          label="Kind"
          hint="What the part is: it decides which figures it needs."
          error={errors.kind?.message}
          disabled={!canWrite}
          {...form.register("kind")}
        >
          {COMPONENT_KIND_VALUES.map((k) => (
            <option key={k} value={k}>
              {COMPONENT_KIND_LABELS[k]}
            </option>
          ))}
        </SelectField>
        <TextField id="sku" label="Part number" hint="Unique in the catalog." error={errors.sku?.message} readOnly={!canWrite} {...form.register("sku")} />
        <TextField
          id="name"
          label="Name"
          hint="As the bill of materials shows it."
          error={errors.name?.message}
          readOnly={!canWrite}
          {...form.register("name")}
        />
        {(COMPONENT_SPEC_FIELDS[kind] ?? []).map((f) => (
          <TextField
            key={f.key}
            id={f.key}
            label={f.label}
            placeholder={f.example}
            hint={f.help}
            error={errors[f.key]?.message}
            readOnly={!canWrite}
            {...form.register(f.key)}
          />
        ))}
        {kind === "interconnect" ? <p className="text-sm text-ink-600 sm:col-span-2">One interconnect per cell: no figures needed.</p> : null}
      </fieldset>
      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Cost and stock</legend>
        <TextField
          id="unitCost"
          label={`Unit cost (${currency})`}
          placeholder="12.50"
          hint="What one costs the shop; never shown to customers."
          error={errors.unitCost?.message}
          readOnly={!canWrite}
          {...form.register("unitCost")}
        />
        <TextField
          id="stock"
          label="In stock"
          inputMode="numeric"
          hint="Pieces on the shelf."
          error={errors.stock?.message}
          readOnly={!canWrite}
          {...form.register("stock")}
        />
        <TextField
          id="leadTimeDays"
          label="Lead time (days)"
          inputMode="numeric"
          hint="Days to get more."
          error={errors.leadTimeDays?.message}
          readOnly={!canWrite}
          {...form.register("leadTimeDays")}
        />
        <SelectField id="active" label="Offered" hint="Retired parts are never used in new quotes." disabled={!canWrite} {...form.register("active")}>
          <option value="true">Offered</option>
          <option value="false">Retired</option>
        </SelectField>
      </fieldset>
      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      {canWrite ? (
        <div className="flex flex-wrap gap-3">
          <Button type="submit" disabled={saving}>
            {saving ? "Saving…" : editing ? "Save changes" : "Add the component"}
          </Button>
          <Link href={`/desk/${shop}/catalog/components`} className="px-2 py-2 text-sm text-ink-600 hover:underline">
            Back to the components
          </Link>
        </div>
      ) : null}
    </form>
  );
}
