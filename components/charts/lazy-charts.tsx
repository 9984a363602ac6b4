"use client";
import dynamic from "next/dynamic";
import { useEffect, useRef, useState } from "react";
import type { CellVoltageChart } from "./cell-voltage-chart";
import type { DischargeChart } from "./discharge-chart";
import type { PriceMassChart } from "./price-mass-chart";

// The charting library is the largest thing a page with charts would load. Each chart here is
// fetched only when its place scrolls near the screen (a grey block of its size stands there
// until then), so a phone that never scrolls to a chart never downloads or runs it.

function ChartSkeleton({ height }: { height: number }) {
  return <div aria-hidden="true" className="animate-pulse rounded-md bg-ink-100" style={{ height }} />;
}

/**
 * Renders `children` once the slot comes within `margin` of the viewport (at once where the
 * browser has no IntersectionObserver); a block of `height` px stands in until then.
 * `data-chart-slot` names the slot, so a test can scroll to it.
 */
export function WhenVisible({ name, height, margin = "200px", children }: { name: string; height: number; margin?: string; children: React.ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  const [seen, setSeen] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (seen || !el) return;
    if (typeof IntersectionObserver === "undefined") {
      setSeen(true);
      return;
    }
    const observer = new IntersectionObserver(
      (entries) => {
        if (!entries.some((e) => e.isIntersecting)) return;
        observer.disconnect();
        setSeen(true);
      },
      { rootMargin: margin },
    );
    observer.observe(el);
    return () => observer.disconnect();
  }, [seen, margin]);
  return (
    <div ref={ref} data-chart-slot={name}>
      {seen ? children : <ChartSkeleton height={height} />}
    </div>
  );
}

// Heights of the charts with their captions, so nothing moves when one arrives.
const SMALL = 288;
const LARGE = 320;

const CellVoltageChartLoader = dynamic(() => import("./cell-voltage-chart").then((m) => m.CellVoltageChart), {
  ssr: false,
  loading: () => <ChartSkeleton height={SMALL} />,
});
const DischargeChartLoader = dynamic(() => import("./discharge-chart").then((m) => m.DischargeChart), {
  ssr: false,
  loading: () => <ChartSkeleton height={SMALL} />,
});
const PriceMassChartLoader = dynamic(() => import("./price-mass-chart").then((m) => m.PriceMassChart), {
  ssr: false,
  loading: () => <ChartSkeleton height={LARGE} />,
});

// type-only imports: they add nothing to the bundle
type Props<C> = C extends React.ComponentType<infer P> ? P : never;

export function LazyCellVoltageChart(props: Props<typeof CellVoltageChart>) {
  return (
    <WhenVisible name="cell-voltage" height={SMALL}>
      <CellVoltageChartLoader {...props} />
    </WhenVisible>
  );
}

export function LazyDischargeChart(props: Props<typeof DischargeChart>) {
  return (
    <WhenVisible name="discharge" height={SMALL}>
      <DischargeChartLoader {...props} />
    </WhenVisible>
  );
}

export function LazyPriceMassChart(props: Props<typeof PriceMassChart>) {
  return (
    <WhenVisible name="price-mass" height={LARGE}>
      <PriceMassChartLoader {...props} />
    </WhenVisible>
  );
}
