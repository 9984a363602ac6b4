import { z } from "zod";
import { RELIABILITY_SETTING_BOUNDS as B, type ReliabilitySettings } from "../bank/reliability-settings";
import { TECHNOLOGIES, type Technology } from "../bank/types";

/**
 * The shop's failure, yield and life settings (`reliabilitySettings`) as the settings form and any
 * API that changes them must check them: each field within its bound, with a message that names it.
 */
const step = (t: Technology) =>
  z
    .number({ message: `The ${t} voltage step must be a number` })
    .min(B.voltageDoublingStep.min, `The ${t} voltage step must be at least ${B.voltageDoublingStep.min * 100} %`)
    .max(B.voltageDoublingStep.max, `The ${t} voltage step must be at most ${B.voltageDoublingStep.max * 100} %`);

export const reliabilitySettingsSchema = z.strictObject({
  voltageDoublingStep: z.strictObject(Object.fromEntries(TECHNOLOGIES.map((t) => [t, step(t)])) as Record<Technology, ReturnType<typeof step>>),
  maxLifeYears: z
    .number({ message: "The life ceiling must be a number of years" })
    .min(B.maxLifeYears.min, `The life ceiling must be at least ${B.maxLifeYears.min} year`)
    .max(B.maxLifeYears.max, `The life ceiling must be at most ${B.maxLifeYears.max} years`),
  standbyDays: z
    .number({ message: "The standby must be a number of days" })
    .int("The standby must be a whole number of days")
    .min(B.standbyDays.min, "The standby must not be negative")
    .max(B.standbyDays.max, `The standby must be at most ${B.standbyDays.max} days`),
  yieldDistribution: z.enum(["uniform", "normal"], { message: 'The spread must be "uniform" or "normal"' }),
}) satisfies z.ZodType<ReliabilitySettings>;

export type ReliabilitySettingsInput = z.infer<typeof reliabilitySettingsSchema>;
