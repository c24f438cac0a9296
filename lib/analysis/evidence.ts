/**
 * What a run's log can and cannot show (DESIGN.md §10 "Evidence, not absence"): the shapes the
 * analysis reports for home, the link metric's source, the failsafe's commanded and flown halves,
 * and the parts of a run it could not assess — with the words the debrief, PDF, share page, mail
 * and command-line analyser all use for them. Pure data; no I/O.
 */
import type { FailsafeAction } from "./types";

/** The parts of a run the verdict judges. */
export const assessedParts = ["link", "failsafe", "route", "battery", "gps"] as const;
export type AssessedPart = (typeof assessedParts)[number];

/** A part the log could not show, and why (one sentence, no trailing full stop). */
export interface NotAssessed {
  what: AssessedPart;
  why: string;
}

/** How each part is named in a sentence ("Not assessed: failsafe — …"). */
export const PART_WORDS: Record<AssessedPart, string> = {
  link: "link",
  failsafe: "failsafe",
  route: "route",
  battery: "battery",
  gps: "GPS",
};

/** The word a figure shows in place of a value for a part the log could not show. */
export const NOT_ASSESSED_WORDS = "Not assessed";
/** The word a time figure shows when the log's times cannot pace it. */
export const NOT_AVAILABLE_WORDS = "Not available";
/** The word the range figure shows when its fit is too poor to quote. */
export const NO_CREDIBLE_FIT_WORDS = "No credible fit";

/** "Not assessed: failsafe — no link loss in this run to exercise it". */
export function notAssessedWords(n: NotAssessed): string {
  return `${NOT_ASSESSED_WORDS}: ${PART_WORDS[n.what] ?? n.what} — ${n.why}`;
}

/** What "nothing fired" means for each part that was assessed. */
export const HELD_WORDS: Record<AssessedPart, string> = {
  link: "the link held",
  failsafe: "the failsafe acted as planned",
  route: "the route was followed inside its corridor",
  battery: "the battery stayed above its low-voltage limit",
  gps: "the GPS fix held",
};

/** "The link held, the failsafe acted as planned and the GPS fix held."; null when nothing was. */
export function heldWords(held: readonly AssessedPart[]): string | null {
  const clauses = held.map((p) => HELD_WORDS[p]).filter(Boolean);
  if (clauses.length === 0) return null;
  const list = clauses.length === 1 ? clauses[0] : `${clauses.slice(0, -1).join(", ")} and ${clauses[clauses.length - 1]}`;
  return `${list.charAt(0).toUpperCase()}${list.slice(1)}.`;
}

/** The verdict's title when nothing fired but some parts could not be assessed. */
export const CLEAR_FOR_ASSESSED_WORDS = "Clear for what was assessed";

/** A stored summary from before `held`/`notAssessed` existed, with nothing fired: it cannot say what held. */
export const LEGACY_CLEAR_WORDS =
  "No rule fired. This run was analysed before Sortie recorded which parts a log can show; re-parse the log to see what was and was not assessed.";

// ---- Bench runs ------------------------------------------------------------------------------

/** A run whose log has no usable fix (summary.bench), DESIGN.md §10 "Bench failsafe test". */
export const BENCH_WORDS = {
  title: "Bench run: analysed for link and failsafe only",
  body: "The log has no usable GPS fix, so there is no track: distance, speed, the map, the route and the range estimate are left out.",
  loss: "On the bench the link loss is the test itself (the transmitter switched off): it is not counted against the run; the failsafe result is what the test shows.",
} as const;

// ---- Home -----------------------------------------------------------------------------------

/**
 * Which rule placed home (DESIGN.md §10 "Home is where the vehicle was armed"):
 * - `arming`: the first good fix at or after the first arming;
 * - `first-good-fix`: the first good fix (the log has no arming);
 * - `before-arming`: armed, but no good fix came after arming: the last good fix before it;
 * - `first-fix`: no fix met the good-fix rule: the first usable fix (at or after arming when armed).
 */
export const homeSources = ["arming", "first-good-fix", "before-arming", "first-fix"] as const;
export type HomeSource = (typeof homeSources)[number];

export interface HomeInfo {
  lat: number;
  lon: number;
  /** Time of the fix that placed home, s from the first sample. */
  tS: number;
  source: HomeSource;
  /** Satellites and HDOP of that fix, when logged. */
  sats: number | null;
  hdop: number | null;
}

export const HOME_SOURCE_WORDS: Record<HomeSource, string> = {
  arming: "where the vehicle was armed (first good fix after arming)",
  "first-good-fix": "the first good fix (the log shows no arming)",
  "before-arming": "the last good fix before arming (no good fix came after it)",
  "first-fix": "the first fix (no fix met the good-fix rule)",
};

// ---- Link metric source ---------------------------------------------------------------------

/** Where the judged link metric came from: a column of the log, or the link sheet's RSSI channel (µs → %). */
export type LinkSource = { kind: "column" } | { kind: "rc-channel"; channel: number };

/** "RSSI from channel 14", "LQ column", "RSSI column (dBm)". */
export function linkSourceWords(metric: string | null, source: LinkSource | null | undefined): string | null {
  if (!metric) return null;
  if (source?.kind === "rc-channel") return `RSSI from channel ${source.channel} (link sheet, 1000–2000 µs = 0–100 %)`;
  return metric === "lq" ? "LQ column" : metric === "rssi-dbm" ? "RSSI column (dBm)" : "RSSI column (%)";
}

// ---- Failsafe -------------------------------------------------------------------------------

/** The failsafe audit's result (DESIGN.md §5, §10). */
export const failsafeResults = ["pass", "late", "wrong-action", "not-triggered", "not-assessed"] as const;
export type FailsafeResult = (typeof failsafeResults)[number];

/** Results an older analysis stored, still read from runs not analysed again since. */
const LEGACY_RESULT_WORDS: Record<string, string> = { "not-tested": "Not assessed", "no-plan": "Not assessed" };

export const FAILSAFE_RESULT_WORDS: Record<FailsafeResult, string> = {
  pass: "Acted as planned",
  late: "Acted late",
  "wrong-action": "Wrong action",
  "not-triggered": "Did not trigger",
  "not-assessed": "Not assessed",
};

export function failsafeResultWords(result: string): string {
  return FAILSAFE_RESULT_WORDS[result as FailsafeResult] ?? LEGACY_RESULT_WORDS[result] ?? result;
}

/** True for "not-assessed" and the older results that meant the same. */
export function failsafeNotAssessed(result: string | null | undefined): boolean {
  return result === "not-assessed" || (result != null && result in LEGACY_RESULT_WORDS);
}

/** Why an older stored result was not assessed (those summaries carry no `why`). */
export const LEGACY_FAILSAFE_WHY: Record<string, string> = {
  "not-tested": "no link loss in this run to exercise it",
  "no-plan": "the build has no failsafe plan to judge it by",
};

/**
 * One loss's outcome on a failsafe event (`detail.outcome`): the results above, plus "not-due" —
 * the loss ended before the plan's time was up, so nothing was owed yet.
 */
export function failsafeOutcomeWords(outcome: string): string {
  return outcome === "not-due" ? "Not due: the loss ended before the planned time" : failsafeResultWords(outcome);
}

/** "return to home within 1.5 s". */
export function failsafePlanWords(plan: { action: string; expectedWithinS: number } | null | undefined): string | null {
  if (!plan) return null;
  return `${ACTION_WORDS[plan.action as FailsafeAction] ?? plan.action} within ${plan.expectedWithinS} s`;
}

/** Results that make the run "act". */
export const FAILSAFE_ACT_RESULTS: readonly string[] = ["late", "wrong-action", "not-triggered"];

/** The receiver's half: the link sheet's failsafe channel reached its planned value, or the failsafe flag rose. */
export interface FailsafeCommanded {
  by: "rc-channel" | "flag";
  /** The RC channel (by "rc-channel"); null for the flag. */
  channel: number | null;
  /** Seconds from the first sample. */
  atS: number;
  /** From the link loss's start, s. */
  latencyS: number;
}

/**
 * The vehicle's half: what it did. `seen` — a mode change (or, without a mode column, the track)
 * shows the action; `none` — the mode (or track) was logged and shows no failsafe action;
 * `not-logged` — the log has neither a mode column nor a track to show it.
 */
export type FailsafeFlown =
  | { state: "seen"; by: "mode" | "track"; action: FailsafeAction | null; atS: number; latencyS: number; mode: string | null; evidence: string | null }
  | { state: "none"; by: "mode" | "track"; evidence: string | null }
  | { state: "not-logged" };

export const ACTION_WORDS: Record<FailsafeAction, string> = { "return-to-home": "return to home", hold: "hold", land: "land" };

/** A link loss that began as a fade (link-lost `detail.fadeStartS`): "faded from 1:51". */
export function fadeLeadInWords(fadeStartClock: string): string {
  return `faded from ${fadeStartClock}`;
}

/** "Commanded 0.4 s after the loss (channel 8 at its failsafe value)". */
export function commandedWords(c: FailsafeCommanded | null | undefined): string {
  if (!c) return "not seen";
  const how = c.by === "flag" ? "failsafe flag" : `channel ${c.channel} at its failsafe value`;
  return `${c.latencyS.toFixed(1)} s after the loss (${how})`;
}

/** "return to home 0.9 s after the loss (mode RTH)", "not logged (no mode column, no track)". */
export function flownWords(f: FailsafeFlown | null | undefined): string {
  if (!f) return "—";
  if (f.state === "not-logged") return "not logged (no mode column, no track)";
  if (f.state === "none") return f.by === "mode" ? "no failsafe mode in the log" : `not seen in the track${f.evidence ? ` (${f.evidence})` : ""}`;
  const what = f.action ? ACTION_WORDS[f.action] : "failsafe mode (action not named)";
  const how = f.by === "mode" ? (f.mode ? `mode ${f.mode}` : "mode change") : "from the track";
  return `${what} ${f.latencyS.toFixed(1)} s after the loss (${how})`;
}

// ---- Mission start --------------------------------------------------------------------------

/** What showed the mission starting (DESIGN.md §10 "A mission starts from wherever the vehicle is"). */
export type MissionStartSource = "mode" | "channel" | "movement";

export interface MissionStart {
  source: MissionStartSource;
  /** Seconds from the first sample. */
  startS: number;
  lat: number;
  lon: number;
}

export const MISSION_START_WORDS: Record<MissionStartSource, string> = {
  mode: "when a mission mode was engaged",
  channel: "when the link sheet's mission channel entered its engage range",
  movement: "at the vehicle's first movement from home (no mission mode or channel in the log)",
};
