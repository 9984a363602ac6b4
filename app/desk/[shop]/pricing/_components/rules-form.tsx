"use client";
import { zodResolver } from "@/lib/validation/zod-resolver";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { FieldShell, FormMessage, SelectField, TextField } from "@/components/ui/field";
import { formatMoney } from "@/lib/pricing/currency";
import type { RuleChange } from "@/lib/pricing/rule-versions";
import type { RepricedQuote } from "@/lib/quoting/reprice";
import { CURRENCY_CODES, MAX_RULE_LIST, pricingRulesFormCheckedSchema, type PricingRulesFormValues } from "@/lib/validation/pricing";
import { previewPricingRules, savePricingRules } from "../actions";

type Preview = { rows: RepricedQuote[]; changes: RuleChange[] };

const cell = "rounded-md border border-ink-200 bg-white px-2 py-1.5 text-sm w-full";

/**
 * The pricing rules form: every rule explained at its field, the quantity breaks and enclosures as
 * small tables, a required reason, and "what this change does" — the shop's last quotes priced
 * again under the rules in force and under the form's — before saving a new version.
 */
export function RulesForm({ shop, initial, version, canWrite }: { shop: string; initial: PricingRulesFormValues; version: number; canWrite: boolean }) {
  const router = useRouter();
  const form = useForm<PricingRulesFormValues>({ resolver: zodResolver(pricingRulesFormCheckedSchema), defaultValues: initial, mode: "onTouched" });
  const breaks = useFieldArray({ control: form.control, name: "quantityBreaks" });
  const enclosures = useFieldArray({ control: form.control, name: "enclosures" });
  const [preview, setPreview] = useState<Preview | null>(null);
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [busy, start] = useTransition();
  const errors = form.formState.errors;
  const err = (path: string): string | undefined => {
    let node: unknown = errors;
    for (const p of path.split(".")) node = (node as Record<string, unknown> | undefined)?.[p];
    return (node as { message?: string } | undefined)?.message;
  };
  const put = (fieldErrors: Record<string, string[]> | undefined) => {
    for (const [k, v] of Object.entries(fieldErrors ?? {})) form.setError(k.replace(/^values\./, "") as FieldPath<PricingRulesFormValues>, { message: v[0] });
  };

  const showPreview = () =>
    start(async () => {
      setMessage(null);
      const r = await previewPricingRules(shop, { values: form.getValues() });
      if (!r.ok) {
        put(r.fieldErrors);
        setMessage({ tone: "error", text: r.message ?? "The preview failed." });
        return;
      }
      setPreview(r.data);
    });

  const onSubmit = form.handleSubmit(() =>
    start(async () => {
      setMessage(null);
      const r = await savePricingRules(shop, { values: form.getValues(), version });
      if (!r.ok) {
        put(r.fieldErrors);
        setMessage({ tone: "error", text: r.message ?? "Not saved." });
        return;
      }
      setMessage({ tone: "info", text: `Saved as version ${r.data.version}: ${r.data.changes.length} rule${r.data.changes.length === 1 ? "" : "s"} changed.` });
      setPreview(null);
      form.reset({ ...form.getValues(), reason: "" });
      router.refresh();
    }),
  );

  const text = (name: FieldPath<PricingRulesFormValues>, label: string, hint: string, placeholder?: string) => (
    <TextField id={name} label={label} hint={hint} placeholder={placeholder} error={err(name)} readOnly={!canWrite} {...form.register(name)} />
  );
  const currency = form.watch("currency");
  const money = (a: string, c: string) => {
    try {
      return formatMoney(a, c);
    } catch {
      return a;
    }
  };

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="Pricing rules">
      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Labour</legend>
        {text("labourRatePerHour", `Labour rate per hour (${currency})`, "What an hour of the floor costs the shop.", "64.00")}
        {text("setupMinutes", "Setup minutes per bank", "Kitting and jig setup for each bank.", "75")}
        {text("minutesPerCell", "Assembly minutes per cell", "Fitting, welding and wiring one cell.", "5")}
        {text("testMinutes", "Test minutes per bank", "Capacitance, ESR and insulation tests.", "40")}
      </fieldset>

      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Overhead, margin and tax</legend>
        {text("overheadPct", "Overhead on materials (%)", "Added to the parts' cost: storage, handling, scrap.", "10")}
        {text("marginPct", "Margin on price (%)", "Price = cost ÷ (1 − margin): 26 % keeps 26 of every 100 of the price. Below 100.", "26")}
        {text("taxRatePct", "Tax rate (%)", "Charged on the subtotal of every quote.", "19")}
        <SelectField
          id="currency"
          label="Currency"
          hint="ISO 4217. Unit costs are not converted: change them with it."
          error={err("currency")}
          disabled={!canWrite}
          {...form.register("currency")}
        >
          {CURRENCY_CODES.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </SelectField>
      </fieldset>

      <fieldset className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Quantity breaks</legend>
        <p className="text-sm text-ink-600">An order of at least this many banks gets this discount on the banks; the largest break that applies counts.</p>
        <div className="overflow-x-auto">
          <table className="w-full max-w-lg text-sm">
            <thead className="text-ink-700">
              <tr>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  From (banks)
                </th>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  Discount (%)
                </th>
                <th scope="col" className="sr-only">
                  Remove
                </th>
              </tr>
            </thead>
            <tbody>
              {breaks.fields.map((f, i) => (
                <tr key={f.id} className="align-top">
                  <td className="py-1 pr-2">
                    <input
                      aria-label={`Break ${i + 1}: from how many banks`}
                      className={cell}
                      readOnly={!canWrite}
                      {...form.register(`quantityBreaks.${i}.minQuantity`)}
                    />
                    {err(`quantityBreaks.${i}.minQuantity`) ? <p className="text-xs text-danger-700">{err(`quantityBreaks.${i}.minQuantity`)}</p> : null}
                  </td>
                  <td className="py-1 pr-2">
                    <input
                      aria-label={`Break ${i + 1}: discount in %`}
                      className={cell}
                      readOnly={!canWrite}
                      {...form.register(`quantityBreaks.${i}.discountPct`)}
                    />
                    {err(`quantityBreaks.${i}.discountPct`) ? <p className="text-xs text-danger-700">{err(`quantityBreaks.${i}.discountPct`)}</p> : null}
                  </td>
                  <td className="py-1">
                    {canWrite ? (
                      <Button type="button" variant="quiet" onClick={() => breaks.remove(i)} aria-label={`Remove break ${i + 1}`}>
                        Remove
                      </Button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {canWrite && breaks.fields.length < MAX_RULE_LIST ? (
          <Button type="button" variant="secondary" onClick={() => breaks.append({ minQuantity: "", discountPct: "" })}>
            Add a break
          </Button>
        ) : null}
      </fieldset>

      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Quote terms</legend>
        {text("quoteValidityDays", "Quote validity (days)", "How long an issued quote holds its price.", "30")}
        {text(
          "depositPercent",
          "Deposit on acceptance (%)",
          "0 means the customer pays the full total at once; 30 takes 30 % up front and the rest later.",
          "0",
        )}
      </fieldset>

      <details className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <summary className="cursor-pointer text-sm font-semibold uppercase tracking-wide text-ink-500">Parts priced by these rules</summary>
        <div className="mt-4 grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          {text("interconnectCostPerCell", `Interconnect per cell (${currency})`, "One link per cell.", "1.95")}
          {text("terminalSetCost", `Terminal set per bank (${currency})`, "Positive and negative posts with covers.", "18.90")}
          {text(
            "balancingBoardCost",
            `Balancing board without a catalog cost (${currency})`,
            "Used only when a fitted board has no unit cost; empty: none.",
            "",
          )}
          {text("enclosurePackingFactor", "Enclosure packing factor", "Cell volume × this must fit the enclosure (1 or more).", "1.5")}
        </div>
        <p className="mt-4 text-sm text-ink-600">
          Enclosures: the smallest that holds the bank is used; a bank too large for all of them goes to the estimators.
        </p>
        <div className="overflow-x-auto">
          <table className="mt-2 w-full text-sm">
            <thead className="text-ink-700">
              <tr>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  Name
                </th>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  Inner volume (L)
                </th>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  Cost ({currency})
                </th>
                <th scope="col" className="sr-only">
                  Remove
                </th>
              </tr>
            </thead>
            <tbody>
              {enclosures.fields.map((f, i) => (
                <tr key={f.id} className="align-top">
                  {(["name", "volumeLitres", "cost"] as const).map((k) => (
                    <td key={k} className="py-1 pr-2">
                      <input
                        aria-label={`Enclosure ${i + 1}: ${k === "volumeLitres" ? "inner volume in litres" : k}`}
                        className={cell}
                        readOnly={!canWrite}
                        {...form.register(`enclosures.${i}.${k}`)}
                      />
                      {err(`enclosures.${i}.${k}`) ? <p className="text-xs text-danger-700">{err(`enclosures.${i}.${k}`)}</p> : null}
                    </td>
                  ))}
                  <td className="py-1">
                    {canWrite ? (
                      <Button type="button" variant="quiet" onClick={() => enclosures.remove(i)} aria-label={`Remove enclosure ${i + 1}`}>
                        Remove
                      </Button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {canWrite && enclosures.fields.length < MAX_RULE_LIST ? (
          <Button type="button" variant="secondary" className="mt-2" onClick={() => enclosures.append({ name: "", volumeLitres: "", cost: "" })}>
            Add an enclosure
          </Button>
        ) : null}
      </details>

      {canWrite ? (
        <FieldShell id="reason" label="Why the rules change" hint="Required: the history keeps it with your name and the time." error={err("reason")}>
          <textarea
            id="reason"
            rows={2}
            aria-invalid={err("reason") ? true : undefined}
            className={`block w-full rounded-md border bg-white px-3 py-2 text-sm ${err("reason") ? "border-danger-500" : "border-ink-200"}`}
            {...form.register("reason")}
          />
        </FieldShell>
      ) : null}

      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      <div className="flex flex-wrap gap-3">
        <Button type="button" variant="secondary" onClick={showPreview} disabled={busy}>
          {busy ? "Working…" : "Show what this change does"}
        </Button>
        {canWrite ? (
          <Button type="submit" disabled={busy}>
            Save as version {version === 0 ? 2 : version + 1}
          </Button>
        ) : null}
      </div>

      {preview ? <PreviewTable preview={preview} money={money} /> : null}
    </form>
  );
}

function PreviewTable({ preview, money }: { preview: Preview; money: (a: string, c: string) => string }) {
  return (
    <section className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-ink-100" aria-labelledby="preview-title" data-testid="rules-preview">
      <h2 id="preview-title" className="text-lg font-semibold">
        What this change does
      </h2>
      {preview.changes.length === 0 ? (
        <p className="text-sm text-ink-600">The form holds the rules in force: nothing changes.</p>
      ) : (
        <ul className="list-disc space-y-0.5 pl-5 text-sm">
          {preview.changes.map((c) => (
            <li key={c.key}>
              {c.label}: {c.from} → {c.to}
            </li>
          ))}
        </ul>
      )}
      <p className="text-sm text-ink-600">
        The last {preview.rows.length} quotes&apos; banks priced again with today&apos;s catalog: as the rules stand, and as the form would have them. Issued
        quotes keep their prices either way. Prices before tax; margin = what the order leaves over its cost.
      </p>
      {preview.rows.length === 0 ? (
        <p className="text-sm text-ink-600">No quotes yet to compare with.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[48rem] text-sm">
            <thead className="bg-ink-50 text-ink-700">
              <tr>
                <th scope="col" className="px-3 py-2 text-left font-medium">
                  Quote
                </th>
                <th scope="col" className="px-3 py-2 text-left font-medium">
                  Bank
                </th>
                <th scope="col" className="px-3 py-2 text-right font-medium">
                  Now
                </th>
                <th scope="col" className="px-3 py-2 text-right font-medium">
                  Proposed
                </th>
                <th scope="col" className="px-3 py-2 text-right font-medium">
                  Change
                </th>
                <th scope="col" className="px-3 py-2 text-right font-medium">
                  Margin now → proposed
                </th>
              </tr>
            </thead>
            <tbody>
              {preview.rows.map((r) => (
                <tr key={r.number} className="border-t border-ink-100 align-top">
                  <td className="whitespace-nowrap px-3 py-1.5">
                    {r.number}
                    <span className="block text-xs text-ink-500">{r.customerName}</span>
                  </td>
                  <td className="px-3 py-1.5">
                    {r.quantity} × {r.description}
                    {r.problem ? <span className="block text-xs text-danger-700">{r.problem}</span> : null}
                  </td>
                  <td className="num whitespace-nowrap px-3 py-1.5 text-right">{r.current ? money(r.current.price, r.currency) : "—"}</td>
                  <td className="num whitespace-nowrap px-3 py-1.5 text-right">{r.proposed ? money(r.proposed.price, r.currency) : "—"}</td>
                  <td className="num whitespace-nowrap px-3 py-1.5 text-right" data-testid="preview-change">
                    {r.change
                      ? `${r.change.amount.startsWith("-") ? "−" : "+"}${money(r.change.amount.replace(/^-/, ""), r.currency)} (${r.change.pct} %)`
                      : "—"}
                  </td>
                  <td className="num whitespace-nowrap px-3 py-1.5 text-right">
                    {r.current ? money(r.current.margin, r.currency) : "—"} → {r.proposed ? money(r.proposed.margin, r.currency) : "—"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
