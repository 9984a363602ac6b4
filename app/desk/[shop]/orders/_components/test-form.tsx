"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { FieldShell, FormMessage, SelectField, TextField } from "@/components/ui/field";
import { MAX_HOLD_MINUTES, recordTestSchema } from "@/lib/validation/orders";
import { recordTest } from "../actions";
import { useActionResult } from "./use-action-form";

const formSchema = recordTestSchema.omit({ number: true });
type Input = z.input<typeof formSchema>;

/** Banks offered in a list; above this the bank is typed. */
const LISTED_BANKS = 50;

/**
 * One bank's acceptance test as the tester reads it off the instruments: values with their units,
 * the hold, and each position's voltage one per line in position order. The server judges it against
 * the limits shown beside the form.
 */
export function TestForm({
  shop,
  number,
  quantity,
  positions,
  holdMinutes,
}: {
  shop: string;
  number: string;
  quantity: number;
  positions: string[];
  holdMinutes: number;
}) {
  const { register, handleSubmit, formState, setError, getValues, reset } = useForm<Input, unknown, z.output<typeof formSchema>>({
    resolver: zodResolver(formSchema),
    defaultValues: { bank: 1, capacitance: "", esr: "", leakageCurrent: "", holdMinutes, positionVoltages: "", note: "" },
  });
  const { message, take } = useActionResult(setError);
  const [verdict, setVerdict] = useState<{ passed: boolean; failed: string[] } | null>(null);
  const onSubmit = handleSubmit(async () => {
    const raw = getValues();
    const r = await recordTest(shop, { ...raw, number });
    setVerdict(r.ok ? r.data : null);
    if (take(r, (d) => (d.passed ? `Bank ${raw.bank}: passed.` : `Bank ${raw.bank}: failed (${d.failed.join(", ").toLowerCase()}). Rework and test again.`)))
      reset({ ...raw, capacitance: "", esr: "", leakageCurrent: "", positionVoltages: "", note: "", bank: Math.min(quantity, Number(raw.bank) + 1) });
  });
  const shown = positions.length <= 6 ? positions.join(", ") : `${positions.slice(0, 3).join(", ")} … ${positions.at(-1)}`;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="Record a test">
      {quantity <= LISTED_BANKS ? (
        <SelectField id="test-bank" label="Bank" error={formState.errors.bank?.message} {...register("bank")}>
          {Array.from({ length: quantity }, (_, i) => (
            <option key={i + 1} value={i + 1}>
              Bank {i + 1} of {quantity}
            </option>
          ))}
        </SelectField>
      ) : (
        <TextField id="test-bank" label={`Bank (1 to ${quantity})`} inputMode="numeric" error={formState.errors.bank?.message} {...register("bank")} />
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          id="test-capacitance"
          label="Capacitance"
          placeholder="e.g. 24.1 F"
          error={formState.errors.capacitance?.message}
          {...register("capacitance")}
        />
        <TextField id="test-esr" label="ESR" placeholder="e.g. 52 mΩ" error={formState.errors.esr?.message} {...register("esr")} />
        <TextField
          id="test-hold"
          label="Hold at the test voltage (minutes)"
          inputMode="numeric"
          hint={`Up to ${MAX_HOLD_MINUTES.toLocaleString("en-GB")} minutes.`}
          error={formState.errors.holdMinutes?.message}
          {...register("holdMinutes")}
        />
        <TextField
          id="test-leakage"
          label="Leakage current after the hold"
          placeholder="e.g. 1.2 mA"
          error={formState.errors.leakageCurrent?.message}
          {...register("leakageCurrent")}
        />
      </div>
      <FieldShell
        id="test-positions"
        label={`Voltage of each position after the hold (${positions.length})`}
        hint={`One value per line, in order: ${shown}.`}
        error={formState.errors.positionVoltages?.message}
      >
        <textarea
          id="test-positions"
          rows={Math.min(8, Math.max(3, positions.length))}
          className="num block w-full rounded-md border border-ink-200 px-3 py-2 text-sm"
          aria-describedby={formState.errors.positionVoltages ? "test-positions-error" : "test-positions-hint"}
          aria-invalid={formState.errors.positionVoltages ? true : undefined}
          {...register("positionVoltages")}
        />
      </FieldShell>
      <TextField id="test-note" label="Note (optional)" error={formState.errors.note?.message} {...register("note")} />
      <FormMessage tone={message?.tone === "info" && verdict && !verdict.passed ? "error" : message?.tone}>{message?.text}</FormMessage>
      <Button type="submit" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? "Saving…" : "Record the test"}
      </Button>
    </form>
  );
}
