"use client";
import { useEffect, useId, useMemo, useRef, useState } from "react";
import { NetworkDiagram } from "@/components/bank-diagram/network-diagram";
import { formatQuantity } from "@/lib/quantities";
import {
  add,
  duplicate,
  indent,
  locate,
  move,
  nameOf,
  outdent,
  remove,
  setKind,
  setPart,
  toCustom,
  visible,
  walk,
  wrap,
  type Edit,
  type EditorNode,
} from "@/lib/quoting/editor-tree";
import type { CustomBankFigures } from "@/lib/quoting/types";

export interface PartChoice {
  sku: string;
  /** "3000 F, 2.7 V, EDLC" */
  summary: string;
  retired: boolean;
}

/** The catalog's parts as the options of a part chooser: active ones first, then retired ones. */
function PartOptions({ parts }: { parts: PartChoice[] }) {
  const label = (p: PartChoice) => `${p.sku} — ${p.summary}${p.retired ? " (retired)" : ""}`;
  return (
    <>
      {[...parts.filter((p) => !p.retired), ...parts.filter((p) => p.retired)].map((p) => (
        <option key={p.sku} value={p.sku}>
          {label(p)}
        </option>
      ))}
    </>
  );
}

const tool =
  "rounded-md bg-white px-2.5 py-1.5 text-xs font-medium text-ink-800 ring-1 ring-ink-200 hover:bg-ink-50 focus-visible:outline-none focus-visible:ring-2 focus-visible:ring-copper-500 disabled:text-ink-300";

/**
 * The network editor: a custom bank as a tree of series and parallel groups of catalog cells, fully
 * usable from the keyboard (a WAI-ARIA tree: arrows move, letters add, Delete removes, Alt+arrows
 * move a node; every change is announced), with the part of each cell, the engine's live figures
 * and the drawing of the circuit. The tree lives with the caller (`tree`, `onChange`), which also
 * evaluates it (`figures`, `issues`, `problems`, `warnings`).
 */
export function NetworkEditor({
  tree,
  onChange,
  parts,
  figures,
  issues,
  problems,
  warnings,
}: {
  tree: EditorNode;
  onChange: (tree: EditorNode) => void;
  parts: PartChoice[];
  figures: CustomBankFigures | null;
  issues: { at: string; message: string }[];
  problems: string[];
  warnings: string[];
}) {
  const id = useId();
  const [focusKey, setFocusKey] = useState(tree.key);
  const [collapsed, setCollapsed] = useState<ReadonlySet<string>>(new Set());
  const [said, setSaid] = useState("");
  const [newPart, setNewPart] = useState(parts.find((p) => !p.retired)?.sku ?? parts[0]?.sku ?? "");
  const [count, setCount] = useState(1);
  const [undo, setUndo] = useState<EditorNode[]>([]);
  const [allCells, setAllCells] = useState(false);
  const items = useRef(new Map<string, HTMLLIElement>());
  const moveFocus = useRef(false);
  const partSelect = useRef<HTMLSelectElement>(null);

  const shown = useMemo(() => visible(tree, collapsed), [tree, collapsed]);
  const focused = locate(tree, focusKey) ?? (shown[0] as NonNullable<ReturnType<typeof locate>>);
  const placeOf = useMemo(() => new Map(walk(tree).map((l) => [l.node.key, l.place])), [tree]);
  const voltages = useMemo(() => new Map(figures?.cells.map((c) => [c.id, c.voltage]) ?? []), [figures]);
  const issueAt = useMemo(() => new Map(issues.map((i) => [i.at, i.message])), [issues]);

  useEffect(() => {
    if (!moveFocus.current) return;
    moveFocus.current = false;
    items.current.get(focusKey)?.focus();
  }, [focusKey, shown]);

  const apply = (e: Edit) => {
    setSaid(e.said);
    if (!e.ok) return;
    setUndo((u) => [...u.slice(-49), tree]);
    onChange(e.tree);
    moveFocus.current = true;
    setFocusKey(e.focus);
  };
  const goTo = (key: string) => {
    moveFocus.current = true;
    setFocusKey(key);
  };
  const back = () => {
    const previous = undo.at(-1);
    if (!previous) {
      setSaid("Nothing to undo.");
      return;
    }
    setUndo((u) => u.slice(0, -1));
    onChange(previous);
    setSaid("Undid the last change.");
    moveFocus.current = true;
    setFocusKey(locate(previous, focusKey) ? focusKey : previous.key);
  };
  const toggle = (key: string, open: boolean) =>
    setCollapsed((c) => {
      const next = new Set(c);
      if (open) next.delete(key);
      else next.add(key);
      return next;
    });

  function onKeyDown(e: React.KeyboardEvent) {
    const i = shown.findIndex((l) => l.node.key === focused.node.key);
    const node = focused.node;
    const group = node.kind !== "cell";
    const open = group && !collapsed.has(node.key);
    const k = e.key;
    const handled = () => {
      e.preventDefault();
      e.stopPropagation();
    };
    if ((e.ctrlKey || e.metaKey) && k.toLowerCase() === "z") return (handled(), back());
    if (e.altKey && k === "ArrowUp") return (handled(), apply(move(tree, node.key, -1)));
    if (e.altKey && k === "ArrowDown") return (handled(), apply(move(tree, node.key, 1)));
    if (e.altKey && k === "ArrowLeft") return (handled(), apply(outdent(tree, node.key)));
    if (e.altKey && k === "ArrowRight") return (handled(), apply(indent(tree, node.key)));
    if (e.altKey || e.ctrlKey || e.metaKey) return;
    switch (k) {
      case "ArrowDown":
        handled();
        if (shown[i + 1]) goTo(shown[i + 1]!.node.key);
        return;
      case "ArrowUp":
        handled();
        if (i > 0) goTo(shown[i - 1]!.node.key);
        return;
      case "Home":
        handled();
        goTo(shown[0]!.node.key);
        return;
      case "End":
        handled();
        goTo(shown[shown.length - 1]!.node.key);
        return;
      case "ArrowRight":
        handled();
        if (group && !open) toggle(node.key, true);
        else if (group && node.children[0]) goTo(node.children[0].key);
        return;
      case "ArrowLeft":
        handled();
        if (group && open && focused.parent) toggle(node.key, false);
        else if (focused.parent) goTo(focused.parent.key);
        return;
      case "Delete":
      case "Backspace":
        handled();
        apply(remove(tree, node.key));
        return;
      case "Enter":
      case "F2":
        handled();
        partSelect.current?.focus();
        return;
      case "c":
        handled();
        apply(add(tree, node.key, "cell", newPart, count));
        return;
      case "s":
        handled();
        apply(add(tree, node.key, "series", "", count));
        return;
      case "p":
        handled();
        apply(add(tree, node.key, "parallel", "", count));
        return;
      case "d":
        handled();
        apply(duplicate(tree, node.key, count));
        return;
    }
  }

  const weakest = figures?.weakest.id ?? null;
  const sortedCells = figures ? [...figures.cells].sort((a, b) => b.worstVoltage / b.ratedVoltage - a.worstVoltage / a.ratedVoltage) : [];
  const selectedPlace = placeOf.get(focused.node.key) ?? "";

  return (
    <div className="space-y-4" data-testid="network-editor">
      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,22rem)]">
        <div className="space-y-3">
          <div role="toolbar" aria-label="Edit the bank" aria-controls={`${id}-tree`} className="flex flex-wrap items-end gap-2">
            <div>
              <label htmlFor={`${id}-new-part`} className="block text-xs font-medium text-ink-700">
                Part for new cells
              </label>
              <select
                id={`${id}-new-part`}
                value={newPart}
                onChange={(e) => setNewPart(e.target.value)}
                className="mt-1 max-w-[16rem] rounded-md border border-ink-200 bg-white px-2 py-1.5 text-xs"
              >
                <PartOptions parts={parts} />
              </select>
            </div>
            <div>
              <label htmlFor={`${id}-count`} className="block text-xs font-medium text-ink-700">
                How many
              </label>
              <input
                id={`${id}-count`}
                type="number"
                min={1}
                max={200}
                value={count}
                onChange={(e) => setCount(Math.max(1, Math.min(200, Math.floor(Number(e.target.value) || 1))))}
                className="mt-1 w-16 rounded-md border border-ink-200 bg-white px-2 py-1.5 text-xs"
              />
            </div>
            <button type="button" className={tool} aria-keyshortcuts="c" onClick={() => apply(add(tree, focused.node.key, "cell", newPart, count))}>
              Add cell (c)
            </button>
            <button type="button" className={tool} aria-keyshortcuts="s" onClick={() => apply(add(tree, focused.node.key, "series", "", count))}>
              Add series group (s)
            </button>
            <button type="button" className={tool} aria-keyshortcuts="p" onClick={() => apply(add(tree, focused.node.key, "parallel", "", count))}>
              Add parallel group (p)
            </button>
            <button type="button" className={tool} aria-keyshortcuts="d" onClick={() => apply(duplicate(tree, focused.node.key, count))}>
              Copy (d)
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Delete" onClick={() => apply(remove(tree, focused.node.key))}>
              Remove (Del)
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Alt+ArrowUp" onClick={() => apply(move(tree, focused.node.key, -1))}>
              Move up
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Alt+ArrowDown" onClick={() => apply(move(tree, focused.node.key, 1))}>
              Move down
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Alt+ArrowLeft" onClick={() => apply(outdent(tree, focused.node.key))}>
              Move out of group
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Alt+ArrowRight" onClick={() => apply(indent(tree, focused.node.key))}>
              Move into group before
            </button>
            <button type="button" className={tool} aria-keyshortcuts="Control+Z" disabled={undo.length === 0} onClick={back}>
              Undo
            </button>
          </div>
          <p id={`${id}-keys`} className="text-xs text-ink-500">
            In the tree: ↑ ↓ move, → opens a group, ← closes it or goes to its group; c, s, p add a cell, a series or a parallel group (into the selected group,
            or after the selected cell); d copies; Delete removes; Alt+arrows move the selected node; Enter chooses its part; Ctrl+Z undoes.
          </p>
          <ul
            id={`${id}-tree`}
            role="tree"
            aria-label="The bank, as groups and cells"
            aria-describedby={`${id}-keys`}
            onKeyDown={onKeyDown}
            className="max-h-[28rem] overflow-auto rounded-lg bg-white p-2 text-sm ring-1 ring-ink-100"
            data-testid="bank-tree"
          >
            {shown.map((l) => {
              const n = l.node;
              const isFocus = n.key === focused.node.key;
              const siblings = l.parent?.children.length ?? 1;
              const issue = issueAt.get(l.place === "" && n.kind === "cell" ? "1" : l.place);
              const v = n.kind === "cell" ? voltages.get(l.place || "1") : undefined;
              return (
                <li
                  key={n.key}
                  ref={(el) => {
                    if (el) items.current.set(n.key, el);
                    else items.current.delete(n.key);
                  }}
                  role="treeitem"
                  aria-level={l.depth}
                  aria-setsize={siblings}
                  aria-posinset={l.index + 1}
                  aria-selected={isFocus}
                  aria-expanded={n.kind === "cell" ? undefined : !collapsed.has(n.key)}
                  tabIndex={isFocus ? 0 : -1}
                  onClick={() => setFocusKey(n.key)}
                  onFocus={() => setFocusKey(n.key)}
                  data-place={l.place || "root"}
                  className={`flex cursor-default items-center gap-2 rounded px-2 py-1 outline-none focus-visible:ring-2 focus-visible:ring-copper-500 ${isFocus ? "bg-copper-50" : "hover:bg-ink-50"}`}
                  style={{ paddingLeft: `${0.5 + (l.depth - 1) * 1.25}rem` }}
                >
                  {n.kind === "cell" ? (
                    <span aria-hidden="true" className="text-ink-400">
                      ┤├
                    </span>
                  ) : (
                    <span aria-hidden="true" className="w-3 text-ink-500">
                      {collapsed.has(n.key) ? "▸" : "▾"}
                    </span>
                  )}
                  <span className={n.kind === "cell" && l.place === weakest ? "font-semibold text-danger-700" : "text-ink-900"}>
                    {l.place === "" ? "Bank" : l.place} · {n.kind === "cell" ? n.sku || "choose a part" : `${n.kind} group (${n.children.length})`}
                  </span>
                  {v !== undefined ? <span className="num text-xs text-charge-700">{formatQuantity(v, "V")}</span> : null}
                  {issue ? <span className="text-xs font-medium text-danger-700">{issue}</span> : null}
                </li>
              );
            })}
          </ul>
          <p aria-live="polite" className="min-h-[1.25rem] text-xs text-ink-700" data-testid="editor-said">
            {said}
          </p>
        </div>

        <div className="space-y-3 rounded-lg bg-white p-3 ring-1 ring-ink-100">
          <h4 className="text-sm font-semibold text-ink-800">Selected: {nameOf({ node: focused.node, place: selectedPlace })}</h4>
          {focused.node.kind === "cell" ? (
            <div>
              <label htmlFor={`${id}-part`} className="block text-xs font-medium text-ink-700">
                Part of this cell
              </label>
              <select
                id={`${id}-part`}
                ref={partSelect}
                value={focused.node.sku}
                onChange={(e) => apply(setPart(tree, focused.node.key, e.target.value))}
                className="mt-1 w-full rounded-md border border-ink-200 bg-white px-2 py-1.5 text-sm"
              >
                {focused.node.sku === "" ? <option value="">Choose a part</option> : null}
                <PartOptions parts={parts} />
              </select>
              <div className="mt-2 flex flex-wrap gap-2">
                <button type="button" className={tool} onClick={() => apply(wrap(tree, focused.node.key, "parallel"))}>
                  Put in a parallel group
                </button>
                <button type="button" className={tool} onClick={() => apply(wrap(tree, focused.node.key, "series"))}>
                  Put in a series group
                </button>
              </div>
            </div>
          ) : (
            <div className="space-y-2">
              <fieldset>
                <legend className="text-xs font-medium text-ink-700">Members connect in</legend>
                <div className="mt-1 flex gap-4 text-sm">
                  {(["series", "parallel"] as const).map((kind) => (
                    <label key={kind} className="inline-flex items-center gap-1.5">
                      <input
                        type="radio"
                        name={`${id}-kind`}
                        checked={focused.node.kind === kind}
                        onChange={() => apply(setKind(tree, focused.node.key, kind))}
                      />{" "}
                      {kind}
                    </label>
                  ))}
                </div>
              </fieldset>
              <div>
                <label htmlFor={`${id}-paint`} className="block text-xs font-medium text-ink-700">
                  Set every cell of this group to
                </label>
                <select
                  id={`${id}-paint`}
                  ref={partSelect}
                  value=""
                  onChange={(e) => e.target.value && apply(setPart(tree, focused.node.key, e.target.value))}
                  className="mt-1 w-full rounded-md border border-ink-200 bg-white px-2 py-1.5 text-sm"
                >
                  <option value="">Choose a part</option>
                  <PartOptions parts={parts} />
                </select>
              </div>
            </div>
          )}

          <div className="border-t border-ink-100 pt-3" data-testid="custom-figures">
            <h4 className="text-sm font-semibold text-ink-800">The engine&apos;s figures at the requirement&apos;s maximum voltage</h4>
            {figures ? (
              <dl className="mt-2 grid grid-cols-2 gap-x-3 gap-y-1 text-xs">
                <dt className="text-ink-600">Capacitance</dt>
                <dd className="num" data-testid="custom-capacitance">
                  {formatQuantity(figures.capacitance, "F")}
                </dd>
                <dt className="text-ink-600">ESR</dt>
                <dd className="num">{formatQuantity(figures.esr, "ohm")}</dd>
                <dt className="text-ink-600">Rated voltage (weakest cell limits)</dt>
                <dd className="num">{formatQuantity(figures.maxVoltage, "V")}</dd>
                <dt className="text-ink-600">Stored energy at {formatQuantity(figures.appliedVoltage, "V")}</dt>
                <dd className="num">{formatQuantity(figures.energy, "J")}</dd>
                <dt className="text-ink-600">Cells, mass</dt>
                <dd className="num">
                  {figures.cellCount}, {formatQuantity(figures.mass, "kg")}
                </dd>
                <dt className="text-ink-600">Weakest cell</dt>
                <dd className="num font-semibold text-danger-700" data-testid="weakest-cell">
                  {figures.weakest.id} ({figures.weakest.sku}): up to {formatQuantity(figures.weakest.worstVoltage, "V")} of{" "}
                  {formatQuantity(figures.weakest.ratedVoltage, "V")}
                </dd>
              </dl>
            ) : (
              <p className="mt-1 text-xs text-ink-600">Add cells and choose their parts to see the figures.</p>
            )}
            {problems.length + warnings.length > 0 ? (
              <ul className="mt-2 space-y-1 text-xs">
                {problems.map((p) => (
                  <li key={p} className="rounded bg-danger-100 px-2 py-1 text-danger-700" role="alert">
                    {p}
                  </li>
                ))}
                {warnings.map((w) => (
                  <li key={w} className="rounded bg-hazard-100 px-2 py-1 text-hazard-700">
                    {w}
                  </li>
                ))}
              </ul>
            ) : null}
          </div>
        </div>
      </div>

      {figures ? (
        <details
          className="rounded-lg bg-white p-3 text-sm ring-1 ring-ink-100"
          open={allCells}
          onToggle={(e) => setAllCells((e.target as HTMLDetailsElement).open)}
        >
          <summary className="cursor-pointer font-medium text-ink-800">
            Each cell&apos;s voltage ({figures.cellCount} cells, nearest their rating first)
          </summary>
          <div className="mt-2 max-h-72 overflow-auto">
            <table className="w-full text-xs">
              <thead className="bg-ink-50 text-ink-700">
                <tr>
                  <th scope="col" className="px-2 py-1 text-left font-medium">
                    Cell
                  </th>
                  <th scope="col" className="px-2 py-1 text-left font-medium">
                    Part
                  </th>
                  <th scope="col" className="px-2 py-1 text-right font-medium">
                    Voltage
                  </th>
                  <th scope="col" className="px-2 py-1 text-right font-medium">
                    Worst case
                  </th>
                  <th scope="col" className="px-2 py-1 text-right font-medium">
                    Rated
                  </th>
                </tr>
              </thead>
              <tbody>
                {sortedCells.map((c) => (
                  <tr key={c.id} className={`border-t border-ink-100 ${c.worstVoltage > c.ratedVoltage ? "bg-danger-100" : ""}`}>
                    <td className="num px-2 py-1">{c.id}</td>
                    <td className="px-2 py-1">{c.sku}</td>
                    <td className="num px-2 py-1 text-right">{formatQuantity(c.voltage, "V")}</td>
                    <td className="num px-2 py-1 text-right">{formatQuantity(c.worstVoltage, "V")}</td>
                    <td className="num px-2 py-1 text-right">{formatQuantity(c.ratedVoltage, "V")}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      ) : null}

      <div className="overflow-x-auto rounded-lg bg-white p-3 ring-1 ring-ink-100">
        <NetworkDiagram tree={toCustom(tree)} voltages={voltages} weakest={weakest} selected={selectedPlace || null} />
      </div>
    </div>
  );
}
