"use client";
import { useWatch, type UseFormReturn } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FieldShell, SelectField, TextField } from "@/components/ui/field";
import { TECHNOLOGIES } from "@/lib/bank/types";
import { formatQuantity } from "@/lib/quantities";
import { TECHNOLOGY_LABELS } from "@/lib/vocabulary";
import { MAX_NOTES_LENGTH } from "@/lib/validation/limits";
import { deriveFigures, type RequestFormOutput, type RequestFormValues, type SizeFor } from "@/lib/validation/request-form";
import { AttachmentsField } from "./attachments-field";
import type { UploadedFile } from "./saved-request";
import type { Viewer } from "./viewer";

const SIZE_CHOICES: { value: SizeFor; label: string; explain: string }[] = [
  { value: "energy", label: "Usable energy", explain: "The energy the bank must give between the maximum and the minimum voltage, e.g. 20 kJ (or 5.5 Wh)." },
  {
    value: "capacitance",
    label: "Capacitance",
    explain: "The capacitance at the bank's terminals, e.g. 58 F for a supercapacitor module or 4700 µF for a DC link.",
  },
  {
    value: "backup",
    label: "Backup power for a time",
    explain: "A constant power the bank must carry for a time down to the minimum voltage, e.g. 5 kW for 30 s.",
  },
];

type Form = UseFormReturn<RequestFormValues, unknown, RequestFormOutput>;

/** Live figures under the sizing choice: what the stated values imply. */
function Derived({ form }: { form: Form }) {
  const values = useWatch({ control: form.control }) as RequestFormValues;
  const d = deriveFigures(values);
  const lines: string[] = [];
  if (values.sizeFor !== "capacitance" && d.capacitance !== null && d.voltages) {
    lines.push(
      `Needs at least ${formatQuantity(d.capacitance, "F")} at the terminals: C = 2E / (V max² − V min²) = 2 × ${formatQuantity(d.usableEnergy ?? 0, "J")} / (${formatQuantity(d.voltages.max, "V")}² − ${formatQuantity(d.voltages.min, "V")}²).`,
    );
  }
  if (values.sizeFor === "backup" && d.usableEnergy !== null)
    lines.push(`A backup of P × t needs at least ${formatQuantity(d.usableEnergy, "J")} usable (more once ESR losses count).`);
  if (values.sizeFor === "capacitance" && d.usableEnergy !== null)
    lines.push(`Gives ${formatQuantity(d.usableEnergy, "J")} usable between the voltages: ½·C·(V max² − V min²).`);
  if (d.storedEnergy !== null && d.voltages)
    lines.push(`Stores ${formatQuantity(d.storedEnergy, "J")} at ${formatQuantity(d.voltages.max, "V")} (½·C·V max²).`);
  if (d.maxEsr !== null) lines.push(`Allows at most ${formatQuantity(d.maxEsr, "Ω")} of ESR at end of life (ΔV / I).`);
  if (lines.length === 0) return null;
  return (
    <div role="status" aria-live="polite" className="rounded-md bg-charge-100 px-3 py-2 text-sm text-charge-700" data-testid="derived-figures">
      {lines.map((l) => (
        <p key={l}>{l}</p>
      ))}
    </div>
  );
}

export function RequestForm({
  form,
  slug,
  viewer,
  attachments,
  onAttachmentsChange,
  onSubmit,
  onClear,
  searching,
}: {
  form: Form;
  slug: string;
  viewer: Viewer;
  attachments: UploadedFile[];
  onAttachmentsChange: (next: UploadedFile[]) => void;
  onSubmit: (e?: React.BaseSyntheticEvent) => Promise<void>;
  onClear: () => void;
  searching: boolean;
}) {
  const { register, formState } = form;
  const errors = formState.errors;
  const sizeFor = useWatch({ control: form.control, name: "sizeFor" });
  const choice = SIZE_CHOICES.find((c) => c.value === sizeFor) ?? SIZE_CHOICES[0];

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-6" aria-label="Describe your bank">
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Voltage</legend>
        <TextField
          id="maxVoltage"
          label="Maximum voltage"
          placeholder="e.g. 48 V"
          hint="The highest voltage the bank is charged to."
          error={errors.maxVoltage?.message}
          {...register("maxVoltage")}
        />
        <TextField
          id="minVoltage"
          label="Minimum voltage (optional)"
          placeholder="e.g. 24 V"
          hint="The lowest voltage your load still works at; empty means 0 V."
          error={errors.minVoltage?.message}
          {...register("minVoltage")}
        />
      </fieldset>

      <fieldset className="space-y-3">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Size the bank for</legend>
        <div role="radiogroup" aria-label="Size the bank for" className="inline-flex flex-wrap rounded-md bg-ink-50 p-1 ring-1 ring-ink-100">
          {SIZE_CHOICES.map((c) => (
            <label
              key={c.value}
              className={`cursor-pointer rounded px-3 py-1.5 text-sm font-medium ${sizeFor === c.value ? "bg-white text-ink-900 shadow-sm ring-1 ring-ink-200" : "text-ink-600 hover:text-ink-900"}`}
            >
              <input type="radio" value={c.value} className="sr-only" {...register("sizeFor")} />
              {c.label}
            </label>
          ))}
        </div>
        <p className="text-sm text-ink-600">{choice?.explain}</p>
        <div className="grid gap-4 sm:grid-cols-2">
          {sizeFor === "energy" ? (
            <TextField id="energy" label="Usable energy needed" placeholder="e.g. 20 kJ" error={errors.energy?.message} {...register("energy")} />
          ) : null}
          {sizeFor === "capacitance" ? (
            <TextField id="capacitance" label="Capacitance needed" placeholder="e.g. 58 F" error={errors.capacitance?.message} {...register("capacitance")} />
          ) : null}
          {sizeFor === "backup" ? (
            <>
              <TextField id="backupPower" label="Backup power" placeholder="e.g. 5 kW" error={errors.backupPower?.message} {...register("backupPower")} />
              <TextField
                id="backupTime"
                label="Backup time"
                placeholder="e.g. 30 s"
                hint="Seconds, or 2 min."
                error={errors.backupTime?.message}
                {...register("backupTime")}
              />
            </>
          ) : null}
        </div>
        <Derived form={form} />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Peak current (optional)</legend>
        <TextField
          id="peakCurrent"
          label="Peak current"
          placeholder="e.g. 200 A"
          hint="The largest current the load draws."
          error={errors.peakCurrent?.message}
          {...register("peakCurrent")}
        />
        <TextField
          id="maxDrop"
          label="Allowed voltage drop at that current"
          placeholder="e.g. 4 V"
          hint="Sets the most ESR the bank may have."
          error={errors.maxDrop?.message}
          {...register("maxDrop")}
        />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">In service (optional)</legend>
        <TextField
          id="ambientTemperature"
          label="Ambient temperature"
          placeholder="e.g. 40 °C"
          hint="Around the bank where it works; sets the cells' temperature and expected life (25 °C if empty)."
          error={errors.ambientTemperature?.message}
          {...register("ambientTemperature")}
        />
        <TextField
          id="rmsCurrent"
          label="RMS current in service"
          placeholder="e.g. 30 A"
          hint="The current the bank carries on average (rms); sizes the cells' self-heating."
          error={errors.rmsCurrent?.message}
          {...register("rmsCurrent")}
        />
      </fieldset>

      <fieldset className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-500">Limits and quantity</legend>
        <TextField id="maxMass" label="Mass limit (optional)" placeholder="e.g. 25 kg" error={errors.maxMass?.message} {...register("maxMass")} />
        <TextField id="maxVolume" label="Volume limit (optional)" placeholder="e.g. 12 L" error={errors.maxVolume?.message} {...register("maxVolume")} />
        <TextField
          id="quantity"
          label="Quantity"
          inputMode="numeric"
          hint="How many identical banks."
          error={errors.quantity?.message}
          {...register("quantity")}
        />
        <SelectField id="technology" label="Technology" error={errors.technology?.message} {...register("technology")}>
          <option value="">Any the shop builds</option>
          {TECHNOLOGIES.map((t) => (
            <option key={t} value={t}>
              {TECHNOLOGY_LABELS[t]}
            </option>
          ))}
        </SelectField>
      </fieldset>

      <div className="grid gap-4 lg:grid-cols-2">
        <FieldShell
          id="notes"
          label="Notes (optional)"
          hint={`Anything the shop should know: mounting, connectors, duty cycle… up to ${MAX_NOTES_LENGTH} characters.`}
          error={errors.notes?.message}
        >
          <textarea
            id="notes"
            rows={4}
            aria-invalid={errors.notes ? true : undefined}
            className={`block w-full rounded-md border bg-white px-3 py-2 text-sm text-ink-900 shadow-sm ${errors.notes ? "border-danger-500" : "border-ink-200"}`}
            {...register("notes")}
          />
        </FieldShell>
        <AttachmentsField slug={slug} viewer={viewer} files={attachments} onChange={onAttachmentsChange} />
      </div>

      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" disabled={searching} aria-busy={searching}>
          {searching ? "Searching the shop's stock…" : "Show arrangements"}
        </Button>
        <Button type="button" variant="quiet" onClick={onClear}>
          Start again
        </Button>
      </div>
    </form>
  );
}
