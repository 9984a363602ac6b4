import { z } from "zod";

/** Every refusal a JSON route gives: a message for people and, for bad input, the fields at fault. */
export const apiErrorSchema = z
  .object({
    error: z.string().meta({ description: "what went wrong, in a sentence" }),
    issues: z
      .array(
        z.object({
          path: z.string().meta({ description: 'the field at fault, e.g. "network.children[0].capacitance"; "" for the body itself' }),
          message: z.string(),
        }),
      )
      .optional()
      .meta({ description: "present on a 400: each field the request got wrong" }),
  })
  .meta({ id: "Error" });

export type ApiError = z.infer<typeof apiErrorSchema>;
