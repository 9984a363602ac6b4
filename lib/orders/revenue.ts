/**
 * The dashboard's revenue series (pure): the last N calendar months (UTC), each with what was
 * received, refunded and the net, as exact decimal strings in the shop's currency; months without
 * payments are zero.
 */
import { Dec } from "@/lib/pricing/decimal";
import { moneyString } from "@/lib/pricing";

export interface RevenuePoint {
  /** YYYY-MM */
  month: string;
  received: string;
  refunded: string;
  net: string;
}

/** "2026-03" for a date's calendar month in UTC. */
export function monthKey(d: Date): string {
  return d.toISOString().slice(0, 7);
}

/** The first instant of the UTC month `back` months before `now`'s (0 = this month). */
export function monthStart(now: Date, back = 0): Date {
  return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - back, 1));
}

export function revenueSeries(
  rows: readonly { month: string; received: string; refunded: string }[],
  now: Date,
  currency: string,
  months = 12,
): RevenuePoint[] {
  const byMonth = new Map(rows.map((r) => [r.month, r]));
  const out: RevenuePoint[] = [];
  for (let back = months - 1; back >= 0; back--) {
    const month = monthKey(monthStart(now, back));
    const r = byMonth.get(month);
    const received = new Dec(r?.received ?? "0");
    const refunded = new Dec(r?.refunded ?? "0");
    out.push({
      month,
      received: moneyString(received, currency),
      refunded: moneyString(refunded, currency),
      net: moneyString(received.minus(refunded), currency),
    });
  }
  return out;
}

/** A share as people read it: "37.5 %", or "—" when there is nothing to divide by. */
export function sharePercent(part: number, whole: number): string {
  if (whole <= 0) return "—";
  return `${String(Math.round((part / whole) * 1000) / 10)} %`;
}
