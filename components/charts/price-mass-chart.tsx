"use client";
import { useId } from "react";
import { CartesianGrid, ResponsiveContainer, Scatter, ScatterChart, Tooltip, XAxis, YAxis, ZAxis } from "recharts";
import { formatMoney } from "@/lib/pricing/currency";
import { formatQuantity } from "@/lib/quantities";
import { CHART_COLORS as C } from "./colors";

export interface PriceMassPoint {
  id: string;
  label: string;
  massKg: number;
  /** decimal string per bank (exact, for the tooltip) */
  price: string;
  pareto: boolean;
}

interface Datum {
  id: string;
  label: string;
  mass: number;
  /** float for the chart's position only; the tooltip shows the exact string */
  priceAxis: number;
  price: string;
}

/** The chart in words: how many options, the price and mass spans, how many are best trade-offs. */
function summaryOf(points: PriceMassPoint[], currency: string): string {
  if (points.length === 0) return "No priced options to compare.";
  const byPrice = [...points].sort((a, b) => Number(a.price) - Number(b.price));
  const masses = points.map((p) => p.massKg);
  const cheapest = byPrice[0] as PriceMassPoint;
  const dearest = byPrice.at(-1) as PriceMassPoint;
  const best = points.filter((p) => p.pareto).length;
  return `${points.length} ${points.length === 1 ? "option" : "options"} from ${formatMoney(cheapest.price, currency)} to ${formatMoney(dearest.price, currency)} per bank, weighing ${formatQuantity(Math.min(...masses), "kg")} to ${formatQuantity(Math.max(...masses), "kg")}; ${best} of them ${best === 1 ? "is a best trade-off" : "are best trade-offs"}. The table lists each one.`;
}

/** Price per bank against mass for every priced option; the Pareto set marked, the focused one ringed. */
export function PriceMassChart({
  points,
  focusedId,
  currency,
  onSelect,
}: {
  points: PriceMassPoint[];
  focusedId: string | null;
  currency: string;
  onSelect?: (id: string) => void;
}) {
  const toDatum = (p: PriceMassPoint): Datum => ({ id: p.id, label: p.label, mass: p.massKg, priceAxis: Number(p.price), price: p.price });
  const pareto = points.filter((p) => p.pareto && p.id !== focusedId).map(toDatum);
  const others = points.filter((p) => !p.pareto && p.id !== focusedId).map(toDatum);
  const focused = points.filter((p) => p.id === focusedId).map(toDatum);
  const click = (d: unknown) => {
    const id = (d as { payload?: Datum } | undefined)?.payload?.id;
    if (id && onSelect) onSelect(id);
  };
  const id = useId();
  const summary = summaryOf(points, currency);
  return (
    <figure aria-labelledby={`${id}-name`}>
      <figcaption id={`${id}-name`} className="text-sm font-medium text-ink-800">
        Price per bank against mass
      </figcaption>
      {/* the legend is HTML above the plot: on a phone it wraps instead of running over the axis */}
      <ul className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-600">
        <li>
          <span aria-hidden="true" style={{ color: C.charge }}>
            ◆
          </span>{" "}
          best trade-offs (no other option is cheaper, lighter and smaller at once)
        </li>
        <li>
          <span aria-hidden="true" style={{ color: C.inkLight }}>
            ●
          </span>{" "}
          other options
        </li>
        <li>
          <span aria-hidden="true" style={{ color: C.copper }}>
            ★
          </span>{" "}
          in focus
        </li>
      </ul>
      <div className="mt-2 h-64 w-full" data-testid="price-mass-chart" role="img" aria-labelledby={`${id}-name`} aria-describedby={`${id}-summary`}>
        <ResponsiveContainer width="100%" height="100%">
          <ScatterChart accessibilityLayer={false} margin={{ top: 8, right: 16, bottom: 16, left: 8 }}>
            <CartesianGrid stroke={C.grid} />
            <XAxis
              dataKey="mass"
              type="number"
              name="mass"
              domain={["auto", "auto"]}
              tick={{ fontSize: 11 }}
              tickFormatter={(m: number) => formatQuantity(m, "kg", { digits: 2 })}
              label={{ value: "mass", position: "insideBottom", offset: -8, fontSize: 11 }}
            />
            <YAxis
              dataKey="priceAxis"
              type="number"
              name="price"
              domain={["auto", "auto"]}
              tick={{ fontSize: 11 }}
              width={72}
              tickFormatter={(v: number) => formatMoney(String(Math.round(v)), currency).replace(/[.,]0+$/, "")}
            />
            <ZAxis range={[60, 60]} />
            <Tooltip
              cursor={{ strokeDasharray: "3 3" }}
              content={({ payload }) => {
                const d = payload?.[0]?.payload as Datum | undefined;
                if (!d) return null;
                return (
                  <div className="rounded-md bg-white px-3 py-2 text-xs shadow ring-1 ring-ink-100">
                    <p className="font-medium">{d.label}</p>
                    <p>
                      {formatQuantity(d.mass, "kg")} · {formatMoney(d.price, currency)} per bank
                    </p>
                  </div>
                );
              }}
            />
            <Scatter
              name="Pareto set (no other option is cheaper, lighter and smaller at once)"
              data={pareto}
              fill={C.charge}
              shape="diamond"
              onClick={click}
              isAnimationActive={false}
            />
            <Scatter name="other options" data={others} fill={C.inkLight} onClick={click} isAnimationActive={false} />
            <Scatter name="in focus" data={focused} fill={C.copper} stroke={C.ink} strokeWidth={2} shape="star" isAnimationActive={false} />
          </ScatterChart>
        </ResponsiveContainer>
      </div>
      <p id={`${id}-summary`} className="mt-1 text-xs text-ink-600">
        {summary}
      </p>
    </figure>
  );
}
