import { z } from "zod";
import { idSchema } from "./crew";

export const noteSchema = z.object({
  runId: idSchema,
  body: z.string().trim().min(1, "Write the note first").max(4000, "Keep a note under 4,000 characters"),
});

export const signOffSchema = z.object({
  runId: idSchema,
  /** "withdraw" takes a sign-off back (e.g. after a re-parse changed the figures). */
  intent: z.enum(["sign", "withdraw"]).default("sign"),
});
