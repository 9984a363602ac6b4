"use client";
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatMoney } from "@/lib/pricing/currency";
import type { RevenuePoint } from "@/lib/orders/revenue";
import { CHART_COLORS as C } from "./colors";

interface Datum extends RevenuePoint {
  /** floats for the bars' heights only; the tooltip and the table show the exact strings */
  receivedAxis: number;
  refundedAxis: number;
}

/** Money received and refunded per month, in the shop's currency (bars for the eye; exact figures in the tooltip and the table beside it). */
export function RevenueChart({ points, currency }: { points: RevenuePoint[]; currency: string }) {
  const data: Datum[] = points.map((p) => ({ ...p, receivedAxis: Number(p.received), refundedAxis: Number(p.refunded) }));
  return (
    <div className="h-64 w-full" data-testid="revenue-chart" role="img" aria-label="Money received and refunded per month (the figures are in the table)">
      <ResponsiveContainer width="100%" height="100%">
        <BarChart accessibilityLayer={false} data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
          <CartesianGrid stroke={C.grid} vertical={false} />
          <XAxis
            dataKey="month"
            tick={{ fontSize: 11 }}
            tickFormatter={(m: string) => `${new Date(`${m}-01T00:00:00Z`).toLocaleString("en-GB", { month: "short", timeZone: "UTC" })} ${m.slice(2, 4)}`}
          />
          <YAxis tick={{ fontSize: 11 }} width={72} tickFormatter={(v: number) => formatMoney(String(Math.round(v)), currency).replace(/[.,]0+$/, "")} />
          <Tooltip
            content={({ payload }) => {
              const d = payload?.[0]?.payload as Datum | undefined;
              if (!d) return null;
              return (
                <div className="rounded-md bg-white px-3 py-2 text-xs shadow ring-1 ring-ink-100">
                  <p className="font-medium">{d.month}</p>
                  <p>Received {formatMoney(d.received, currency)}</p>
                  <p>Refunded {formatMoney(d.refunded, currency)}</p>
                  <p className="font-medium">Net {formatMoney(d.net, currency)}</p>
                </div>
              );
            }}
          />
          <Legend wrapperStyle={{ fontSize: 12 }} />
          <Bar dataKey="receivedAxis" name="Received" fill={C.copper} />
          <Bar dataKey="refundedAxis" name="Refunded" fill={C.inkLight} />
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
