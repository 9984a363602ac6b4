"use client";
import { useRouter } from "next/navigation";
import { useCallback, useEffect, useId, useMemo, useState, useTransition } from "react";
import { NetworkEditor, type PartChoice } from "@/components/network-editor/network-editor";
import { Button } from "@/components/ui/button";
import { FormMessage } from "@/components/ui/field";
import type { DesignFactors, Requirement } from "@/lib/bank";
import { formatMoney, type BankPrice, type PricingRules } from "@/lib/pricing";
import { freezeCell } from "@/lib/quoting/bill";
import { composeRevision, resolveCustomBank, resolveEngineOption, type ResolveResult } from "@/lib/quoting/compose-revision";
import { fromCustom, toCustom, treeOfOption, type EditorNode } from "@/lib/quoting/editor-tree";
import { FACTOR_OVERRIDES, effectiveFactors, factorRange } from "@/lib/quoting/review-search";
import { OVERRIDABLE_FACTORS, type CatalogCell, type CatalogComponent, type CustomNode, type PricedOption } from "@/lib/quoting/types";
import { formatQuantity } from "@/lib/quantities";
import { issuableDraftSchema, type WorkbenchDraft } from "@/lib/validation/workbench";
import { arrangementLabel, EXTRA_LINE_KINDS, EXTRA_LINE_LABELS, TECHNOLOGY_SHORT, TOPOLOGY_LABELS, type ExtraLineKind } from "@/lib/vocabulary";
import { exploreReviewOptions, issueRevision, saveReviewDraft, type ReviewOptions } from "../actions";

const DEFAULT_UNITS: Record<ExtraLineKind, string> = { enclosure: "pc", "discharge-circuit": "pc", engineering: "h", freight: "lot", other: "pc" };
const input = "block w-full rounded-md border bg-white px-2 py-1.5 text-sm";
const border = (bad: boolean) => (bad ? "border-danger-500" : "border-ink-200");

function FieldError({ id, errors }: { id: string; errors?: string[] }) {
  if (!errors?.length) return null;
  return (
    <p id={id} role="alert" className="mt-0.5 text-xs font-medium text-danger-700">
      {errors[0]}
    </p>
  );
}

export interface WorkbenchProps {
  shop: string;
  requestId: string;
  requirement: Requirement;
  rules: PricingRules;
  shopFactors: DesignFactors;
  /** every cell of the catalog, active and retired */
  cells: CatalogCell[];
  retiredSkus: string[];
  components: CatalogComponent[];
  initialDraft: WorkbenchDraft;
  draftVersion: number;
  /** the latest revision issued for this request (0: none yet) */
  basedOnRevision: number;
  quoteNumber: string | null;
}

/**
 * The estimator's workbench for one request: the bank (one of the engine's options under the
 * overrides, or a custom bank in the network editor), the lines and the discount, the live totals
 * (the same pure functions the server runs when the revision is issued), a draft saved on demand,
 * and issuing the revision.
 */
export function Workbench(p: WorkbenchProps) {
  const router = useRouter();
  const id = useId();
  const [draft, setDraft] = useState<WorkbenchDraft>(p.initialDraft);
  const [tab, setTab] = useState<"engine" | "custom">(p.initialDraft.bank.kind);
  const [choice, setChoice] = useState(p.initialDraft.bank.kind === "engine" ? p.initialDraft.bank.choice : null);
  const [tree, setTree] = useState<EditorNode>(() =>
    fromCustom(p.initialDraft.bank.kind === "custom" ? p.initialDraft.bank.network : { kind: "series", children: [] }),
  );
  const [found, setFound] = useState<ReviewOptions | null>(null);
  const [searching, startSearch] = useTransition();
  const [busy, startBusy] = useTransition();
  const [version, setVersion] = useState(p.draftVersion);
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ tone: "info" | "error"; text: string } | null>(null);
  const overrides = draft.bank.overrides;
  const quantity = p.requirement.quantity ?? 1;
  const retired = useMemo(() => new Set(p.retiredSkus), [p.retiredSkus]);
  const currency = p.rules.currency;
  const money = (a: string) => formatMoney(a, currency);

  const patch = (change: Partial<WorkbenchDraft>) => setDraft((d) => ({ ...d, ...change }));
  const setOverrides = (o: WorkbenchDraft["bank"]["overrides"]) => setDraft((d) => ({ ...d, bank: { ...d.bank, overrides: o } }));

  const explore = useCallback(
    (o: WorkbenchDraft["bank"]["overrides"]) =>
      startSearch(async () => {
        const r = await exploreReviewOptions(p.shop, { requestId: p.requestId, overrides: o });
        if (r.ok) {
          setFound(r.data);
          setErrors((e) => ({ ...e, overrides: [] }));
        } else setErrors((e) => ({ ...e, ...(r.fieldErrors ?? {}), overrides: [r.message ?? "The search did not run."] }));
      }),
    [p.shop, p.requestId],
  );
  useEffect(() => {
    explore(p.initialDraft.bank.overrides);
  }, [explore, p.initialDraft.bank.overrides]);

  // the bank as the current tab has it, resolved exactly as the server will
  const customTree: CustomNode = useMemo(() => toCustom(tree), [tree]);
  const resolved: (ResolveResult & { figures?: unknown }) | null = useMemo(() => {
    const all = p.cells;
    if (tab === "custom") {
      return resolveCustomBank(customTree, {
        cells: all,
        retiredSkus: retired,
        components: p.components,
        rules: p.rules,
        factors: effectiveFactors(p.shopFactors, overrides),
        shopFactors: p.shopFactors,
        overrides,
        requirement: p.requirement,
      });
    }
    if (!found || !choice) return null;
    const bySku = new Map(all.map((c) => [c.sku, c]));
    const search = {
      designFactors: effectiveFactors(p.shopFactors, overrides),
      currency,
      options: found.options,
      records: found.options.map((o, i) => ({ price: found.costs[i] ?? null, cell: freezeCell(bySku.get(o.cell.sku) as CatalogCell) })),
      reasons: found.reasons,
    };
    return resolveEngineOption(search, choice, {
      cells: all,
      retiredSkus: retired,
      components: p.components,
      rules: p.rules,
      shopFactors: p.shopFactors,
      overrides,
      quantity,
    });
  }, [tab, customTree, found, choice, overrides, p.cells, p.rules, p.shopFactors, p.requirement, p.components, retired, currency, quantity]);

  const composed = resolved?.ok ? composeRevision(resolved.bank, draft, p.rules, quantity) : null;
  const customFigures = tab === "custom" && resolved && "figures" in resolved ? (resolved.figures as Parameters<typeof NetworkEditor>[0]["figures"]) : null;

  const fullDraft = (): WorkbenchDraft => ({
    ...draft,
    bank: tab === "engine" ? { kind: "engine", choice, overrides } : { kind: "custom", network: customTree, overrides },
  });

  function save() {
    startBusy(async () => {
      setMessage(null);
      const r = await saveReviewDraft(p.shop, { requestId: p.requestId, draft: fullDraft(), version });
      if (r.ok) {
        setVersion(r.data.version);
        setMessage({ tone: "info", text: "Draft saved." });
      } else setMessage({ tone: "error", text: r.message ?? "The draft was not saved." });
    });
  }

  function issue() {
    const next = fullDraft();
    const checked = issuableDraftSchema.safeParse(next);
    const local: Record<string, string[]> = {};
    if (!checked.success) for (const i of checked.error.issues) (local[i.path.join(".") || "_form"] ??= []).push(i.message);
    if (composed && !composed.ok) for (const [k, v] of Object.entries(composed.fieldErrors)) local[k] ??= v;
    if (!resolved?.ok) local.bank = [resolved ? resolved.message : "Choose one of the engine's options or build a custom bank."];
    setErrors(local);
    if (Object.keys(local).length > 0) {
      setMessage({ tone: "error", text: "Please correct the marked fields." });
      return;
    }
    startBusy(async () => {
      setMessage(null);
      const r = await issueRevision(p.shop, { requestId: p.requestId, draft: next, basedOnRevision: p.basedOnRevision });
      if (!r.ok) {
        setErrors(r.fieldErrors ?? {});
        setMessage({ tone: "error", text: r.message ?? "The revision was not issued." });
        return;
      }
      router.push(`/desk/${p.shop}/quotes/${encodeURIComponent(r.data.number)}`);
    });
  }

  const parts: PartChoice[] = useMemo(
    () =>
      p.cells.map((c) => ({
        sku: c.sku,
        retired: retired.has(c.sku),
        summary: `${formatQuantity(c.capacitanceF, "F")}, ${formatQuantity(c.ratedVoltageV, "V")}, ${TECHNOLOGY_SHORT[c.technology]}`,
      })),
    [p.cells, retired],
  );
  const err = (key: string) => errors[key];
  const described = (key: string) => (errors[key]?.length ? `${id}-${key}-error` : undefined);
  const nextRevision = p.basedOnRevision + 1;

  return (
    <div className="space-y-6">
      <section aria-labelledby={`${id}-bank`} className="space-y-4 rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <h2 id={`${id}-bank`} className="text-base font-semibold">
          The bank
        </h2>
        <div role="tablist" aria-label="How the bank is designed" className="flex gap-1 border-b border-ink-100">
          {(
            [
              ["engine", "Engine options"],
              ["custom", "Custom bank (network editor)"],
            ] as const
          ).map(([key, label]) => (
            <button
              key={key}
              type="button"
              role="tab"
              id={`${id}-tab-${key}`}
              aria-selected={tab === key}
              aria-controls={`${id}-panel-${key}`}
              tabIndex={tab === key ? 0 : -1}
              onClick={() => setTab(key)}
              onKeyDown={(e) => {
                if (e.key === "ArrowRight" || e.key === "ArrowLeft") {
                  const next = tab === "engine" ? "custom" : "engine";
                  setTab(next);
                  document.getElementById(`${id}-tab-${next}`)?.focus();
                }
              }}
              className={`-mb-px rounded-t-md px-3 py-2 text-sm font-medium focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-copper-500 ${tab === key ? "border border-b-white border-ink-100 bg-white text-ink-900" : "text-ink-600 hover:text-ink-900"}`}
            >
              {label}
            </button>
          ))}
        </div>

        <fieldset className="rounded-md bg-ink-50 p-3">
          <legend className="px-1 text-sm font-medium text-ink-800">Overrides for this request (recorded on the quote)</legend>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            {OVERRIDABLE_FACTORS.map((k) => {
              const f = FACTOR_OVERRIDES[k];
              const shown = overrides.factors[k];
              const toField = (v: number) => String(Number((f.percent ? v * 100 : v).toPrecision(6)));
              return (
                <div key={k}>
                  <label htmlFor={`${id}-f-${k}`} className="block text-xs font-medium text-ink-700">
                    {f.label}
                    {f.percent ? " (%)" : ""}
                  </label>
                  <input
                    id={`${id}-f-${k}`}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    placeholder={`shop: ${toField(p.shopFactors[k])}`}
                    defaultValue={shown === undefined ? "" : toField(shown)}
                    aria-describedby={`${id}-f-${k}-hint`}
                    aria-invalid={err(`bank.overrides.factors.${k}`) ? true : undefined}
                    onChange={(e) => {
                      const raw = e.target.value.trim();
                      const factors = { ...overrides.factors };
                      if (raw === "") delete factors[k];
                      else factors[k] = f.percent ? Number(raw) / 100 : Number(raw);
                      setOverrides({ ...overrides, factors });
                    }}
                    className={`mt-1 ${input} ${border(!!err(`bank.overrides.factors.${k}`))}`}
                  />
                  <p id={`${id}-f-${k}-hint`} className="mt-0.5 text-xs text-ink-500">
                    {factorRange(k)}. {f.hint}
                  </p>
                  <FieldError id={`${id}-f-${k}-error`} errors={err(`bank.overrides.factors.${k}`)} />
                </div>
              );
            })}
            <div>
              <label htmlFor={`${id}-longer`} className="block text-xs font-medium text-ink-700">
                Longer strings to consider
              </label>
              <input
                id={`${id}-longer`}
                type="number"
                min={0}
                max={8}
                value={overrides.longerStrings}
                onChange={(e) => setOverrides({ ...overrides, longerStrings: Math.max(0, Math.min(8, Math.floor(Number(e.target.value) || 0))) })}
                className={`mt-1 ${input} ${border(false)}`}
                aria-describedby={`${id}-longer-hint`}
              />
              <p id={`${id}-longer-hint`} className="mt-0.5 text-xs text-ink-500">
                Series strings up to this many cells longer than the shortest safe one (the shop offers 1).
              </p>
            </div>
            <label className="flex items-center gap-2 self-center text-sm">
              <input
                type="checkbox"
                checked={overrides.includeRetiredCells}
                onChange={(e) => setOverrides({ ...overrides, includeRetiredCells: e.target.checked })}
              />
              Offer retired cells too ({p.retiredSkus.length})
            </label>
          </div>
          <div className="mt-3">
            <Button type="button" variant="secondary" onClick={() => explore(overrides)} disabled={searching} aria-busy={searching}>
              {searching ? "Searching…" : "Search with these settings"}
            </Button>
          </div>
          <FieldError id={`${id}-overrides-error`} errors={err("overrides")} />
        </fieldset>

        <div id={`${id}-panel-engine`} role="tabpanel" aria-labelledby={`${id}-tab-engine`} hidden={tab !== "engine"}>
          {found && found.options.length === 0 ? (
            <div className="rounded-md bg-hazard-100 p-3 text-sm text-hazard-700">
              <p className="font-medium">No option from the catalog fits under these settings.</p>
              <ul className="mt-1 list-disc pl-5">
                {found.reasons.map((r) => (
                  <li key={r}>{r}</li>
                ))}
              </ul>
              <p className="mt-1">Change the overrides, or build a custom bank.</p>
            </div>
          ) : null}
          {found && found.options.length > 0 ? (
            <div className="overflow-x-auto">
              <table className="w-full text-sm" data-testid="review-options">
                <caption className="sr-only">The engine&apos;s options under these settings, cheapest first</caption>
                <thead className="bg-ink-50 text-ink-700">
                  <tr>
                    {["", "Cell", "Arrangement", "C nominal", "Worst cell", "Mass", "Lead time", "Cost per bank", "Price per bank"].map((h, i) => (
                      <th key={i} scope="col" className={`px-2 py-1.5 font-medium ${i >= 3 ? "text-right" : "text-left"}`}>
                        {h || <span className="sr-only">Choose</span>}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {found.options.map((o: PricedOption, i) => {
                    const key = `${o.cell.sku}|${o.topology}|${o.seriesCount}|${o.parallelCount}`;
                    const chosen = choice !== null && `${choice.sku}|${choice.topology}|${choice.seriesCount}|${choice.parallelCount}` === key;
                    const cost: BankPrice | null = found.costs[i] ?? null;
                    return (
                      <tr key={key} className={`border-t border-ink-100 ${chosen ? "bg-copper-50" : ""}`}>
                        <td className="px-2 py-1.5">
                          <input
                            type="radio"
                            name={`${id}-option`}
                            checked={chosen}
                            aria-label={`Choose ${o.cell.sku}, ${arrangementLabel(o)}, ${TOPOLOGY_LABELS[o.topology]}`}
                            onChange={() => setChoice({ sku: o.cell.sku, topology: o.topology, seriesCount: o.seriesCount, parallelCount: o.parallelCount })}
                          />
                        </td>
                        <td className="px-2 py-1.5">
                          {o.cell.sku}
                          {retired.has(o.cell.sku) ? <span className="ml-1 rounded bg-hazard-100 px-1 text-xs text-hazard-700">retired</span> : null}
                        </td>
                        <td className="whitespace-nowrap px-2 py-1.5">
                          {arrangementLabel(o)}
                          <span className="block text-xs text-ink-500">
                            {TOPOLOGY_LABELS[o.topology]}
                            {o.longerLife ? ", longer string" : ""}
                            {o.balancing.activeBoard ? ", active balancing" : ""}
                          </span>
                        </td>
                        <td className="num px-2 py-1.5 text-right">{formatQuantity(o.capacitance.nominal, "F")}</td>
                        <td className="num px-2 py-1.5 text-right">{formatQuantity(o.worstCellVoltage, "V")}</td>
                        <td className="num px-2 py-1.5 text-right">{formatQuantity(o.mass, "kg")}</td>
                        <td className="num px-2 py-1.5 text-right">{o.leadTimeDays} d</td>
                        <td className="num px-2 py-1.5 text-right">{cost ? money(cost.cost) : "—"}</td>
                        <td className="num px-2 py-1.5 text-right">{o.price ? money(o.price.perBank) : "set by hand"}</td>
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          ) : null}
          {choice ? (
            <div className="mt-3">
              <Button
                type="button"
                variant="secondary"
                onClick={() => {
                  const o = found?.options.find(
                    (x) =>
                      x.cell.sku === choice.sku &&
                      x.topology === choice.topology &&
                      x.seriesCount === choice.seriesCount &&
                      x.parallelCount === choice.parallelCount,
                  );
                  if (!o) return;
                  setTree(fromCustom(treeOfOption(o)));
                  setTab("custom");
                }}
              >
                Start a custom bank from this option
              </Button>
            </div>
          ) : null}
        </div>

        <div id={`${id}-panel-custom`} role="tabpanel" aria-labelledby={`${id}-tab-custom`} hidden={tab !== "custom"}>
          {tab === "custom" ? (
            <NetworkEditor
              tree={tree}
              onChange={setTree}
              parts={parts}
              figures={customFigures}
              issues={resolved && !resolved.ok ? (resolved.issues ?? []) : []}
              problems={resolved && !resolved.ok && !resolved.issues ? [resolved.message] : []}
              warnings={resolved?.ok ? [...resolved.bank.option.warnings, ...resolved.bank.warnings] : []}
            />
          ) : null}
        </div>
        <FieldError id={`${id}-bank-error`} errors={err("bank")} />
        {resolved?.ok && tab === "engine" && resolved.bank.warnings.length > 0 ? (
          <ul className="space-y-1 text-xs">
            {resolved.bank.warnings.map((w) => (
              <li key={w} className="rounded bg-hazard-100 px-2 py-1 text-hazard-700">
                {w}
              </li>
            ))}
          </ul>
        ) : null}
      </section>

      <section aria-labelledby={`${id}-lines`} className="space-y-4 rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <h2 id={`${id}-lines`} className="text-base font-semibold">
          Lines and price
        </h2>
        {resolved?.ok ? (
          <p className="text-sm text-ink-700">
            The shop&apos;s rules price the bank at <strong className="num">{money(resolved.bank.cost.unitPrice)}</strong> (cost{" "}
            {money(resolved.bank.cost.cost)}, margin {resolved.bank.cost.marginPct} %), for {quantity} bank{quantity === 1 ? "" : "s"}
            {Number(resolved.bank.cost.discountPct) > 0 ? ` with the ${resolved.bank.cost.discountPct} % quantity break` : ""}.
          </p>
        ) : (
          <p className="text-sm text-ink-600">Choose an option or build a custom bank to price it.</p>
        )}
        <div className="grid gap-3 sm:grid-cols-[auto_minmax(0,1fr)_minmax(0,2fr)] sm:items-start">
          <label className="flex items-center gap-2 text-sm sm:mt-6">
            <input
              type="checkbox"
              checked={draft.bankPrice !== null}
              onChange={(e) => patch({ bankPrice: e.target.checked ? { unitPrice: resolved?.ok ? resolved.bank.cost.unitPrice : "", reason: "" } : null })}
            />
            Set the price per bank
          </label>
          {draft.bankPrice ? (
            <>
              <div>
                <label htmlFor={`${id}-bank-price`} className="block text-xs font-medium text-ink-700">
                  Price per bank ({currency})
                </label>
                <input
                  id={`${id}-bank-price`}
                  inputMode="decimal"
                  value={draft.bankPrice.unitPrice}
                  onChange={(e) => patch({ bankPrice: { ...draft.bankPrice!, unitPrice: e.target.value } })}
                  aria-invalid={err("bankPrice.unitPrice") ? true : undefined}
                  aria-describedby={described("bankPrice.unitPrice")}
                  className={`mt-1 ${input} ${border(!!err("bankPrice.unitPrice"))}`}
                />
                <FieldError id={`${id}-bankPrice.unitPrice-error`} errors={err("bankPrice.unitPrice")} />
              </div>
              <div>
                <label htmlFor={`${id}-bank-reason`} className="block text-xs font-medium text-ink-700">
                  Why (kept on the quote, for staff)
                </label>
                <input
                  id={`${id}-bank-reason`}
                  value={draft.bankPrice.reason}
                  maxLength={200}
                  onChange={(e) => patch({ bankPrice: { ...draft.bankPrice!, reason: e.target.value } })}
                  className={`mt-1 ${input} ${border(false)}`}
                />
              </div>
            </>
          ) : null}
        </div>

        <div>
          <h3 className="text-sm font-semibold text-ink-800">Added lines</h3>
          {draft.lines.length === 0 ? <p className="text-sm text-ink-600">None yet.</p> : null}
          <ul className="mt-2 space-y-3">
            {draft.lines.map((line, i) => {
              const set = (change: Partial<(typeof draft.lines)[number]>) => patch({ lines: draft.lines.map((l, j) => (j === i ? { ...l, ...change } : l)) });
              const f = (name: string) => `lines.${i}.${name}`;
              return (
                <li
                  key={i}
                  className="grid gap-2 rounded-md bg-ink-50 p-2 sm:grid-cols-[10rem_minmax(0,1fr)_5rem_4rem_7rem_auto] sm:items-end"
                  data-testid="extra-line"
                >
                  <div>
                    <label htmlFor={`${id}-l${i}-kind`} className="block text-xs font-medium text-ink-700">
                      Kind
                    </label>
                    <select
                      id={`${id}-l${i}-kind`}
                      value={line.kind}
                      onChange={(e) => set({ kind: e.target.value as ExtraLineKind })}
                      className={`mt-1 ${input} ${border(false)}`}
                    >
                      {EXTRA_LINE_KINDS.map((k) => (
                        <option key={k} value={k}>
                          {EXTRA_LINE_LABELS[k]}
                        </option>
                      ))}
                    </select>
                  </div>
                  {(
                    [
                      ["description", "Description", "text"],
                      ["quantity", "Quantity", "decimal"],
                      ["unit", "Unit", "text"],
                      ["unitPrice", `Unit price (${currency})`, "decimal"],
                    ] as const
                  ).map(([name, label, mode]) => (
                    <div key={name}>
                      <label htmlFor={`${id}-l${i}-${name}`} className="block text-xs font-medium text-ink-700">
                        {label}
                      </label>
                      <input
                        id={`${id}-l${i}-${name}`}
                        inputMode={mode === "decimal" ? "decimal" : undefined}
                        value={line[name]}
                        onChange={(e) => set({ [name]: e.target.value })}
                        aria-invalid={err(f(name)) ? true : undefined}
                        aria-describedby={described(f(name))}
                        className={`mt-1 ${input} ${border(!!err(f(name)))}`}
                      />
                      <FieldError id={`${id}-${f(name)}-error`} errors={err(f(name))} />
                    </div>
                  ))}
                  <Button
                    type="button"
                    variant="quiet"
                    onClick={() => patch({ lines: draft.lines.filter((_, j) => j !== i) })}
                    aria-label={`Remove line ${i + 1}`}
                  >
                    Remove
                  </Button>
                </li>
              );
            })}
          </ul>
          <div className="mt-2 flex flex-wrap gap-2">
            {EXTRA_LINE_KINDS.map((k) => (
              <Button
                key={k}
                type="button"
                variant="secondary"
                disabled={draft.lines.length >= 20}
                onClick={() =>
                  patch({ lines: [...draft.lines, { kind: k, description: EXTRA_LINE_LABELS[k], quantity: "1", unit: DEFAULT_UNITS[k], unitPrice: "" }] })
                }
              >
                Add {EXTRA_LINE_LABELS[k].toLowerCase()}
              </Button>
            ))}
          </div>
        </div>

        <div className="grid gap-3 sm:grid-cols-[12rem_8rem_minmax(0,1fr)]">
          <div>
            <label htmlFor={`${id}-discount-kind`} className="block text-xs font-medium text-ink-700">
              Discount
            </label>
            <select
              id={`${id}-discount-kind`}
              value={draft.discount?.kind ?? "none"}
              onChange={(e) =>
                patch({
                  discount:
                    e.target.value === "none"
                      ? null
                      : { kind: e.target.value as "percent" | "amount", value: draft.discount?.value ?? "", reason: draft.discount?.reason ?? "" },
                })
              }
              className={`mt-1 ${input} ${border(false)}`}
            >
              <option value="none">None</option>
              <option value="percent">Percentage of the quote</option>
              <option value="amount">Fixed amount</option>
            </select>
          </div>
          {draft.discount ? (
            <>
              <div>
                <label htmlFor={`${id}-discount-value`} className="block text-xs font-medium text-ink-700">
                  {draft.discount.kind === "percent" ? "Percent" : `Amount (${currency})`}
                </label>
                <input
                  id={`${id}-discount-value`}
                  inputMode="decimal"
                  value={draft.discount.value}
                  onChange={(e) => patch({ discount: { ...draft.discount!, value: e.target.value } })}
                  aria-invalid={err("discount.value") ? true : undefined}
                  aria-describedby={described("discount.value")}
                  className={`mt-1 ${input} ${border(!!err("discount.value"))}`}
                />
                <FieldError id={`${id}-discount.value-error`} errors={err("discount.value")} />
              </div>
              <div>
                <label htmlFor={`${id}-discount-reason`} className="block text-xs font-medium text-ink-700">
                  Reason for the discount (required)
                </label>
                <input
                  id={`${id}-discount-reason`}
                  value={draft.discount.reason}
                  maxLength={200}
                  onChange={(e) => patch({ discount: { ...draft.discount!, reason: e.target.value } })}
                  aria-invalid={err("discount.reason") ? true : undefined}
                  aria-describedby={described("discount.reason")}
                  className={`mt-1 ${input} ${border(!!err("discount.reason"))}`}
                />
                <FieldError id={`${id}-discount.reason-error`} errors={err("discount.reason")} />
              </div>
            </>
          ) : null}
        </div>

        {composed?.ok ? (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="workbench-totals">
              <caption className="sr-only">The quote as the customer will see it</caption>
              <thead className="bg-ink-50 text-ink-700">
                <tr>
                  <th scope="col" className="px-2 py-1.5 text-left font-medium">
                    Line
                  </th>
                  <th scope="col" className="px-2 py-1.5 text-right font-medium">
                    Quantity
                  </th>
                  <th scope="col" className="hidden px-2 py-1.5 text-right font-medium sm:table-cell">
                    Unit price
                  </th>
                  <th scope="col" className="px-2 py-1.5 text-right font-medium">
                    Amount
                  </th>
                </tr>
              </thead>
              <tbody>
                {composed.sheet.lines.map((l, i) => (
                  <tr key={i} className="border-t border-ink-100">
                    <td className="px-2 py-1.5">
                      {l.description}
                      {l.listUnitPrice ? <span className="block text-xs text-ink-500">rules: {money(l.listUnitPrice)}</span> : null}
                    </td>
                    <td className="num px-2 py-1.5 text-right">
                      {Number(l.quantity)} {l.unit}
                    </td>
                    <td className="num hidden px-2 py-1.5 text-right sm:table-cell">{money(l.unitPrice)}</td>
                    <td className="num px-2 py-1.5 text-right">{money(l.amount)}</td>
                  </tr>
                ))}
              </tbody>
              <tfoot>
                {Number(composed.sheet.breakDiscount) > 0 ? (
                  <tr className="border-t border-ink-100">
                    <th scope="row" colSpan={2} className="px-2 py-1 text-right font-normal">
                      Quantity discount
                    </th>
                    <td className="hidden sm:table-cell" />
                    <td className="num px-2 py-1 text-right">−{money(composed.sheet.breakDiscount)}</td>
                  </tr>
                ) : null}
                {composed.sheet.discount ? (
                  <tr className="border-t border-ink-100">
                    <th scope="row" colSpan={2} className="px-2 py-1 text-right font-normal">
                      Discount: {composed.sheet.discount.reason}
                    </th>
                    <td className="hidden sm:table-cell" />
                    <td className="num px-2 py-1 text-right">−{money(composed.sheet.discount.amount)}</td>
                  </tr>
                ) : null}
                <tr className="border-t border-ink-100">
                  <th scope="row" colSpan={2} className="px-2 py-1 text-right font-normal">
                    Subtotal
                  </th>
                  <td className="hidden sm:table-cell" />
                  <td className="num px-2 py-1 text-right">{money(composed.sheet.subtotal)}</td>
                </tr>
                <tr className="border-t border-ink-100">
                  <th scope="row" colSpan={2} className="px-2 py-1 text-right font-normal">
                    Tax ({composed.sheet.taxPct} %)
                  </th>
                  <td className="hidden sm:table-cell" />
                  <td className="num px-2 py-1 text-right">{money(composed.sheet.tax)}</td>
                </tr>
                <tr className="border-t-2 border-ink-800 text-base font-semibold">
                  <th scope="row" colSpan={2} className="px-2 py-1 text-right">
                    Total
                  </th>
                  <td className="hidden sm:table-cell" />
                  <td className="num px-2 py-1 text-right" data-testid="workbench-total">
                    {money(composed.sheet.total)}
                  </td>
                </tr>
              </tfoot>
            </table>
          </div>
        ) : composed && !composed.ok ? (
          <p className="text-sm text-danger-700" role="status">
            The totals appear when the lines are complete: {Object.values(composed.fieldErrors).flat()[0] ?? composed.message}
          </p>
        ) : null}
      </section>

      <section aria-labelledby={`${id}-send`} className="space-y-3 rounded-lg bg-white p-4 ring-1 ring-ink-100">
        <h2 id={`${id}-send`} className="text-base font-semibold">
          Issue
        </h2>
        <div className="grid gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
          <div>
            <label htmlFor={`${id}-validity`} className="block text-xs font-medium text-ink-700">
              Valid for (days)
            </label>
            <input
              id={`${id}-validity`}
              type="number"
              min={1}
              max={365}
              value={draft.validityDays}
              onChange={(e) => patch({ validityDays: Math.floor(Number(e.target.value) || 0) })}
              aria-invalid={err("validityDays") ? true : undefined}
              aria-describedby={described("validityDays")}
              className={`mt-1 ${input} ${border(!!err("validityDays"))}`}
            />
            <FieldError id={`${id}-validityDays-error`} errors={err("validityDays")} />
          </div>
          <div>
            <label htmlFor={`${id}-note`} className="block text-xs font-medium text-ink-700">
              Note to the customer with this revision (in the e-mail and the thread)
            </label>
            <textarea
              id={`${id}-note`}
              rows={3}
              maxLength={4000}
              value={draft.note}
              onChange={(e) => patch({ note: e.target.value })}
              className={`mt-1 ${input} ${border(!!err("note"))}`}
            />
          </div>
        </div>
        <div className="flex flex-wrap gap-2">
          <Button type="button" onClick={issue} disabled={busy} aria-busy={busy}>
            {busy ? "Working…" : p.quoteNumber ? `Issue revision ${nextRevision} of ${p.quoteNumber}` : "Issue the quote (revision 1)"}
          </Button>
          <Button type="button" variant="secondary" onClick={save} disabled={busy}>
            Save draft
          </Button>
        </div>
        {message ? <FormMessage tone={message.tone}>{message.text}</FormMessage> : null}
      </section>
    </div>
  );
}
