/**
 * An order's due date from its lead times (pure): the parts' lead time as the quote froze it
 * (calendar days: suppliers deliver on their own calendar), then the build — the quote's labour
 * hours for every bank at one 8-hour shift per working day (Monday to Friday), at least one day.
 * Dates are UTC calendar days (YYYY-MM-DD), as quote validity is.
 */

/** Hours of bench work a shop does per working day (one shift; common practice). */
export const BUILD_HOURS_PER_DAY = 8;

const DAY_MS = 86_400_000;

function utcDay(d: Date): number {
  return Date.UTC(d.getUTCFullYear(), d.getUTCMonth(), d.getUTCDate());
}

const iso = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** `days` working days (Monday–Friday) after the day `ms` (which itself does not count). */
function addWorkingDays(ms: number, days: number): number {
  let t = ms;
  let left = days;
  // whole weeks first, so a long build is not a long loop
  t += Math.floor(left / 5) * 7 * DAY_MS;
  left %= 5;
  while (left > 0) {
    t += DAY_MS;
    const wd = new Date(t).getUTCDay();
    if (wd !== 0 && wd !== 6) left -= 1;
  }
  // a due date never falls on a weekend
  while ([0, 6].includes(new Date(t).getUTCDay())) t += DAY_MS;
  return t;
}

/** Working days the build takes: labour hours per bank × banks, one shift a day, at least one. */
export function buildDays(labourHoursPerBank: number, quantity: number): number {
  const hours = Math.max(0, labourHoursPerBank) * Math.max(1, quantity);
  return Math.max(1, Math.ceil(hours / BUILD_HOURS_PER_DAY - 1e-9));
}

/** The day an order paid at `paidAt` is due: parts lead time, then the build. */
export function dueDateOf(input: { paidAt: Date; leadTimeDays: number; labourHoursPerBank: number; quantity: number }): string {
  const lead = Math.max(0, Math.ceil(input.leadTimeDays));
  const partsIn = utcDay(input.paidAt) + lead * DAY_MS;
  return iso(addWorkingDays(partsIn, buildDays(input.labourHoursPerBank, input.quantity)));
}

/** The labour hours of one bank, from the price build-up's labour lines (quantity in hours). */
export function labourHoursOf(lines: readonly { kind: string; unit: string; quantity: number }[]): number {
  return lines.filter((l) => l.kind === "labour" && l.unit === "h").reduce((sum, l) => sum + l.quantity, 0);
}

/** Today as YYYY-MM-DD (UTC), for lateness. */
export function isoDay(now: Date): string {
  return iso(utcDay(now));
}
