import { describe, expect, it } from "vitest";
import { buildDays, dueDateOf, labourHoursOf } from "@/lib/orders/due-date";

// Weekdays of the dates below, read off a printed 2026 calendar: 2026-03-04 is a Wednesday,
// 2026-03-07 a Saturday, 2026-03-09 a Monday, 2026-12-31 a Thursday.
describe("due dates from lead times", () => {
  it.each([
    // paid, lead days, labour h per bank, banks, due
    ["2026-03-04T10:00:00Z", 3, 10, 1, "2026-03-10"], // parts in Sat 7th; 2 working days: Mon 9th, Tue 10th
    ["2026-03-04T23:59:00Z", 0, 2, 1, "2026-03-05"], // one day at least, the next working day
    ["2026-03-04T10:00:00Z", 0, 8, 5, "2026-03-11"], // 40 h = 5 working days: Thu, Fri, Mon, Tue, Wed
    ["2026-03-06T10:00:00Z", 0, 1, 1, "2026-03-09"], // paid Friday: the build day is Monday
    ["2026-12-31T10:00:00Z", 14, 4, 1, "2027-01-15"], // parts in Thu 14 Jan 2027, built Fri 15 Jan
  ] as const)("paid %s, lead %i d, %i h per bank × %i → due %s", (paid, lead, hours, quantity, due) => {
    expect(dueDateOf({ paidAt: new Date(paid), leadTimeDays: lead, labourHoursPerBank: hours, quantity })).toBe(due);
  });

  it("counts whole shifts of 8 hours, at least one", () => {
    expect(buildDays(0, 1)).toBe(1);
    expect(buildDays(8, 1)).toBe(1);
    expect(buildDays(8.01, 1)).toBe(2);
    expect(buildDays(2.5, 100)).toBe(32);
  });

  it("reads the labour hours of one bank from the price build-up", () => {
    const lines = [
      { kind: "material", unit: "pc", quantity: 72 },
      { kind: "labour", unit: "h", quantity: 1.5 },
      { kind: "labour", unit: "h", quantity: 7.2 },
      { kind: "overhead", unit: "lot", quantity: 1 },
    ];
    expect(labourHoursOf(lines)).toBeCloseTo(8.7, 10);
  });
});
