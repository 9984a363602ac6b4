"use client";
import type { UseFormReturn } from "react-hook-form";
import { SelectField, TextField } from "@/components/ui/field";
import { FAULT_FILTERS } from "@/lib/bank/types";
import type { RequestFormOutput, RequestFormValues } from "@/lib/validation/request-form";
import { FAULT_FILTER_LABELS } from "@/lib/vocabulary";

type Form = UseFormReturn<RequestFormValues, unknown, RequestFormOutput>;

/**
 * The customer's filters over the options — the failure the bank must survive, the least expected
 * life — and the ranking, applied by searching the shop's stock again (so the dozen shown are the
 * best that pass, not the few of the last dozen that do).
 */
export function OptionFilters({ form, onApply, searching }: { form: Form; onApply: () => void; searching: boolean }) {
  const { register, formState } = form;
  const errors = formState.errors;
  return (
    <form
      aria-label="Filter and rank the arrangements"
      className="grid gap-3 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-4 lg:items-end"
      onSubmit={(e) => {
        e.preventDefault();
        onApply();
      }}
      data-testid="option-filters"
    >
      <SelectField id="survives" label="Must survive" error={errors.survives?.message} {...register("survives", { onChange: onApply })}>
        <option value="">Any failure behaviour</option>
        {FAULT_FILTERS.map((f) => (
          <option key={f} value={f}>
            {FAULT_FILTER_LABELS[f]}
          </option>
        ))}
      </SelectField>
      <TextField
        id="minLifeYears"
        label="Expected life at least (years)"
        inputMode="decimal"
        placeholder="10"
        error={errors.minLifeYears?.message}
        {...register("minLifeYears")}
      />
      <SelectField id="rankBy" label="Rank by" error={errors.rankBy?.message} {...register("rankBy", { onChange: onApply })}>
        <option value="price">Price, cheapest first</option>
        <option value="life">Expected life, longest first</option>
      </SelectField>
      <button
        type="submit"
        disabled={searching}
        className="inline-flex items-center justify-center rounded-md bg-white px-4 py-2 text-sm font-medium text-ink-800 ring-1 ring-ink-200 hover:bg-ink-50 disabled:text-ink-300"
      >
        {searching ? "Searching…" : "Apply"}
      </button>
    </form>
  );
}
