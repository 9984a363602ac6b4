import { formatQuantity } from "@/lib/quantities";

export interface BankDiagramProps {
  topology: "series-of-parallel-groups" | "parallel-of-series-strings";
  seriesCount: number;
  parallelCount: number;
  /** a label for each cell, e.g. its SKU */
  cellLabel: string;
  balancing: { resistance: number | null; count: number; activeBoard: null | { sku: string; count: number } };
  bleeder: null | { resistance: number; switched: boolean };
  className?: string;
}

/** A slot in the drawing: a real position (1-based) or the gap that stands for the hidden ones. */
type Slot = { kind: "item"; index: number } | { kind: "gap"; hidden: number };

/** Which positions to draw: all when few, else the first `head`, a gap, the last `tail`. */
export function slotsFor(count: number, max: number, head: number, tail: number): Slot[] {
  if (count <= max) return Array.from({ length: count }, (_, i) => ({ kind: "item", index: i + 1 }));
  const out: Slot[] = [];
  for (let i = 1; i <= head; i++) out.push({ kind: "item", index: i });
  out.push({ kind: "gap", hidden: count - head - tail });
  for (let i = count - tail + 1; i <= count; i++) out.push({ kind: "item", index: i });
  return out;
}

const ohms = (r: number) => formatQuantity(r, "Ω");
const COL = 96;
const GAP_COL = 120;
const PAD_X = 56;
const TOP = 44;
const STROKE = "#1f2937";

/** Capacitor symbol on a horizontal wire from x1 to x2 at y: two plates, the + side marked. */
function Capacitor({ x1, x2, y }: { x1: number; x2: number; y: number }) {
  const mid = (x1 + x2) / 2;
  return (
    <g>
      <line x1={x1} y1={y} x2={mid - 4} y2={y} stroke={STROKE} strokeWidth={1.5} />
      <line x1={mid + 4} y1={y} x2={x2} y2={y} stroke={STROKE} strokeWidth={1.5} />
      <line x1={mid - 4} y1={y - 11} x2={mid - 4} y2={y + 11} stroke={STROKE} strokeWidth={2.5} />
      <path d={`M ${mid + 7} ${y - 11} Q ${mid + 3} ${y} ${mid + 7} ${y + 11}`} fill="none" stroke={STROKE} strokeWidth={2.5} />
      <text x={mid - 11} y={y - 9} fontSize={9} fill="#6b7280" textAnchor="middle">
        +
      </text>
    </g>
  );
}

/** Resistor symbol (a rectangle, IEC 60617 style) on a horizontal wire. */
function Resistor({ x1, x2, y, color = "#b45309", w = 26 }: { x1: number; x2: number; y: number; color?: string; w?: number }) {
  const mid = (x1 + x2) / 2;
  return (
    <g>
      <line x1={x1} y1={y} x2={mid - w / 2} y2={y} stroke={STROKE} strokeWidth={1.2} />
      <rect x={mid - w / 2} y={y - 5} width={w} height={10} fill="white" stroke={color} strokeWidth={1.5} />
      <line x1={mid + w / 2} y1={y} x2={x2} y2={y} stroke={STROKE} strokeWidth={1.2} />
    </g>
  );
}

function Gap({ x1, x2, y }: { x1: number; x2: number; y: number }) {
  return <line x1={x1} y1={y} x2={x2} y2={y} stroke="#9ca3af" strokeWidth={1.5} strokeDasharray="4 4" />;
}

/** One-sentence description of the bank, for the caption and for screen readers. */
export function describeBank(p: BankDiagramProps): string {
  const parts: string[] = [];
  if (p.topology === "series-of-parallel-groups") {
    parts.push(`${p.seriesCount} groups in series, each of ${p.parallelCount} ${p.cellLabel} cell${p.parallelCount === 1 ? "" : "s"} in parallel`);
    if (p.balancing.resistance !== null) parts.push(`one ${ohms(p.balancing.resistance)} balancing resistor across each group (${p.balancing.count})`);
  } else {
    parts.push(`${p.parallelCount} string${p.parallelCount === 1 ? "" : "s"} in parallel, each of ${p.seriesCount} ${p.cellLabel} cells in series`);
    if (p.balancing.resistance !== null) parts.push(`one ${ohms(p.balancing.resistance)} balancing resistor across each cell (${p.balancing.count})`);
  }
  if (p.balancing.activeBoard)
    parts.push(`${p.balancing.activeBoard.count} active balancing board${p.balancing.activeBoard.count === 1 ? "" : "s"} (${p.balancing.activeBoard.sku})`);
  if (p.bleeder) parts.push(`a ${ohms(p.bleeder.resistance)} ${p.bleeder.switched ? "switched discharge resistor" : "bleeder"} across the terminals`);
  return `${parts.join("; ")}.`;
}

/** The bank drawn from its arrangement: groups or strings, cells, balancing, bleeder; large banks compressed. */
export function BankDiagram(props: BankDiagramProps) {
  const { topology, seriesCount, parallelCount, balancing, bleeder } = props;
  const groups = topology === "series-of-parallel-groups";
  const cols = slotsFor(seriesCount, 6, 2, 2);
  const rows = slotsFor(parallelCount, 4, 2, 1);
  const rowH = groups ? 42 : 62;
  const widths = cols.map((c) => (c.kind === "gap" ? GAP_COL : COL));
  const xs = [PAD_X];
  for (const w of widths) xs.push((xs.at(-1) ?? PAD_X) + w);
  const xEnd = xs.at(-1) ?? PAD_X;
  const ys = rows.map((_, r) => TOP + 10 + r * rowH);
  const yLastRow = ys.at(-1) ?? TOP;
  const perGroupResistor = groups && balancing.resistance !== null;
  const yGroupRes = yLastRow + rowH;
  const yBottomOfCells = perGroupResistor ? yGroupRes : yLastRow + (groups ? 0 : 18);
  const yMid = (ys[0] ?? TOP) + (yBottomOfCells - (ys[0] ?? TOP)) / 2;
  const yBleeder = yBottomOfCells + 44;
  const height = (bleeder ? yBleeder : yBottomOfCells) + 40;
  const width = xEnd + PAD_X;
  const description = describeBank(props);
  const nodes: React.ReactNode[] = [];
  let key = 0;
  const k = () => key++;

  if (groups) {
    // vertical buses: the nodes between groups
    xs.forEach((x) => nodes.push(<line key={k()} x1={x} y1={ys[0]} x2={x} y2={yBottomOfCells} stroke={STROKE} strokeWidth={1.5} />));
    cols.forEach((c, ci) => {
      const x1 = xs[ci] ?? 0;
      const x2 = xs[ci + 1] ?? 0;
      if (c.kind === "gap") {
        rows.forEach((_, ri) => nodes.push(<Gap key={k()} x1={x1} x2={x2} y={ys[ri] ?? 0} />));
        if (perGroupResistor) nodes.push(<Gap key={k()} x1={x1} x2={x2} y={yGroupRes} />);
        nodes.push(
          <text key={k()} x={(x1 + x2) / 2} y={TOP - 14} fontSize={11} textAnchor="middle" fill="#4b5563">
            … {c.hidden} more groups …
          </text>,
        );
        return;
      }
      nodes.push(
        <text key={k()} x={(x1 + x2) / 2} y={TOP - 14} fontSize={11} textAnchor="middle" fill="#374151" fontWeight={600}>
          group {c.index}
        </text>,
      );
      rows.forEach((r, ri) => {
        const y = ys[ri] ?? 0;
        if (r.kind === "gap") {
          nodes.push(
            <text key={k()} x={(x1 + x2) / 2} y={y + 4} fontSize={11} textAnchor="middle" fill="#4b5563">
              ⋮ {r.hidden} more
            </text>,
          );
        } else nodes.push(<Capacitor key={k()} x1={x1} x2={x2} y={y} />);
      });
      if (perGroupResistor) nodes.push(<Resistor key={k()} x1={x1} x2={x2} y={yGroupRes} />);
      if (balancing.activeBoard) {
        nodes.push(
          <rect
            key={k()}
            x={x1 + 6}
            y={(ys[0] ?? 0) - 18}
            width={x2 - x1 - 12}
            height={yBottomOfCells - (ys[0] ?? 0) + 30}
            fill="none"
            stroke="#0f766e"
            strokeDasharray="3 3"
            rx={4}
          />,
        );
      }
    });
  } else {
    // strings: each row its own chain between the two terminal buses
    nodes.push(<line key={k()} x1={PAD_X} y1={ys[0]} x2={PAD_X} y2={yLastRow} stroke={STROKE} strokeWidth={1.5} />);
    nodes.push(<line key={k()} x1={xEnd} y1={ys[0]} x2={xEnd} y2={yLastRow} stroke={STROKE} strokeWidth={1.5} />);
    cols.forEach((c, ci) => {
      const x1 = xs[ci] ?? 0;
      const x2 = xs[ci + 1] ?? 0;
      nodes.push(
        <text
          key={k()}
          x={(x1 + x2) / 2}
          y={TOP - 14}
          fontSize={11}
          textAnchor="middle"
          fill={c.kind === "gap" ? "#4b5563" : "#374151"}
          fontWeight={c.kind === "gap" ? 400 : 600}
        >
          {c.kind === "gap" ? `… ${c.hidden} more cells …` : `cell ${c.index}`}
        </text>,
      );
    });
    rows.forEach((r, ri) => {
      const y = ys[ri] ?? 0;
      if (r.kind === "gap") {
        nodes.push(
          <text key={k()} x={(PAD_X + xEnd) / 2} y={y + 4} fontSize={11} textAnchor="middle" fill="#4b5563">
            ⋮ {r.hidden} more strings
          </text>,
        );
        return;
      }
      nodes.push(
        <text key={k()} x={PAD_X - 8} y={y - 6} fontSize={10} textAnchor="end" fill="#6b7280">
          string {r.index}
        </text>,
      );
      cols.forEach((c, ci) => {
        const x1 = xs[ci] ?? 0;
        const x2 = xs[ci + 1] ?? 0;
        if (c.kind === "gap") {
          nodes.push(<Gap key={k()} x1={x1} x2={x2} y={y} />);
          return;
        }
        nodes.push(<Capacitor key={k()} x1={x1} x2={x2} y={y} />);
        if (balancing.resistance !== null) {
          nodes.push(<line key={k()} x1={x1 + 8} y1={y} x2={x1 + 8} y2={y + 20} stroke={STROKE} strokeWidth={1} />);
          nodes.push(<line key={k()} x1={x2 - 8} y1={y} x2={x2 - 8} y2={y + 20} stroke={STROKE} strokeWidth={1} />);
          nodes.push(<Resistor key={k()} x1={x1 + 8} x2={x2 - 8} y={y + 20} w={20} />);
        }
      });
    });
  }

  // terminals
  nodes.push(<line key={k()} x1={PAD_X - 30} y1={yMid} x2={PAD_X} y2={yMid} stroke={STROKE} strokeWidth={1.5} />);
  nodes.push(<line key={k()} x1={xEnd} y1={yMid} x2={xEnd + 30} y2={yMid} stroke={STROKE} strokeWidth={1.5} />);
  nodes.push(<circle key={k()} cx={PAD_X - 34} cy={yMid} r={5} fill="white" stroke={STROKE} strokeWidth={1.5} />);
  nodes.push(<circle key={k()} cx={xEnd + 34} cy={yMid} r={5} fill="white" stroke={STROKE} strokeWidth={1.5} />);
  nodes.push(
    <text key={k()} x={PAD_X - 34} y={yMid - 10} fontSize={13} textAnchor="middle" fontWeight={700} fill="#b91c1c">
      +
    </text>,
  );
  nodes.push(
    <text key={k()} x={xEnd + 34} y={yMid - 10} fontSize={13} textAnchor="middle" fontWeight={700} fill="#1f2937">
      −
    </text>,
  );

  if (bleeder) {
    const l = PAD_X - 34;
    const r = xEnd + 34;
    nodes.push(<line key={k()} x1={l} y1={yMid + 5} x2={l} y2={yBleeder} stroke={STROKE} strokeWidth={1.2} />);
    nodes.push(<line key={k()} x1={r} y1={yMid + 5} x2={r} y2={yBleeder} stroke={STROKE} strokeWidth={1.2} />);
    nodes.push(<Resistor key={k()} x1={l} x2={r} y={yBleeder} color="#b91c1c" w={40} />);
    nodes.push(
      <text key={k()} x={(l + r) / 2} y={yBleeder + 20} fontSize={11} textAnchor="middle" fill="#b91c1c">
        {bleeder.switched ? "switched discharge" : "bleeder"} {ohms(bleeder.resistance)}
      </text>,
    );
  }

  return (
    <figure className={props.className}>
      <div className="scroll-cue relative" role="region" aria-label="Bank diagram (scrolls sideways on a narrow screen)" tabIndex={0}>
        <svg
          role="img"
          aria-label={description}
          viewBox={`0 0 ${width} ${height}`}
          width={width}
          height={height}
          className="max-w-none"
          data-testid="bank-diagram"
        >
          <title>{description}</title>
          {nodes}
        </svg>
      </div>
      <figcaption className="mt-2 text-xs text-ink-600">
        {description}
        {perGroupResistor || (!groups && balancing.resistance !== null) ? " Balancing resistors drawn in amber" : ""}
        {balancing.activeBoard ? "; dashed boxes are active balancing board channels" : ""}
        {perGroupResistor || (!groups && balancing.resistance !== null) ? "." : ""}
      </figcaption>
    </figure>
  );
}
