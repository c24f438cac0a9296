import { z } from "zod";
import { verdictLevels } from "@/db/schema/runs";

export const runSortKeys = ["date", "build", "pilot", "plan", "duration", "distance", "verdict", "status"] as const;
export type RunSortKey = (typeof runSortKeys)[number];

export const RUNS_PER_PAGE = 25;

const day = /^\d{4}-\d{2}-\d{2}$/;
// Search params arrive as strings (or arrays when repeated); anything unreadable falls back to
// the default instead of failing the page, since people edit URLs by hand.
const optionalId = z.coerce.number().int().positive().optional().catch(undefined);
const realDay = (s: string) => {
  const t = Date.parse(`${s}T00:00:00Z`);
  return Number.isFinite(t) && new Date(t).toISOString().startsWith(s) && s >= "1970-01-01" && s <= "9998-12-31";
};
const optionalDay = z.string().regex(day).refine(realDay).optional().catch(undefined);

/** The runs list's filter, sort and page, as the URL holds them. */
export const runListQuerySchema = z.object({
  sort: z.enum(runSortKeys).default("date").catch("date"),
  dir: z.enum(["asc", "desc"]).default("desc").catch("desc"),
  build: optionalId,
  pilot: optionalId,
  verdict: z.enum(verdictLevels).optional().catch(undefined),
  from: optionalDay,
  to: optionalDay,
  page: z.coerce.number().int().min(1).max(10_000).default(1).catch(1),
});
export type RunListQuery = z.infer<typeof runListQuerySchema>;

/** Reads Next's searchParams object (first value of repeated keys). */
export function readRunListQuery(params: Record<string, string | string[] | undefined>): RunListQuery {
  const flat = Object.fromEntries(Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]).filter(([, v]) => v !== undefined && v !== ""));
  return runListQuerySchema.parse(flat);
}

/** The URL search string for a query, leaving defaults out so links stay short. */
export function runListSearch(q: RunListQuery, change: Partial<RunListQuery> = {}): string {
  const next = { ...q, ...change };
  const out = new URLSearchParams();
  if (next.sort !== "date") out.set("sort", next.sort);
  if (next.dir !== "desc") out.set("dir", next.dir);
  for (const k of ["build", "pilot", "verdict", "from", "to"] as const) if (next[k] !== undefined) out.set(k, String(next[k]));
  if (next.page > 1) out.set("page", String(next.page));
  const s = out.toString();
  return s ? `?${s}` : "";
}
