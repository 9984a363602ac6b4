/**
 * The network editor's tree: the custom bank (CustomNode) with a stable key on every node, so focus
 * and selection follow a node through edits, and every edit as a pure function that answers the new
 * tree and a sentence for screen readers — or refuses with the reason (the editor's bounds, the
 * root). No framework: the editor component calls these, and unit tests do too.
 */
import { MAX_CUSTOM_BANK_CELLS, MAX_CUSTOM_BANK_DEPTH } from "@/lib/validation/limits";
import type { CustomNode, PricedOption } from "./types";

export type EditorNode = { key: string; kind: "cell"; sku: string } | { key: string; kind: "series" | "parallel"; children: EditorNode[] };

export type Edit = { ok: true; tree: EditorNode; focus: string; said: string } | { ok: false; said: string };

let counter = 0;
/** A key no other node of this page has. */
export function newKey(): string {
  counter += 1;
  return `n${counter}`;
}

export function fromCustom(node: CustomNode): EditorNode {
  return node.kind === "cell" ? { key: newKey(), kind: "cell", sku: node.sku } : { key: newKey(), kind: node.kind, children: node.children.map(fromCustom) };
}

export function toCustom(node: EditorNode): CustomNode {
  return node.kind === "cell" ? { kind: "cell", sku: node.sku } : { kind: node.kind, children: node.children.map(toCustom) };
}

/** An engine option as a tree: groups in series of cells in parallel, or strings in parallel of cells in series. */
export function treeOfOption(o: Pick<PricedOption, "topology" | "seriesCount" | "parallelCount" | "cell">): CustomNode {
  const leaf = (): CustomNode => ({ kind: "cell", sku: o.cell.sku });
  if (o.topology === "series-of-parallel-groups") {
    return {
      kind: "series",
      children: Array.from({ length: o.seriesCount }, () => ({ kind: "parallel" as const, children: Array.from({ length: o.parallelCount }, leaf) })),
    };
  }
  return {
    kind: "parallel",
    children: Array.from({ length: o.parallelCount }, () => ({ kind: "series" as const, children: Array.from({ length: o.seriesCount }, leaf) })),
  };
}

export interface Located {
  node: EditorNode;
  /** parent group, null for the root */
  parent: Extract<EditorNode, { kind: "series" | "parallel" }> | null;
  index: number;
  depth: number;
  /** the node's place as the quote names it: "" root, "2.1" */
  place: string;
}

/** Every node in document order with its parent, place and depth (without recursion). */
export function walk(tree: EditorNode): Located[] {
  const out: Located[] = [];
  const stack: Located[] = [{ node: tree, parent: null, index: 0, depth: 1, place: "" }];
  while (stack.length > 0) {
    const at = stack.pop() as Located;
    out.push(at);
    if (at.node.kind !== "cell") {
      const group = at.node;
      for (let i = group.children.length - 1; i >= 0; i--) {
        stack.push({
          node: group.children[i] as EditorNode,
          parent: group,
          index: i,
          depth: at.depth + 1,
          place: at.place === "" ? String(i + 1) : `${at.place}.${i + 1}`,
        });
      }
    }
  }
  return out;
}

export function locate(tree: EditorNode, key: string): Located | null {
  return walk(tree).find((l) => l.node.key === key) ?? null;
}

export function countCells(node: EditorNode): number {
  return walk(node).filter((l) => l.node.kind === "cell").length;
}

function depthOf(node: EditorNode): number {
  return Math.max(...walk(node).map((l) => l.depth));
}

/** The node's name for announcements: "cell 2.1 (QFS-0650R27)", "parallel group 3", "the bank". */
export function nameOf(l: Pick<Located, "node" | "place">): string {
  if (l.place === "") return l.node.kind === "cell" ? "the bank's only cell" : `the bank (${l.node.kind} group)`;
  return l.node.kind === "cell" ? `cell ${l.place} (${l.node.sku || "no part yet"})` : `${l.node.kind} group ${l.place}`;
}

/** A copy of the tree with the node `key` replaced by what `change` makes of it (structural sharing elsewhere). */
function replace(tree: EditorNode, key: string, change: (n: EditorNode) => EditorNode): EditorNode {
  if (tree.key === key) return change(tree);
  if (tree.kind === "cell") return tree;
  let changed = false;
  const children = tree.children.map((c) => {
    const next = replace(c, key, change);
    if (next !== c) changed = true;
    return next;
  });
  return changed ? { ...tree, children } : tree;
}

function withinBounds(tree: EditorNode): string | null {
  if (countCells(tree) > MAX_CUSTOM_BANK_CELLS) return `A custom bank may hold at most ${MAX_CUSTOM_BANK_CELLS.toLocaleString("en-GB")} cells.`;
  if (depthOf(tree) > MAX_CUSTOM_BANK_DEPTH) return `Groups may nest at most ${MAX_CUSTOM_BANK_DEPTH} levels deep.`;
  return null;
}

function done(tree: EditorNode, focus: string, said: string): Edit {
  const refused = withinBounds(tree);
  return refused ? { ok: false, said: refused } : { ok: true, tree, focus, said };
}

/** Where something added at the focused node goes: into it when it is a group, after it otherwise. */
export function add(tree: EditorNode, at: string, what: "cell" | "series" | "parallel", sku: string, count = 1): Edit {
  const l = locate(tree, at);
  if (!l) return { ok: false, said: "Nothing is selected." };
  const n = Math.max(1, Math.min(Math.floor(count), MAX_CUSTOM_BANK_CELLS));
  const made: EditorNode[] = Array.from({ length: n }, () =>
    what === "cell" ? { key: newKey(), kind: "cell", sku } : { key: newKey(), kind: what, children: [] },
  );
  const label = what === "cell" ? `${n === 1 ? "a cell" : `${n} cells`}${sku ? ` of ${sku}` : ""}` : `${n === 1 ? "a" : n} ${what} group${n === 1 ? "" : "s"}`;
  if (l.node.kind !== "cell") {
    const group = l.node;
    const next = replace(tree, group.key, () => ({ ...group, children: [...group.children, ...made] }));
    return done(next, (made[0] as EditorNode).key, `Added ${label} to ${nameOf(l)}, which now has ${group.children.length + n} members.`);
  }
  if (!l.parent) {
    // the root is a single cell: it becomes a series string of itself and the new ones
    const next: EditorNode = { key: newKey(), kind: "series", children: [l.node, ...made] };
    return done(next, (made[0] as EditorNode).key, `Added ${label} in series with the bank's cell.`);
  }
  const parent = l.parent;
  const children = [...parent.children.slice(0, l.index + 1), ...made, ...parent.children.slice(l.index + 1)];
  return done(
    replace(tree, parent.key, () => ({ ...parent, children })),
    (made[0] as EditorNode).key,
    `Added ${label} after ${nameOf(l)}, in ${parent.kind}.`,
  );
}

/** Removes the node; the root is emptied instead. Focus goes to a neighbour or the parent. */
export function remove(tree: EditorNode, at: string): Edit {
  const l = locate(tree, at);
  if (!l) return { ok: false, said: "Nothing is selected." };
  if (!l.parent) {
    const empty: EditorNode = { key: tree.key, kind: tree.kind === "cell" ? "series" : tree.kind, children: [] };
    return { ok: true, tree: empty, focus: empty.key, said: "Emptied the bank." };
  }
  const parent = l.parent;
  const children = parent.children.filter((c) => c.key !== at);
  const focus = children[Math.min(l.index, children.length - 1)]?.key ?? parent.key;
  return {
    ok: true,
    tree: replace(tree, parent.key, () => ({ ...parent, children })),
    focus,
    said: `Removed ${nameOf(l)}; ${parent.kind} group ${l.place.split(".").slice(0, -1).join(".") || "(the bank)"} has ${children.length} members.`,
  };
}

/** Moves the node one place up or down among its siblings. */
export function move(tree: EditorNode, at: string, by: -1 | 1): Edit {
  const l = locate(tree, at);
  if (!l?.parent) return { ok: false, said: "The bank itself cannot move." };
  const parent = l.parent;
  const to = l.index + by;
  if (to < 0 || to >= parent.children.length) return { ok: false, said: by < 0 ? `${nameOf(l)} is already first.` : `${nameOf(l)} is already last.` };
  const children = [...parent.children];
  [children[l.index], children[to]] = [children[to] as EditorNode, children[l.index] as EditorNode];
  return {
    ok: true,
    tree: replace(tree, parent.key, () => ({ ...parent, children })),
    focus: at,
    said: `Moved ${nameOf(l)} ${by < 0 ? "up" : "down"}: it is now member ${to + 1} of ${parent.children.length}.`,
  };
}

/** Moves the node out of its group, to just after that group. */
export function outdent(tree: EditorNode, at: string): Edit {
  const l = locate(tree, at);
  if (!l?.parent) return { ok: false, said: "The bank itself cannot move." };
  const parentAt = locate(tree, l.parent.key) as Located;
  if (!parentAt.parent) return { ok: false, said: `${nameOf(l)} is already in the bank's top group.` };
  const grand = parentAt.parent;
  const without = replace(tree, l.parent.key, (p) => (p.kind === "cell" ? p : { ...p, children: p.children.filter((c) => c.key !== at) }));
  const g = locate(without, grand.key)?.node;
  if (!g || g.kind === "cell") return { ok: false, said: "That move is not possible." };
  const children = [...g.children.slice(0, parentAt.index + 1), l.node, ...g.children.slice(parentAt.index + 1)];
  return done(
    replace(without, g.key, () => ({ ...g, children })),
    at,
    `Moved ${nameOf(l)} out of ${nameOf(parentAt)}, into ${g.kind} group ${parentAt.place.split(".").slice(0, -1).join(".") || "(the bank)"}.`,
  );
}

/** Moves the node into the group just before it (as that group's last member). */
export function indent(tree: EditorNode, at: string): Edit {
  const l = locate(tree, at);
  if (!l?.parent) return { ok: false, said: "The bank itself cannot move." };
  const before = l.parent.children[l.index - 1];
  if (!before || before.kind === "cell") return { ok: false, said: `There is no group just before ${nameOf(l)} to move it into.` };
  const without = replace(tree, l.parent.key, (p) => (p.kind === "cell" ? p : { ...p, children: p.children.filter((c) => c.key !== at) }));
  return done(
    replace(without, before.key, (b) => (b.kind === "cell" ? b : { ...b, children: [...b.children, l.node] })),
    at,
    `Moved ${nameOf(l)} into the ${before.kind} group before it.`,
  );
}

function copy(node: EditorNode): EditorNode {
  return node.kind === "cell" ? { ...node, key: newKey() } : { key: newKey(), kind: node.kind, children: node.children.map(copy) };
}

/** Puts `times` copies of the node right after it. */
export function duplicate(tree: EditorNode, at: string, times = 1): Edit {
  const l = locate(tree, at);
  if (!l?.parent) return { ok: false, said: "Select a cell or a group inside the bank to copy it." };
  const n = Math.max(1, Math.min(Math.floor(times), MAX_CUSTOM_BANK_CELLS));
  const copies = Array.from({ length: n }, () => copy(l.node));
  const parent = l.parent;
  const children = [...parent.children.slice(0, l.index + 1), ...copies, ...parent.children.slice(l.index + 1)];
  return done(
    replace(tree, parent.key, () => ({ ...parent, children })),
    (copies[0] as EditorNode).key,
    `Copied ${nameOf(l)} ${n === 1 ? "once" : `${n} times`}; ${parent.kind} group now has ${children.length} members.`,
  );
}

/** Sets the part of one cell, or of every cell inside a group. */
export function setPart(tree: EditorNode, at: string, sku: string): Edit {
  const l = locate(tree, at);
  if (!l) return { ok: false, said: "Nothing is selected." };
  const paint = (n: EditorNode): EditorNode => (n.kind === "cell" ? { ...n, sku } : { ...n, children: n.children.map(paint) });
  const cells = countCells(l.node);
  return {
    ok: true,
    tree: replace(tree, at, paint),
    focus: at,
    said: l.node.kind === "cell" ? `${nameOf(l)} is now ${sku}.` : `All ${cells} cells of ${nameOf(l)} are now ${sku}.`,
  };
}

/** Turns a series group into a parallel one, or the other way round. */
export function setKind(tree: EditorNode, at: string, kind: "series" | "parallel"): Edit {
  const l = locate(tree, at);
  if (!l || l.node.kind === "cell") return { ok: false, said: "Select a group to change how its members connect." };
  return { ok: true, tree: replace(tree, at, (n) => (n.kind === "cell" ? n : { ...n, kind })), focus: at, said: `${nameOf(l)} is now a ${kind} group.` };
}

/** Wraps the node in a new group of the given kind (to put a cell in parallel with another, say). */
export function wrap(tree: EditorNode, at: string, kind: "series" | "parallel"): Edit {
  const l = locate(tree, at);
  if (!l) return { ok: false, said: "Nothing is selected." };
  const group: EditorNode = { key: newKey(), kind, children: [l.node] };
  return done(
    replace(tree, at, () => group),
    at,
    `Put ${nameOf(l)} in a new ${kind} group.`,
  );
}

/** The nodes a keyboard moves through: all of them, except inside collapsed groups. */
export function visible(tree: EditorNode, collapsed: ReadonlySet<string>): Located[] {
  const out: Located[] = [];
  const hiddenUnder: string[] = [];
  for (const l of walk(tree)) {
    if (hiddenUnder.some((place) => l.place.startsWith(`${place}.`) || (place === "" && l.place !== ""))) continue;
    out.push(l);
    if (l.node.kind !== "cell" && collapsed.has(l.node.key)) hiddenUnder.push(l.place);
  }
  return out;
}
