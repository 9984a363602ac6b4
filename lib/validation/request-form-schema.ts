/**
 * The storefront request form's zod schema: the fields' shapes (lib/validation/request-form.ts
 * reads their values), for react-hook-form in the browser and the server action alike.
 */
import { z } from "zod";
import { FAULT_FILTERS, RANK_BY } from "../bank/types";
import { technologySchema } from "./bank";
import { MAX_NOTES_LENGTH } from "./limits";
import { readRequestForm, SIZE_FOR, type RequestFormResult, type RequestFormValues } from "./request-form";

const text = z.string().max(60, "Keep this under 60 characters");

export const requestFormFieldsSchema = z.object({
  maxVoltage: text,
  minVoltage: text,
  sizeFor: z.enum(SIZE_FOR, { message: "Choose what to size the bank for" }),
  capacitance: text,
  energy: text,
  backupPower: text,
  backupTime: text,
  peakCurrent: text,
  maxDrop: text,
  maxMass: text,
  maxVolume: text,
  quantity: text,
  technology: z.union([z.literal(""), technologySchema], { message: "Choose a technology from the list" }),
  notes: z.string().max(MAX_NOTES_LENGTH, `Keep the notes under ${MAX_NOTES_LENGTH} characters`),
  // service conditions (optional) and the customer's filters over the options
  ambientTemperature: text,
  rmsCurrent: text,
  survives: z.union([z.literal(""), z.enum(FAULT_FILTERS)], { message: "Choose which failure the bank must survive" }),
  minLifeYears: text,
  rankBy: z.enum(RANK_BY, { message: "Choose price or life" }),
});

// The schema's fields and the form's type are one and the same: this stops compiling if they part.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const _fieldsAreTheForm: Same<z.infer<typeof requestFormFieldsSchema>, RequestFormValues> = true;

/** The form schema: the fields' shapes, then every value read as a quantity; outputs the SI requirement. */
export const requestFormSchema = requestFormFieldsSchema
  .superRefine((values, ctx) => {
    const r = readRequestForm(values);
    if (!r.ok) for (const issue of r.issues) ctx.addIssue({ code: "custom", path: [issue.field], message: issue.message });
  })
  .transform((values): RequestFormResult => {
    const r = readRequestForm(values);
    // superRefine has refused every failing input before the transform runs
    if (!r.ok) throw new Error("unreachable: request form refused after refinement");
    return r.data;
  });
