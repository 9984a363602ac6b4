"use client";
import { reasonWords } from "@/lib/vocabulary";
import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { Button } from "@/components/ui/button";
import { FormMessage, SelectField, TextField } from "@/components/ui/field";
import { formatMoney } from "@/lib/pricing/currency";
import { formatDuration, formatQuantity } from "@/lib/quantities";
import type { SettingsPreviewOption } from "@/lib/quoting/design-settings";
import {
  readSetting,
  SETTINGS_GROUPS,
  settingText,
  type SampleRequirement,
  type SettingField,
  type SettingsFormValues,
} from "@/lib/validation/design-settings";
import { previewDesignSettings, saveDesignSettings } from "../actions";

type Preview = {
  currency: string;
  current: { options: SettingsPreviewOption[]; reasons: string[] };
  proposed: { options: SettingsPreviewOption[]; reasons: string[] };
};

function boundsText(f: SettingField): string {
  const show = (v: number) =>
    f.kind === "percent" ? `${Number((v * 100).toPrecision(6))} %` : f.kind === "quantity" ? formatQuantity(v, f.unit ?? "") : String(v);
  if (f.kind === "choice") return "";
  return ` Between ${show(f.min ?? 0)}${f.minExclusive ? " (not included)" : ""} and ${show(f.max ?? 0)}.`;
}

/**
 * Design factors, auto-quote limits and the failure, yield and life settings, each field rendered from SETTINGS_GROUPS with its bounds and
 * what it does, checked at the field as it is typed; a sample requirement's options under the
 * settings in force and under the form's before saving.
 */
export function SettingsForm({ shop, initial, sample: initialSample }: { shop: string; initial: SettingsFormValues; sample: SampleRequirement }) {
  const router = useRouter();
  const [values, setValues] = useState(initial);
  const [sample, setSample] = useState(initialSample);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [preview, setPreview] = useState<Preview | null>(null);
  const [message, setMessage] = useState<{ tone: "error" | "info"; text: string } | null>(null);
  const [busy, start] = useTransition();

  const set = (group: string, key: string, text: string) => setValues((v) => ({ ...v, [group]: { ...v[group as keyof SettingsFormValues], [key]: text } }));
  const check = (group: string, f: SettingField, text: string) => {
    const r = readSetting(f, text);
    setErrors((e) => {
      const next = { ...e };
      if (r.ok) delete next[`${group}.${f.key}`];
      else next[`${group}.${f.key}`] = r.message;
      return next;
    });
  };
  const refused = (fieldErrors?: Record<string, string[]>, text?: string) => {
    setErrors(Object.fromEntries(Object.entries(fieldErrors ?? {}).map(([k, v]) => [k.replace(/^values\./, ""), v[0] ?? ""])));
    setMessage({ tone: "error", text: text ?? "Please correct the marked fields." });
  };

  const runPreview = () =>
    start(async () => {
      setMessage(null);
      const r = await previewDesignSettings(shop, { values, sample });
      if (!r.ok) return refused(r.fieldErrors, r.message);
      setErrors({});
      setPreview(r.data);
    });
  const save = () =>
    start(async () => {
      setMessage(null);
      const r = await saveDesignSettings(shop, { values });
      if (!r.ok) return refused(r.fieldErrors, r.message);
      setErrors({});
      setMessage({
        tone: "info",
        text: r.data.changed === 0 ? "Saved; nothing had changed." : `Saved: ${r.data.changed} setting${r.data.changed === 1 ? "" : "s"} changed.`,
      });
      router.refresh();
    });

  return (
    <form
      className="space-y-6"
      aria-label="Design factors and auto-quote limits"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        save();
      }}
    >
      {SETTINGS_GROUPS.map((g) => (
        <fieldset key={g.key} className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-3">
          <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">{g.title}</legend>
          <p className="text-sm text-ink-600 sm:col-span-2 lg:col-span-3">{g.description}</p>
          {g.fields.map((f) => {
            const id = `${g.key}.${f.key}`;
            const value = values[g.key]?.[f.key] ?? "";
            const hint = `${f.help}${boundsText(f)}${f.commonPractice === undefined ? "" : ` Default ${settingText(f, f.commonPractice)}: common practice, from memory.`}`;
            return f.kind === "choice" ? (
              <SelectField key={id} id={id} label={f.label} hint={hint} error={errors[id]} value={value} onChange={(e) => set(g.key, f.key, e.target.value)}>
                {(f.choices ?? []).map((c) => (
                  <option key={c} value={c}>
                    {c}
                  </option>
                ))}
              </SelectField>
            ) : (
              <TextField
                key={id}
                id={id}
                label={f.kind === "quantity" ? `${f.label} (${f.unit})` : f.kind === "percent" ? `${f.label} (%)` : f.label}
                hint={hint}
                error={errors[id]}
                value={value}
                onChange={(e) => set(g.key, f.key, e.target.value)}
                onBlur={(e) => check(g.key, f, e.target.value)}
              />
            );
          })}
        </fieldset>
      ))}

      <fieldset className="grid gap-4 rounded-lg bg-white p-4 ring-1 ring-ink-100 sm:grid-cols-2 lg:grid-cols-4">
        <legend className="px-1 text-sm font-semibold uppercase tracking-wide text-ink-500">Sample requirement for the preview</legend>
        <TextField
          id="sample.maxVoltage"
          label="Maximum voltage"
          hint="e.g. 48 V"
          error={errors["sample.maxVoltage"]}
          value={sample.maxVoltage}
          onChange={(e) => setSample({ ...sample, maxVoltage: e.target.value })}
        />
        <TextField
          id="sample.minVoltage"
          label="Minimum voltage"
          hint="e.g. 24 V; empty means 0 V"
          error={errors["sample.minVoltage"]}
          value={sample.minVoltage}
          onChange={(e) => setSample({ ...sample, minVoltage: e.target.value })}
        />
        <SelectField
          id="sample.sizeFor"
          label="Size for"
          hint="What the amount is."
          value={sample.sizeFor}
          onChange={(e) => setSample({ ...sample, sizeFor: e.target.value as SampleRequirement["sizeFor"] })}
        >
          <option value="energy">Usable energy</option>
          <option value="capacitance">Capacitance</option>
        </SelectField>
        <TextField
          id="sample.amount"
          label={sample.sizeFor === "energy" ? "Usable energy" : "Capacitance"}
          hint={sample.sizeFor === "energy" ? "e.g. 20 kJ" : "e.g. 10 µF"}
          error={errors["sample.amount"]}
          value={sample.amount}
          onChange={(e) => setSample({ ...sample, amount: e.target.value })}
        />
      </fieldset>

      {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      <div className="flex flex-wrap gap-3">
        <Button type="button" variant="secondary" onClick={runPreview} disabled={busy}>
          {busy ? "Working…" : "Preview the sample"}
        </Button>
        <Button type="submit" disabled={busy}>
          Save the settings
        </Button>
      </div>
      {preview ? (
        <div className="grid gap-4 lg:grid-cols-2" data-testid="settings-preview">
          <OptionList title="With the settings in force" list={preview.current} currency={preview.currency} />
          <OptionList title="With the settings in the form" list={preview.proposed} currency={preview.currency} />
        </div>
      ) : null}
    </form>
  );
}

function OptionList({ title, list, currency }: { title: string; list: { options: SettingsPreviewOption[]; reasons: string[] }; currency: string }) {
  return (
    <section className="rounded-lg bg-white p-4 ring-1 ring-ink-100">
      <h3 className="text-sm font-semibold text-ink-800">{title}</h3>
      {list.options.length === 0 ? (
        <ul className="mt-2 list-disc pl-5 text-sm text-ink-600">
          {(list.reasons.length ? list.reasons : ["No option fits."]).map((r) => (
            <li key={r}>{reasonWords(r)}</li>
          ))}
        </ul>
      ) : (
        <div className="overflow-x-auto">
          <table className="mt-2 w-full text-sm">
            <thead className="text-ink-600">
              <tr>
                <th scope="col" className="py-1 pr-2 text-left font-medium">
                  Option
                </th>
                <th scope="col" className="py-1 pr-2 text-right font-medium">
                  Usable
                </th>
                <th scope="col" className="py-1 pr-2 text-right font-medium">
                  To safe
                </th>
                <th scope="col" className="py-1 text-right font-medium">
                  Per bank
                </th>
              </tr>
            </thead>
            <tbody>
              {list.options.map((o) => (
                <tr key={`${o.cell}-${o.arrangement}`} className="border-t border-ink-100 align-top">
                  <td className="py-1 pr-2">
                    {o.cell} {o.arrangement}
                    {o.review.length > 0 ? <span className="block text-xs text-hazard-700">Goes to review: {o.review[0]}</span> : null}
                  </td>
                  <td className="num whitespace-nowrap py-1 pr-2 text-right">{formatQuantity(o.usableEnergy, "J")}</td>
                  <td className="num whitespace-nowrap py-1 pr-2 text-right">{o.secondsToSafe > 0 ? formatDuration(o.secondsToSafe) : "—"}</td>
                  <td className="num whitespace-nowrap py-1 text-right">{o.perBank ? formatMoney(o.perBank, currency) : "by hand"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
