import { z } from "zod";
import { idSchema } from "./crew";

/**
 * Recording a run as its build's failsafe bench test: the route's body (the build is in the path)
 * and, with the build added, the debrief's form.
 */
export const benchTestCreateSchema = z
  .object({
    runId: idSchema,
    note: z
      .string()
      .trim()
      .max(500, "Keep the note under 500 characters")
      .optional()
      .transform((v) => (v ? v : undefined)),
  })
  .strict();

export type BenchTestCreate = z.infer<typeof benchTestCreateSchema>;

/**
 * The debrief's form also names the build it shows, so a run moved to another build meanwhile is
 * refused rather than recorded on a build the lead did not see. Not strict: React adds its own
 * fields to a form.
 */
export const benchTestFormSchema = z.object({ ...benchTestCreateSchema.shape, buildId: idSchema });
