import { CHART_COLORS as C } from "@/components/charts/colors";
import type { HistogramBin } from "@/lib/bank";
import { formatQuantity } from "@/lib/quantities";

const W = 600;
const H = 180;
const PAD = { left: 8, right: 8, top: 22, bottom: 30 };

/**
 * A histogram of the equivalent capacitance over the yield's samples, drawn as plain SVG (no
 * chart library), so the storefront, the comparison and the quote page render the same picture.
 * Bars below the required capacitance show in the hazard colour; the requirement is marked.
 */
export function YieldHistogram({ bins, required, label }: { bins: HistogramBin[]; required: number | null; label: string }) {
  const first = bins[0];
  const last = bins.at(-1);
  if (!first || !last) return null;
  const lo = first.from;
  const hi = last.to > lo ? last.to : lo + 1;
  const top = Math.max(...bins.map((b) => b.count), 1);
  const x = (v: number) => PAD.left + ((v - lo) / (hi - lo)) * (W - PAD.left - PAD.right);
  const y = (n: number) => H - PAD.bottom - (n / top) * (H - PAD.top - PAD.bottom);
  const showRequired = required !== null && required >= lo - (hi - lo) * 0.05 && required <= hi + (hi - lo) * 0.05;
  return (
    <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={label} className="h-auto w-full" data-testid="yield-histogram">
      <line x1={PAD.left} x2={W - PAD.right} y1={H - PAD.bottom} y2={H - PAD.bottom} stroke={C.inkLight} />
      {bins.map((b, i) => {
        const x0 = x(b.from);
        const x1 = x(b.to);
        const short = required !== null && b.to <= required;
        return (
          <rect
            key={i}
            x={x0 + 0.5}
            width={Math.max(0.5, x1 - x0 - 1)}
            y={y(b.count)}
            height={H - PAD.bottom - y(b.count)}
            fill={short ? C.hazard : C.charge}
          />
        );
      })}
      {showRequired && required !== null ? (
        <g>
          <line x1={x(required)} x2={x(required)} y1={PAD.top - 6} y2={H - PAD.bottom} stroke={C.danger} strokeDasharray="5 3" />
          <text x={x(required)} y={PAD.top - 10} fontSize={13} fill={C.danger} textAnchor={x(required) > W * 0.7 ? "end" : "start"}>
            needed {formatQuantity(required, "F")}
          </text>
        </g>
      ) : null}
      <text x={PAD.left} y={H - 10} fontSize={13} fill={C.ink}>
        {formatQuantity(lo, "F")}
      </text>
      <text x={W - PAD.right} y={H - 10} fontSize={13} fill={C.ink} textAnchor="end">
        {formatQuantity(hi, "F")}
      </text>
    </svg>
  );
}
