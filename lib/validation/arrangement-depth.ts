import { z } from "zod";

/**
 * Response shapes of what each arrangement option gained for failures, life and handling
 * (DESIGN.md §3.5): the fields `failures`, `life`, `handling` and `yieldBasis` of every option in
 * `POST /api/v1/shops/{shop}/arrangements` and in the storefront's results. The option's other
 * fields keep their shapes. Exported for the API description; the integration tests parse live
 * answers with them, so a drift fails there.
 */

export const optionFailureVerdictSchema = z.object({
  survives: z.boolean().describe("every single fault of this kind leaves the bank working, every remaining cell within its surge voltage"),
  withinRating: z.boolean().describe("… and every remaining cell within its rated voltage"),
  shortCircuit: z.boolean().describe("the fault shorts the whole bank"),
  capacitance: z.number().nonnegative().nullable().describe("capacitance after the fault (F), null on a short circuit"),
  maxCellVoltage: z.number().nonnegative().describe("highest voltage on a remaining cell at the working voltage (V)"),
  text: z.string().describe('the verdict in words: "Survives one shorted cell: no — …"'),
});

export const optionFailuresSchema = z.object({ short: optionFailureVerdictSchema, open: optionFailureVerdictSchema });

export const optionLifeSchema = z.object({
  ambientTemperature: z.number().describe("ambient the estimate is for (°C)"),
  ambientAssumed: z.boolean().describe("no ambient was stated: 25 °C is assumed"),
  cellVoltage: z.number().nonnegative().describe("each cell's working voltage (V)"),
  cellRmsCurrent: z.number().nonnegative().describe("each cell's rms current (A)"),
  dissipation: z.number().nonnegative().describe("I²·ESR per cell (W)"),
  selfHeating: z.number().nonnegative().describe("self-heating ΔT = I²·ESR·R_th (K)"),
  cellTemperature: z.number().describe("ambient + self-heating (°C)"),
  maxTemperature: z.number().describe("top of the cell's range (°C)"),
  temperatureFactor: z.number().positive().describe("2^((T_rated − T_cell)/10): the 10 °C rule (common practice)"),
  voltageFactor: z.number().positive().describe("2^((V_r − V)/(step·V_r)), the step from the shop's settings"),
  lifeHours: z.number().positive().nullable(),
  lifeYears: z.number().positive().nullable(),
  capped: z.boolean().describe("the life reached the shop's ceiling"),
  refusal: z.string().nullable(),
  cold: z
    .object({
      temperature: z.number().nullable().describe("bottom of the cell's range (°C)"),
      capacitance: z.number().positive().nullable().describe("the bank's capacitance there (F)"),
      esr: z.number().nonnegative().nullable().describe("the bank's ESR there (Ω)"),
    })
    .nullable(),
  assumptions: z.array(z.string()),
});

export const standbyCheckSchema = z.object({
  seconds: z.number().nonnegative().nullable().describe("time for a switched-off bank's cells to drain to their minimum (s); null: never"),
  requiredSeconds: z.number().nonnegative().describe("the shop's standby time (s)"),
  needsDisconnect: z.boolean(),
});

export const standingHeatSchema = z.object({
  watts: z.number().nonnegative().describe("continuous dissipation of the balancing resistors and any continuous bleeder (W)"),
  enclosureVolume: z.number().nonnegative().describe("the enclosure the rule assumes (m³)"),
  surface: z.number().nonnegative().describe("its surface (m²)"),
  temperatureRise: z.number().nonnegative().describe("the air's rise above ambient (K)"),
  significant: z.boolean().describe("a rise of 5 K or more (common practice)"),
});

export const optionHandlingSchema = z.object({
  minCellVoltage: z.number().positive().nullable().describe("the cell's minimum voltage (V), null when it may go to 0 V"),
  floorVoltage: z.number().positive().nullable().describe("N_s × that minimum: never discharge the bank below it (V)"),
  standby: standbyCheckSchema.nullable(),
  standingHeat: standingHeatSchema,
  shipping: z.array(z.string()).describe("transport classification and how to ship"),
});

export const yieldBasisSchema = z.object({
  matchingTolerance: z.number().min(0).max(1),
  distribution: z.enum(["uniform", "normal"]),
  capacitanceFade: z.number().min(0).max(1),
});

/** The fields every option gained, together. */
export const arrangementOptionDepthSchema = z.object({
  failures: optionFailuresSchema,
  life: optionLifeSchema.nullable(),
  handling: optionHandlingSchema,
  yieldBasis: yieldBasisSchema,
  cell: z.object({ minVoltage: z.number().positive().nullable() }).loose(),
});

export type ArrangementOptionDepth = z.infer<typeof arrangementOptionDepthSchema>;
