import { describe, expect, it } from "vitest";
import { monthStart, revenueSeries, sharePercent } from "@/lib/orders/revenue";

describe("the dashboard's revenue series", () => {
  it("fills twelve months ending this one, exact to the cent, net of refunds", () => {
    const now = new Date("2026-03-15T12:00:00Z");
    const series = revenueSeries(
      [
        { month: "2026-03", received: "0.1000", refunded: "0" },
        { month: "2026-01", received: "1208.3000", refunded: "362.4900" },
        { month: "2025-03", received: "5.00", refunded: "0" },
      ],
      now,
      "EUR",
    );
    expect(series).toHaveLength(12);
    expect(series[0]?.month).toBe("2025-04");
    expect(series.at(-1)).toEqual({ month: "2026-03", received: "0.10", refunded: "0.00", net: "0.10" });
    expect(series.find((p) => p.month === "2026-01")).toEqual({ month: "2026-01", received: "1208.30", refunded: "362.49", net: "845.81" });
    expect(series.find((p) => p.month === "2025-03")).toBeUndefined();
    // 0.1 + 0.2 is exactly 0.3 here, unlike in binary floating point
    expect(revenueSeries([{ month: "2026-03", received: "0.3", refunded: "0.1" }], now, "EUR").at(-1)?.net).toBe("0.20");
  });

  it("starts months in UTC, across a year's end", () => {
    expect(monthStart(new Date("2026-01-31T23:30:00Z"), 1).toISOString()).toBe("2025-12-01T00:00:00.000Z");
  });

  it("writes a share, or a dash when nothing was quoted", () => {
    expect(sharePercent(3, 8)).toBe("37.5 %");
    expect(sharePercent(0, 0)).toBe("—");
  });
});
