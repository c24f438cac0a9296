/** Query strings of the series and points endpoints, validated with zod; every problem is a 422 naming it. */
import { z } from "zod";
import { ValidationError } from "@/lib/errors";
import { MAX_POINTS, seriesFields, type SeriesField } from "./types";

const DEFAULT_POINTS = 2000;

const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);

const fieldsSchema = z
  .string({ error: "fields is required: a comma-separated list of series fields" })
  .transform((s) => s.split(",").map((f) => f.trim()).filter(Boolean))
  .superRefine((list, ctx) => {
    if (!list.length) ctx.addIssue({ code: "custom", message: "fields must name at least one series field" });
    const unknown = list.filter((f) => !(seriesFields as readonly string[]).includes(f));
    if (unknown.length) {
      ctx.addIssue({
        code: "custom",
        message: `Unknown field${unknown.length > 1 ? "s" : ""} ${unknown.map((f) => JSON.stringify(f)).join(", ")}; fields are: ${seriesFields.join(", ")}`,
      });
    }
  })
  .transform((list) => [...new Set(list)] as SeriesField[]);

const pointsSchema = z.preprocess(
  blankToUndefined,
  z.coerce
    .number({ error: "points must be a whole number" })
    .int("points must be a whole number")
    .min(2, "points must be at least 2")
    .max(MAX_POINTS, `points must be at most ${MAX_POINTS}`)
    .default(DEFAULT_POINTS),
);

const seconds = (name: string) =>
  z.preprocess(blankToUndefined, z.coerce.number({ error: `${name} must be a number of seconds` }).refine(Number.isFinite, `${name} must be a number of seconds`).optional());

/** Cache key of a stable response (see read-series.ts). */
const versionSchema = z.preprocess(blankToUndefined, z.string().max(64).optional());

export const seriesQuerySchema = z
  .object({ fields: fieldsSchema, from: seconds("from"), to: seconds("to"), points: pointsSchema, v: versionSchema })
  .refine((q) => q.from === undefined || q.to === undefined || q.from < q.to, { message: "from must be less than to", path: ["from"] });

export const pointsQuerySchema = z.object({ fields: fieldsSchema, points: pointsSchema, v: versionSchema });

export const trackQuerySchema = z.object({ v: versionSchema });

export type SeriesQueryInput = z.infer<typeof seriesQuerySchema>;
export type PointsQueryInput = z.infer<typeof pointsQuerySchema>;

/**
 * Validates a URL's query string; the first problem becomes the message (e.g. `Unknown field "x"; …`)
 * and all of them the details, as ValidationError.fromZod does.
 */
export function parseQuery<T extends z.ZodType>(url: string | URL, schema: T): z.infer<T> {
  const params = new URL(url).searchParams;
  const raw: Record<string, string> = {};
  for (const [k, v] of params) raw[k] = v;
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw ValidationError.fromZod(parsed.error, first?.message ?? "The query string needs attention");
  }
  return parsed.data;
}
