"use client";
import { useId } from "react";
import { Bar, BarChart, CartesianGrid, Cell, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { chargingVoltages, type CurveOption } from "@/lib/bank";
import { formatQuantity } from "@/lib/quantities";
import { CHART_COLORS as C } from "./colors";

/** Most bars drawn; the positions after the weakest all charge to the same voltage. */
const MAX_BARS = 24;

/** Each series position's worst-case voltage at the end of charging, against the cell's rating and surge. */
export function CellVoltageChart({
  option,
  maxVoltage,
}: {
  option: CurveOption & { cell: { ratedVoltage: number; surgeVoltage: number } };
  maxVoltage: number;
}) {
  const v = chargingVoltages(option, maxVoltage);
  const bars = Array.from({ length: Math.min(option.seriesCount, MAX_BARS) }, (_, i) => ({
    position: String(i + 1),
    voltage: i === 0 ? v.weakest : (v.others ?? v.weakest),
    worst: i === 0,
  }));
  const { ratedVoltage, surgeVoltage } = option.cell;
  const top = Math.max(surgeVoltage, option.worstCellVoltage) * 1.1;
  const balanced = v.balanced;
  const id = useId();
  return (
    <figure aria-labelledby={`${id}-name`}>
      <figcaption id={`${id}-name`} className="text-sm font-medium text-ink-800">
        Worst-case cell voltage while charging to {formatQuantity(maxVoltage, "V")}
      </figcaption>
      <p className="mt-1 flex flex-wrap gap-x-4 text-xs text-ink-600">
        <span>
          <span aria-hidden="true" style={{ color: C.hazard }}>
            ╌╌
          </span>{" "}
          cell rating {formatQuantity(ratedVoltage, "V")}
        </span>
        <span>
          <span aria-hidden="true" style={{ color: C.danger }}>
            ┈┈
          </span>{" "}
          surge {formatQuantity(surgeVoltage, "V")}
        </span>
      </p>
      <div className="mt-2 h-56 w-full" data-testid="cell-voltage-chart" role="img" aria-labelledby={`${id}-name`} aria-describedby={`${id}-summary`}>
        <ResponsiveContainer width="100%" height="100%">
          <BarChart accessibilityLayer={false} data={bars} margin={{ top: 8, right: 16, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={C.grid} vertical={false} />
            <XAxis dataKey="position" tick={{ fontSize: 11 }} label={{ value: "series position", position: "insideBottom", offset: -8, fontSize: 11 }} />
            <YAxis domain={[0, Number(top.toPrecision(2))]} tick={{ fontSize: 11 }} width={44} unit=" V" />
            <Tooltip formatter={(v) => formatQuantity(Number(v), "V")} labelFormatter={(l) => `position ${String(l)}`} />
            <ReferenceLine y={ratedVoltage} stroke={C.hazard} strokeDasharray="6 3" strokeWidth={1.5} />
            <ReferenceLine y={surgeVoltage} stroke={C.danger} strokeDasharray="2 2" strokeWidth={1.5} />
            <Bar dataKey="voltage" isAnimationActive={false}>
              {bars.map((b) => (
                <Cell key={b.position} fill={b.voltage > ratedVoltage ? C.danger : b.worst ? C.copper : C.charge} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
      <p id={`${id}-summary`} className="mt-1 text-xs text-ink-600">
        Position 1 is the weakest (lowest capacitance within the matching tolerance): it reaches {formatQuantity(option.worstCellVoltage, "V")}; the others{" "}
        {v.others !== null ? formatQuantity(v.others, "V") : ""} (perfectly balanced: {formatQuantity(balanced, "V")}).
        {option.seriesCount > MAX_BARS ? ` Positions ${MAX_BARS + 1}–${option.seriesCount} are the same as position ${MAX_BARS}.` : ""}
      </p>
    </figure>
  );
}
