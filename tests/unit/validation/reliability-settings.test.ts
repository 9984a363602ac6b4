import { describe, expect, it } from "vitest";
import { DEFAULT_RELIABILITY_SETTINGS } from "@/lib/bank";
import { reliabilitySettingsSchema } from "@/lib/validation/reliability-settings";

describe("the failure, yield and life settings' schema", () => {
  it("accepts the defaults", () => {
    expect(reliabilitySettingsSchema.parse(DEFAULT_RELIABILITY_SETTINGS)).toEqual(DEFAULT_RELIABILITY_SETTINGS);
  });

  it.each([
    [
      { voltageDoublingStep: { ...DEFAULT_RELIABILITY_SETTINGS.voltageDoublingStep, hybrid: 0 } },
      "voltageDoublingStep.hybrid",
      "The hybrid voltage step must be at least 0.5 %",
    ],
    [{ maxLifeYears: 500 }, "maxLifeYears", "The life ceiling must be at most 50 years"],
    [{ standbyDays: 12.5 }, "standbyDays", "The standby must be a whole number of days"],
    [{ standbyDays: -1 }, "standbyDays", "The standby must not be negative"],
    [{ yieldDistribution: "lognormal" }, "yieldDistribution", 'The spread must be "uniform" or "normal"'],
  ])("refuses %j at the field", (change, path, message) => {
    const r = reliabilitySettingsSchema.safeParse({ ...DEFAULT_RELIABILITY_SETTINGS, ...change });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => [i.path.join("."), i.message])).toContainEqual([path, message]);
  });

  it("refuses a technology it does not know and a missing one", () => {
    const { film: _film, ...three } = DEFAULT_RELIABILITY_SETTINGS.voltageDoublingStep;
    expect(reliabilitySettingsSchema.safeParse({ ...DEFAULT_RELIABILITY_SETTINGS, voltageDoublingStep: three }).success).toBe(false);
    expect(
      reliabilitySettingsSchema.safeParse({
        ...DEFAULT_RELIABILITY_SETTINGS,
        voltageDoublingStep: { ...DEFAULT_RELIABILITY_SETTINGS.voltageDoublingStep, mica: 0.1 },
      }).success,
    ).toBe(false);
  });
});
