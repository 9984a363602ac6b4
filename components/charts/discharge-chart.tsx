"use client";
import { useId } from "react";
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { dischargeCurve, type CurveOption, type Requirement } from "@/lib/bank";
import { formatDuration, formatQuantity } from "@/lib/quantities";
import { CHART_COLORS as C } from "./colors";

/** Time axis in s, min or h, whichever reads best for the span. */
function timeScale(seconds: number): { unit: string; div: number } {
  if (seconds >= 3 * 86400) return { unit: "days", div: 86400 };
  if (seconds >= 3 * 3600) return { unit: "h", div: 3600 };
  if (seconds >= 180) return { unit: "min", div: 60 };
  return { unit: "s", div: 1 };
}

function titleOf(kind: "constant-power" | "constant-current" | "resistive", requirement: Requirement, bleeder: boolean): string {
  if (kind === "constant-power") return `Constant ${Math.round(requirement.backup?.power ?? 0).toLocaleString("en-GB")} W backup at end of life`;
  if (kind === "constant-current") return `Constant ${(requirement.peakCurrent?.current ?? 0).toLocaleString("en-GB")} A at end of life`;
  return bleeder ? "Switched off: discharge through the bleeder and balancing resistors" : "Switched off: self-discharge through the balancing resistors";
}

/**
 * The discharge curve for the stated requirement (lib/bank dischargeCurve, from the option's own
 * figures), with V_min (and V_safe, the backup time) marked.
 */
export function DischargeChart({ option, requirement, safeVoltage }: { option: CurveOption; requirement: Requirement; safeVoltage: number }) {
  const id = useId();
  const curve = dischargeCurve(option, requirement, safeVoltage);
  if (!curve) return <p className="text-sm text-ink-600">No discharge path to chart for this option.</p>;
  const title = titleOf(curve.kind, requirement, option.discharge.bleeder !== null);
  const span = curve.points.at(-1)?.t ?? 0;
  const { unit, div } = timeScale(Math.max(span, curve.requiredSeconds ?? 0));
  const data = curve.points.map((p) => ({ t: p.t / div, v: p.v }));
  const vMin = requirement.minVoltage ?? 0;
  // the safe voltage matters after switch-off, when the bank starts above it
  const showSafe = curve.kind === "resistive" && safeVoltage < requirement.maxVoltage;
  return (
    <figure aria-labelledby={`${id}-name`}>
      <figcaption id={`${id}-name`} className="text-sm font-medium text-ink-800">
        {title}
      </figcaption>
      <div className="mt-2 h-56 w-full" data-testid="discharge-chart" role="img" aria-labelledby={`${id}-name`} aria-describedby={`${id}-summary`}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart accessibilityLayer={false} data={data} margin={{ top: 8, right: 56, bottom: 16, left: 0 }}>
            <CartesianGrid stroke={C.grid} />
            <XAxis
              dataKey="t"
              type="number"
              domain={[0, "dataMax"]}
              tick={{ fontSize: 11 }}
              tickFormatter={(t: number) => String(Number(t.toPrecision(3)))}
              label={{ value: `time (${unit})`, position: "insideBottom", offset: -8, fontSize: 11 }}
            />
            <YAxis domain={[0, "auto"]} tick={{ fontSize: 11 }} width={44} unit=" V" />
            <Tooltip formatter={(v) => formatQuantity(Number(v), "V")} labelFormatter={(t) => `${Number(Number(t).toPrecision(3))} ${unit}`} />
            {vMin > 0 ? (
              <ReferenceLine
                y={vMin}
                stroke={C.danger}
                strokeDasharray="5 3"
                label={
                  showSafe && vMin === safeVoltage
                    ? { value: `V min = safe ${formatQuantity(vMin, "V")}`, position: "insideTopRight", fontSize: 10, fill: C.danger }
                    : { value: `V min ${formatQuantity(vMin, "V")}`, position: "right", fontSize: 10, fill: C.danger }
                }
              />
            ) : null}
            {showSafe && vMin !== safeVoltage ? (
              <ReferenceLine
                y={safeVoltage}
                stroke={C.hazard}
                strokeDasharray="2 2"
                label={{ value: `safe ${formatQuantity(safeVoltage, "V")}`, position: "right", fontSize: 10, fill: C.hazard }}
              />
            ) : null}
            {curve.kind === "resistive" && option.handling?.floorVoltage ? (
              <ReferenceLine
                y={option.handling.floorVoltage}
                stroke={C.danger}
                label={{
                  value: `never below ${formatQuantity(option.handling.floorVoltage, "V")}`,
                  position: "insideBottomRight",
                  fontSize: 10,
                  fill: C.danger,
                }}
              />
            ) : null}
            {curve.requiredSeconds !== null ? (
              <ReferenceLine
                x={curve.requiredSeconds / div}
                stroke={C.ink}
                strokeDasharray="4 4"
                label={{ value: "required", position: "top", fontSize: 10 }}
              />
            ) : null}
            <Line type="monotone" dataKey="v" stroke={C.copper} dot={false} strokeWidth={2} isAnimationActive={false} />
          </LineChart>
        </ResponsiveContainer>
      </div>
      <p id={`${id}-summary`} className="mt-1 text-xs text-ink-600">
        {curve.kind === "resistive" && option.handling?.floorVoltage
          ? `Switched off, the balancing resistors take the bank to ${formatQuantity(curve.points.at(-1)?.v ?? 0, "V")}, the lowest its hybrid cells may go (below it they are damaged), after ${formatDuration(curve.seconds)} with the upper-tolerance capacitance${option.handling.standby?.seconds ? `; at the lower tolerance and with the cells' own leakage, after ${formatDuration(option.handling.standby.seconds)}` : ""}.`
          : curve.kind === "resistive"
            ? `Reaches ${formatQuantity(curve.points.at(-1)?.v ?? 0, "V")} after ${formatDuration(curve.seconds)}; worst-case capacitance (upper tolerance), balancing${option.discharge.bleeder ? " and bleeder" : ""} resistors only, as the time to the safe voltage is figured.`
            : `Lasts ${formatDuration(curve.seconds)} down to ${formatQuantity(vMin, "V")} with end-of-life capacitance and ESR${curve.requiredSeconds !== null ? ` (asked: ${formatDuration(curve.requiredSeconds)})` : ""}.`}
      </p>
    </figure>
  );
}
