import { describe, expect, it } from "vitest";
import {
  add,
  duplicate,
  fromCustom,
  indent,
  locate,
  move,
  outdent,
  remove,
  setKind,
  setPart,
  toCustom,
  treeOfOption,
  visible,
  walk,
  wrap,
  type Edit,
  type EditorNode,
} from "@/lib/quoting/editor-tree";
import type { CustomNode } from "@/lib/quoting/types";

// Invented part numbers.
const A = "TST-A";
const B = "TST-B";
const cell = (sku: string): CustomNode => ({ kind: "cell", sku });

function ok(e: Edit): Extract<Edit, { ok: true }> {
  if (!e.ok) throw new Error(e.said);
  return e;
}
const keyAt = (tree: EditorNode, place: string) => {
  const l = walk(tree).find((x) => x.place === place);
  if (!l) throw new Error(`no node at ${place}`);
  return l.node.key;
};

describe("the network editor's edits", () => {
  const start = () => fromCustom({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(A), cell(B)] }, cell(B)] });

  it("adds into a group, after a cell, and turns a lone root cell into a string", () => {
    const t = start();
    const intoGroup = ok(add(t, keyAt(t, "2"), "cell", B));
    expect(toCustom(intoGroup.tree)).toEqual({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(A), cell(B), cell(B)] }, cell(B)] });
    expect(intoGroup.said).toBe(`Added a cell of ${B} to parallel group 2, which now has 3 members.`);
    expect(locate(intoGroup.tree, intoGroup.focus)?.place).toBe("2.3");
    const afterCell = ok(add(t, keyAt(t, "1"), "parallel", "", 2));
    expect(toCustom(afterCell.tree).kind === "series" && (toCustom(afterCell.tree) as { children: CustomNode[] }).children.map((c) => c.kind)).toEqual([
      "cell",
      "parallel",
      "parallel",
      "parallel",
      "cell",
    ]);
    const lone = fromCustom(cell(A));
    expect(toCustom(ok(add(lone, lone.key, "cell", B)).tree)).toEqual({ kind: "series", children: [cell(A), cell(B)] });
  });

  it("removes a node (the root is emptied), and moves one among its siblings", () => {
    const t = start();
    const removed = ok(remove(t, keyAt(t, "2.1")));
    expect(toCustom(removed.tree)).toEqual({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(B)] }, cell(B)] });
    expect(locate(removed.tree, removed.focus)?.place).toBe("2.1");
    expect(toCustom(ok(remove(t, t.key)).tree)).toEqual({ kind: "series", children: [] });
    const down = ok(move(t, keyAt(t, "1"), 1));
    expect(toCustom(down.tree)).toEqual({ kind: "series", children: [{ kind: "parallel", children: [cell(A), cell(B)] }, cell(A), cell(B)] });
    expect(down.said).toMatch(/member 2 of 3/);
    expect(move(t, keyAt(t, "1"), -1)).toMatchObject({ ok: false, said: expect.stringMatching(/already first/) });
  });

  it("moves a node out of its group and into the group before it", () => {
    const t = start();
    const out = ok(outdent(t, keyAt(t, "2.2")));
    expect(toCustom(out.tree)).toEqual({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(A)] }, cell(B), cell(B)] });
    const into = ok(indent(t, keyAt(t, "3")));
    expect(toCustom(into.tree)).toEqual({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(A), cell(B), cell(B)] }] });
    expect(indent(t, keyAt(t, "1"))).toMatchObject({ ok: false });
    expect(outdent(t, keyAt(t, "1"))).toMatchObject({ ok: false });
  });

  it("copies, repaints, regroups and wraps", () => {
    const t = start();
    const copied = ok(duplicate(t, keyAt(t, "2"), 2));
    expect((toCustom(copied.tree) as { children: CustomNode[] }).children).toHaveLength(5);
    expect(new Set(walk(copied.tree).map((l) => l.node.key)).size).toBe(walk(copied.tree).length);
    const painted = ok(setPart(t, keyAt(t, "2"), B));
    expect(toCustom(painted.tree)).toEqual({ kind: "series", children: [cell(A), { kind: "parallel", children: [cell(B), cell(B)] }, cell(B)] });
    expect(painted.said).toBe(`All 2 cells of parallel group 2 are now ${B}.`);
    expect(toCustom(ok(setKind(t, keyAt(t, "2"), "series")).tree)).toEqual({
      kind: "series",
      children: [cell(A), { kind: "series", children: [cell(A), cell(B)] }, cell(B)],
    });
    expect(toCustom(ok(wrap(t, keyAt(t, "1"), "parallel")).tree)).toEqual({
      kind: "series",
      children: [{ kind: "parallel", children: [cell(A)] }, { kind: "parallel", children: [cell(A), cell(B)] }, cell(B)],
    });
  });

  it("refuses edits past the editor's bounds (1,000 cells, 8 levels)", () => {
    const t = fromCustom({ kind: "series", children: [cell(A)] });
    expect(add(t, t.key, "cell", A, 1000)).toMatchObject({ ok: false, said: expect.stringMatching(/at most 1,000 cells/) });
    let deep = fromCustom(cell(A));
    for (let i = 0; i < 7; i++) deep = ok(wrap(deep, deep.key, "series")).tree;
    expect(wrap(deep, deep.key, "series")).toMatchObject({ ok: false, said: expect.stringMatching(/8 levels/) });
  });

  it("walks what is visible, skipping collapsed groups", () => {
    const t = start();
    expect(visible(t, new Set()).map((l) => l.place)).toEqual(["", "1", "2", "2.1", "2.2", "3"]);
    expect(visible(t, new Set([keyAt(t, "2")])).map((l) => l.place)).toEqual(["", "1", "2", "3"]);
  });

  it("builds the tree of an engine option", () => {
    expect(treeOfOption({ topology: "parallel-of-series-strings", seriesCount: 2, parallelCount: 2, cell: { sku: A } as never })).toEqual({
      kind: "parallel",
      children: [
        { kind: "series", children: [cell(A), cell(A)] },
        { kind: "series", children: [cell(A), cell(A)] },
      ],
    });
  });
});
