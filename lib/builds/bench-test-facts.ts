/**
 * Failsafe bench tests (DESIGN.md §10 "Bench failsafe test"), the pure half: what a bench run's
 * stored summary lets a lead record, whether a recorded test still holds after the link sheet
 * changed, and the words the build page, the debrief and the checklist use. No I/O.
 */
import { z } from "zod";
import type { FailsafeAction, FlownState } from "@/db/schema/builds";
import { ACTION_WORDS, commandedWords, failsafeResultWords, flownWords, type FailsafeCommanded, type FailsafeFlown, type FailsafeResult } from "@/lib/analysis/evidence";

/** Results a bench test can record: the failsafe was exercised (the link dropped) and judged. */
export const RECORDABLE_RESULTS = ["pass", "late", "wrong-action", "not-triggered"] as const satisfies readonly FailsafeResult[];

const actionSchema = z.enum(["return-to-home", "hold", "land"]);

/** The parts of `runs.summary` a bench test reads (issue 12's analysis contract), read loosely. */
const benchSummarySchema = z.looseObject({
  bench: z.boolean().optional(),
  failsafe: z
    .looseObject({
      result: z.string(),
      why: z.string().nullish(),
      plan: z.looseObject({ action: z.string(), expectedWithinS: z.number().nullish() }).nullish(),
      commanded: z
        .looseObject({ by: z.enum(["rc-channel", "flag"]), channel: z.number().nullable().default(null), atS: z.number(), latencyS: z.number() })
        .nullish()
        .catch(null),
      flown: z
        .discriminatedUnion("state", [
          z.looseObject({
            state: z.literal("seen"),
            by: z.enum(["mode", "track"]),
            action: actionSchema.nullable().catch(null),
            atS: z.number(),
            latencyS: z.number(),
            mode: z.string().nullable().default(null),
            evidence: z.string().nullable().default(null),
          }),
          z.looseObject({ state: z.literal("none"), by: z.enum(["mode", "track"]), evidence: z.string().nullable().default(null) }),
          z.looseObject({ state: z.literal("not-logged") }),
        ])
        .nullish()
        .catch(null),
      action: z.string().nullish(),
    })
    .nullish(),
});

/** What a bench test stores, taken from the run's failsafe audit. */
export interface BenchTestFacts {
  result: (typeof RECORDABLE_RESULTS)[number];
  commandedLatencyS: number | null;
  flownLatencyS: number | null;
  flownState: FlownState | null;
  action: FailsafeAction | null;
  /** The audit as it was when recorded, so its words can be shown later. */
  failsafe: { plan: unknown; commanded: FailsafeCommanded | null; flown: FailsafeFlown | null; why: string | null };
}

export type BenchTestReading = { ok: true; facts: BenchTestFacts } | { ok: false; problem: "not-bench" | "not-exercised"; message: string };

/**
 * Reads a ready run's summary for a bench test: the log must be a bench log (`bench: true`, no
 * usable fix) and its failsafe must have been exercised and judged (not "not assessed").
 * @example benchTestFacts({ bench: true, failsafe: { result: "pass", commanded: {…, latencyS: 0.4}, flown: { state: "not-logged" } } })
 *   // { ok: true, facts: { result: "pass", commandedLatencyS: 0.4, flownState: "not-logged", … } }
 */
export function benchTestFacts(summary: unknown): BenchTestReading {
  const parsed = benchSummarySchema.safeParse(summary ?? {});
  const s = parsed.success ? parsed.data : { bench: undefined, failsafe: null };
  if (s.bench !== true) {
    return {
      ok: false,
      problem: "not-bench",
      message: "This run is not a bench test: its log has usable GPS fixes, so it was analysed as a run. Record a log made on the bench (no fix, no movement).",
    };
  }
  const f = s.failsafe;
  if (!f || !(RECORDABLE_RESULTS as readonly string[]).includes(f.result)) {
    const why = f?.why ?? (f ? failsafeResultWords(f.result).toLowerCase() : "no failsafe audit in this run");
    return {
      ok: false,
      problem: "not-exercised",
      message: `The failsafe was not exercised in this log (${why}). Switch the transmitter off during the bench test so the link drops, then upload that log.`,
    };
  }
  const flown = (f.flown ?? null) as FailsafeFlown | null;
  const seen = flown?.state === "seen" ? flown : null;
  const fallbackAction = actionSchema.safeParse(f.action);
  return {
    ok: true,
    facts: {
      result: f.result as BenchTestFacts["result"],
      commandedLatencyS: f.commanded?.latencyS ?? null,
      flownLatencyS: seen?.latencyS ?? null,
      flownState: flown?.state ?? null,
      action: seen ? seen.action : fallbackAction.success ? fallbackAction.data : null,
      failsafe: { plan: f.plan ?? null, commanded: (f.commanded ?? null) as FailsafeCommanded | null, flown, why: f.why ?? null },
    },
  };
}

/**
 * A bench test is stale once the link sheet (channels or failsafe plan) changed after it: what
 * was tested is no longer what the build's record says.
 */
export function isBenchTestStale(testedAt: Date, linkSheetChangedAt: Date | null): boolean {
  return linkSheetChangedAt !== null && linkSheetChangedAt.getTime() > testedAt.getTime();
}

/** "14 Nov 2026" (UTC): a date people read at the field, unambiguous in every locale. */
export function dayWords(d: Date): string {
  const month = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"][d.getUTCMonth()];
  return `${d.getUTCDate()} ${month} ${d.getUTCFullYear()}`;
}

/**
 * dayWords, with the time when `other` falls on the same UTC day, so "tested … changed on …" reads
 * in the right order: "5 Dec 2026 at 09:02 UTC".
 */
export function dayWordsBeside(d: Date, other: Date): string {
  const sameDay = d.toISOString().slice(0, 10) === other.toISOString().slice(0, 10);
  return sameDay ? `${dayWords(d)} at ${d.toISOString().slice(11, 16)} UTC` : dayWords(d);
}

/** Where a build's failsafe bench test stands, for the build page and the checklist. */
export type BenchTestStanding =
  | { state: "missing" }
  | { state: "stale"; testedAt: Date; linkSheetChangedAt: Date; result: string }
  | { state: "failed"; testedAt: Date; result: string }
  | { state: "current"; testedAt: Date; result: string };

export function benchTestStanding(latest: { testedAt: Date; result: string } | null, linkSheetChangedAt: Date | null): BenchTestStanding {
  if (!latest) return { state: "missing" };
  if (isBenchTestStale(latest.testedAt, linkSheetChangedAt)) return { state: "stale", testedAt: latest.testedAt, linkSheetChangedAt: linkSheetChangedAt!, result: latest.result };
  if (latest.result !== "pass") return { state: "failed", testedAt: latest.testedAt, result: latest.result };
  return { state: "current", testedAt: latest.testedAt, result: latest.result };
}

/** One sentence on the build's bench test for the pre-run checklist. */
export function benchTestLine(s: BenchTestStanding): string {
  switch (s.state) {
    case "missing":
      return "No failsafe bench test recorded for this build: bench-test it before the run.";
    case "stale":
      return `The failsafe bench test of ${dayWordsBeside(s.testedAt, s.linkSheetChangedAt)} is stale: the link sheet changed on ${dayWordsBeside(s.linkSheetChangedAt, s.testedAt)}. Bench-test it again before the run.`;
    case "failed":
      return `The failsafe bench test of ${dayWords(s.testedAt)} did not pass (${failsafeResultWords(s.result).toLowerCase()}): correct the setup and bench-test it again before the run.`;
    case "current":
      return `Failsafe bench test of ${dayWords(s.testedAt)}: ${failsafeResultWords(s.result).toLowerCase()}, and the link sheet has not changed since.`;
  }
}

/** "0.4 s after the loss (channel 8 at its failsafe value)", from the snapshot when kept, else the figure. */
export function benchCommandedWords(t: { commandedLatencyS: number | null; failsafe: unknown }): string {
  const snap = (t.failsafe ?? {}) as { commanded?: FailsafeCommanded | null };
  if (snap.commanded) return commandedWords(snap.commanded);
  return t.commandedLatencyS != null ? `${t.commandedLatencyS.toFixed(1)} s after the loss` : "not seen";
}

/** What the vehicle did, in the debrief's words (flownWords), from the snapshot when kept. */
export function benchFlownWords(t: { flownState: FlownState | null; flownLatencyS: number | null; action: FailsafeAction | null; failsafe: unknown }): string {
  const snap = (t.failsafe ?? {}) as { flown?: FailsafeFlown | null };
  if (snap.flown) return flownWords(snap.flown);
  if (t.flownState === "not-logged") return flownWords({ state: "not-logged" });
  if (t.flownState === "none") return "no failsafe action seen";
  if (t.flownState === "seen") return `${t.action ? ACTION_WORDS[t.action] : "failsafe action"}${t.flownLatencyS != null ? ` ${t.flownLatencyS.toFixed(1)} s after the loss` : ""}`;
  return "—";
}
