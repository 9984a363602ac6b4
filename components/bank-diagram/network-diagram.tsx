import { formatQuantity } from "@/lib/quantities";
import type { CustomNode } from "@/lib/quoting/types";

/**
 * Any tree of series and parallel groups drawn as a circuit: a series group's members side by side
 * on one line, a parallel group's members stacked between two buses, each cell a capacitor with its
 * part number (and its voltage, when given). Large groups are shortened ("… 12 more"), and past a
 * budget of drawn cells whole groups become labelled boxes, so a drawing stays readable and its
 * size bounded whatever the tree.
 */

const CELL_W = 78;
const CELL_H = 52;
const BUS = 14;
const V_GAP = 8;
const S_GAP = 10;
const PAD = 44;
const STROKE = "#1f2937";
/** the most members of one group drawn before the rest are shortened to a "… n more" gap */
const MAX_SHOWN = 6;
/** the most cells drawn in one picture; deeper groups become summary boxes */
const CELL_BUDGET = 160;

type Shape =
  | { kind: "cell"; id: string; sku: string }
  | { kind: "gap"; hidden: number; across: boolean }
  | { kind: "box"; id: string; label: string }
  | { kind: "group"; id: string; series: boolean; children: Shape[] };

interface Box {
  shape: Shape;
  w: number;
  h: number;
  /** the y of the box's two terminals */
  cy: number;
  children?: { box: Box; x: number; y: number }[];
}

const place = (parent: string, i: number) => (parent === "" ? String(i + 1) : `${parent}.${i + 1}`);

function countCells(node: CustomNode): number {
  let n = 0;
  const stack = [node];
  while (stack.length > 0) {
    const x = stack.pop() as CustomNode;
    if (x.kind === "cell") n++;
    else stack.push(...x.children);
  }
  return n;
}

/** Which members of a group are drawn: all when few, else the first ones, a gap, and the last. */
function shownMembers(n: number): (number | { hidden: number })[] {
  if (n <= MAX_SHOWN) return Array.from({ length: n }, (_, i) => i);
  const head = MAX_SHOWN - 2;
  return [...Array.from({ length: head }, (_, i) => i), { hidden: n - head - 1 }, n - 1];
}

function toShape(node: CustomNode, at: string, budget: { cells: number }): Shape {
  if (node.kind === "cell") {
    budget.cells--;
    return { kind: "cell", id: at || "1", sku: node.sku };
  }
  const cells = countCells(node);
  if (budget.cells <= 0 || (cells > budget.cells && at !== "")) {
    return { kind: "box", id: at, label: `${node.kind} group of ${cells} cell${cells === 1 ? "" : "s"}` };
  }
  const children = shownMembers(node.children.length).map((m) =>
    typeof m === "number"
      ? toShape(node.children[m] as CustomNode, place(at, m), budget)
      : ({ kind: "gap", hidden: m.hidden, across: node.kind === "series" } as Shape),
  );
  return { kind: "group", id: at, series: node.kind === "series", children };
}

function layout(shape: Shape): Box {
  if (shape.kind === "cell") return { shape, w: CELL_W, h: CELL_H, cy: CELL_H / 2 - 4 };
  if (shape.kind === "gap") return shape.across ? { shape, w: 70, h: CELL_H, cy: CELL_H / 2 - 4 } : { shape, w: CELL_W, h: 22, cy: 11 };
  if (shape.kind === "box") return { shape, w: 120, h: CELL_H, cy: CELL_H / 2 - 4 };
  const kids = shape.children.map(layout);
  if (shape.series) {
    const cy = Math.max(...kids.map((k) => k.cy));
    const below = Math.max(...kids.map((k) => k.h - k.cy));
    let x = 0;
    const children = kids.map((box, i) => {
      const at = { box, x, y: cy - box.cy };
      x += box.w + (i < kids.length - 1 ? S_GAP : 0);
      return at;
    });
    return { shape, w: x, h: cy + below, cy, children };
  }
  const inner = Math.max(...kids.map((k) => k.w));
  let y = 0;
  const children = kids.map((box, i) => {
    const at = { box, x: BUS, y };
    y += box.h + (i < kids.length - 1 ? V_GAP : 0);
    return at;
  });
  const first = children[0] as { box: Box; y: number };
  const last = children[children.length - 1] as { box: Box; y: number };
  const cy = (first.y + first.box.cy + last.y + last.box.cy) / 2;
  return { shape, w: inner + 2 * BUS, h: y, cy, children };
}

function Capacitor({ x, y, w, color }: { x: number; y: number; w: number; color: string }) {
  const mid = x + w / 2;
  return (
    <g>
      <line x1={x} y1={y} x2={mid - 4} y2={y} stroke={STROKE} strokeWidth={1.5} />
      <line x1={mid + 4} y1={y} x2={x + w} y2={y} stroke={STROKE} strokeWidth={1.5} />
      <line x1={mid - 4} y1={y - 11} x2={mid - 4} y2={y + 11} stroke={color} strokeWidth={2.5} />
      <path d={`M ${mid + 7} ${y - 11} Q ${mid + 3} ${y} ${mid + 7} ${y + 11}`} fill="none" stroke={color} strokeWidth={2.5} />
    </g>
  );
}

interface DrawOptions {
  voltages?: ReadonlyMap<string, number>;
  weakest?: string | null;
  selected?: string | null;
}

function draw(box: Box, x: number, y: number, o: DrawOptions, out: React.ReactNode[]) {
  const s = box.shape;
  const key = `${s.kind}-${"id" in s ? s.id : ""}-${x}-${y}`;
  if (s.kind === "cell") {
    const weak = o.weakest === s.id;
    const sel = o.selected === s.id;
    const color = weak ? "#b91c1c" : STROKE;
    const v = o.voltages?.get(s.id);
    out.push(
      <g key={key} data-cell={s.id}>
        {sel ? <rect x={x + 2} y={y - 2} width={box.w - 4} height={box.h} rx={4} fill="none" stroke="#c8733a" strokeWidth={2} /> : null}
        <Capacitor x={x} y={y + box.cy} w={box.w} color={color} />
        <text x={x + box.w / 2} y={y + box.cy - 15} fontSize={9} textAnchor="middle" fill="#6b7280">
          {s.id}
        </text>
        <text x={x + box.w / 2} y={y + box.cy + 22} fontSize={9} textAnchor="middle" fill={weak ? "#9a241c" : "#374151"} fontWeight={weak ? 700 : 400}>
          {s.sku.length > 13 ? `${s.sku.slice(0, 12)}…` : s.sku || "(no cell)"}
        </text>
        {v !== undefined ? (
          <text x={x + box.w / 2} y={y + box.cy + 32} fontSize={9} textAnchor="middle" fill={weak ? "#9a241c" : "#14695e"}>
            {formatQuantity(v, "V")}
          </text>
        ) : null}
      </g>,
    );
    return;
  }
  if (s.kind === "gap") {
    out.push(
      s.across ? (
        <g key={key}>
          <line x1={x} y1={y + box.cy} x2={x + box.w} y2={y + box.cy} stroke="#9ca3af" strokeWidth={1.5} strokeDasharray="4 4" />
          <text x={x + box.w / 2} y={y + box.cy - 8} fontSize={10} textAnchor="middle" fill="#4b5563">
            … {s.hidden} more
          </text>
        </g>
      ) : (
        <text key={key} x={x + box.w / 2} y={y + box.cy + 4} fontSize={10} textAnchor="middle" fill="#4b5563">
          ⋮ {s.hidden} more
        </text>
      ),
    );
    return;
  }
  if (s.kind === "box") {
    out.push(
      <g key={key}>
        <line x1={x} y1={y + box.cy} x2={x + 8} y2={y + box.cy} stroke={STROKE} strokeWidth={1.5} />
        <rect x={x + 8} y={y + 6} width={box.w - 16} height={box.h - 12} rx={4} fill="#f3f5f9" stroke="#97a8c7" strokeDasharray="3 3" />
        <text x={x + box.w / 2} y={y + box.cy + 4} fontSize={9} textAnchor="middle" fill="#2e3b59">
          {s.label}
        </text>
        <line x1={x + box.w - 8} y1={y + box.cy} x2={x + box.w} y2={y + box.cy} stroke={STROKE} strokeWidth={1.5} />
      </g>,
    );
    return;
  }
  const kids = box.children ?? [];
  if (s.series) {
    kids.forEach((k, i) => {
      draw(k.box, x + k.x, y + k.y, o, out);
      const next = kids[i + 1];
      if (next)
        out.push(<line key={`${key}-w${i}`} x1={x + k.x + k.box.w} y1={y + box.cy} x2={x + next.x} y2={y + box.cy} stroke={STROKE} strokeWidth={1.5} />);
    });
  } else {
    const left = x + BUS / 2;
    const right = x + box.w - BUS / 2;
    const ys = kids.filter((k) => k.box.shape.kind !== "gap").map((k) => y + k.y + k.box.cy);
    const top = Math.min(...ys);
    const bottom = Math.max(...ys);
    out.push(<line key={`${key}-lb`} x1={left} y1={top} x2={left} y2={bottom} stroke={STROKE} strokeWidth={1.5} />);
    out.push(<line key={`${key}-rb`} x1={right} y1={top} x2={right} y2={bottom} stroke={STROKE} strokeWidth={1.5} />);
    kids.forEach((k, i) => {
      draw(k.box, x + k.x, y + k.y, o, out);
      if (k.box.shape.kind === "gap") return;
      const cy = y + k.y + k.box.cy;
      out.push(<line key={`${key}-l${i}`} x1={left} y1={cy} x2={x + k.x} y2={cy} stroke={STROKE} strokeWidth={1.5} />);
      out.push(<line key={`${key}-r${i}`} x1={x + k.x + k.box.w} y1={cy} x2={right} y2={cy} stroke={STROKE} strokeWidth={1.5} />);
    });
    out.push(<line key={`${key}-in`} x1={x} y1={y + box.cy} x2={left} y2={y + box.cy} stroke={STROKE} strokeWidth={1.5} />);
    out.push(<line key={`${key}-out`} x1={right} y1={y + box.cy} x2={x + box.w} y2={y + box.cy} stroke={STROKE} strokeWidth={1.5} />);
  }
}

/** The tree in one sentence: "A series string of 20 parallel groups; 40 cells of 2 parts: 20 × QFS-0650R27, 20 × QFS-1200R27." */
export function describeNetwork(tree: CustomNode): string {
  const counts = new Map<string, number>();
  const stack = [tree];
  while (stack.length > 0) {
    const x = stack.pop() as CustomNode;
    if (x.kind === "cell") counts.set(x.sku || "(no cell)", (counts.get(x.sku || "(no cell)") ?? 0) + 1);
    else stack.push(...x.children);
  }
  const cells = [...counts.values()].reduce((a, b) => a + b, 0);
  const parts = [...counts].map(([sku, n]) => `${n} × ${sku}`).join(", ");
  const shape =
    tree.kind === "cell"
      ? "A single cell"
      : `A ${tree.kind} group of ${tree.children.length} member${tree.children.length === 1 ? "" : "s"}` +
        (tree.children.every((c) => c.kind !== "cell") && tree.children.length > 0 ? ` (${tree.children[0]?.kind} groups)` : "");
  return `${shape}; ${cells} cell${cells === 1 ? "" : "s"} of ${counts.size} part${counts.size === 1 ? "" : "s"}: ${parts}.`;
}

/** A custom bank's tree drawn as a circuit, with its + and − terminals. */
export function NetworkDiagram({ tree, voltages, weakest, selected, className }: { tree: CustomNode; className?: string } & DrawOptions) {
  const box = layout(toShape(tree, "", { cells: CELL_BUDGET }));
  const nodes: React.ReactNode[] = [];
  draw(box, PAD, 24, { voltages, weakest, selected }, nodes);
  const width = box.w + 2 * PAD;
  const height = box.h + 48;
  const cy = 24 + box.cy;
  const description = describeNetwork(tree);
  return (
    <figure className={className}>
      <div className="overflow-x-auto">
        <svg
          role="img"
          aria-label={description}
          viewBox={`0 0 ${width} ${height}`}
          width={width}
          height={height}
          className="max-w-none"
          data-testid="network-diagram"
        >
          <title>{description}</title>
          <line x1={PAD - 26} y1={cy} x2={PAD} y2={cy} stroke={STROKE} strokeWidth={1.5} />
          <line x1={PAD + box.w} y1={cy} x2={PAD + box.w + 26} y2={cy} stroke={STROKE} strokeWidth={1.5} />
          <circle cx={PAD - 30} cy={cy} r={5} fill="white" stroke={STROKE} strokeWidth={1.5} />
          <circle cx={PAD + box.w + 30} cy={cy} r={5} fill="white" stroke={STROKE} strokeWidth={1.5} />
          <text x={PAD - 30} y={cy - 10} fontSize={13} textAnchor="middle" fontWeight={700} fill="#b91c1c">
            +
          </text>
          <text x={PAD + box.w + 30} y={cy - 10} fontSize={13} textAnchor="middle" fontWeight={700} fill="#1f2937">
            −
          </text>
          {nodes}
        </svg>
      </div>
      <figcaption className="mt-2 text-xs text-ink-600">
        {description}
        {weakest ? ` The cell nearest its rating (${weakest}) is drawn in red.` : ""}
      </figcaption>
    </figure>
  );
}
