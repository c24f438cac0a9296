/**
 * Failsafe check (DESIGN.md §5 "Failsafe"): did the vehicle act on each link loss, how fast, and
 * as the build planned?
 */
import { inferAction } from "./failsafe-behaviour";
import { classifyModeName, type ModeClass } from "./failsafe-modes";
import { spanEvent } from "./span-event";
import { SPAN_EPSILON_S, findSpans } from "./spans";
import type { AnalysisEvent, BuildConfig, FailsafeAction, RunSeries, Thresholds } from "./types";
import { RC_CHANNELS } from "@/lib/parsers/types";

export type FailsafeActionTaken = FailsafeAction | "none";
export type FailsafeOutcome = "pass" | "late" | "wrong-action" | "not-triggered" | "not-tested" | "no-plan";
/** What showed the failsafe start: flag, mode text, the RC channel, or only the vehicle's motion. */
export type FailsafeSource = "flag" | "mode" | "rc" | "behaviour";

/** The check for one link-lost event. "not-due": shorter than the planned delay and nothing fired. */
export interface FailsafeLossResult {
  lossStartS: number;
  lossEndS: number;
  source: FailsafeSource | null;
  failsafeStartS: number | null;
  /** Failsafe start − loss start, s. */
  failsafeLatencyS: number | null;
  /** First mode change to an action mode − loss start, s (null when the action came from motion). */
  actionLatencyS: number | null;
  action: FailsafeActionTaken;
  actionFrom: "mode" | "behaviour" | null;
  outcome: FailsafeOutcome | "not-due";
}

export interface FailsafeAnalysis {
  outcome: FailsafeOutcome;
  plan: { action: FailsafeAction; expectedWithinS: number } | null;
  /** The loss that decided the outcome (the worst), or null with no loss. */
  decisive: FailsafeLossResult | null;
  losses: FailsafeLossResult[];
  /** `failsafe`, `return-to-home`, `armed`, `disarmed` in time order. */
  events: AnalysisEvent[];
}

/** Time after a loss ends still searched for its failsafe (s): logging lag. Our choice. */
export const FAILSAFE_GRACE_S = 0.5;
/** Shortest window read for behaviour after a failsafe start (s). Our choice. */
export const BEHAVIOUR_WINDOW_S = 3;
/** An RC channel within this of its failsafe value is at it (µs). */
export const RC_FAILSAFE_TOLERANCE_US = 25;

const RANK: Record<string, number> = { pass: 1, late: 2, "wrong-action": 3, "not-triggered": 4 };
const channelIsRth = (fn: string) => ["returntohome", "rth"].includes(fn.toLowerCase().replace(/[^a-z]/g, ""));

/**
 * Checks the failsafe against each link loss. Failsafe start: the first, inside the loss (plus
 * {@link FAILSAFE_GRACE_S}), of the failsafe flag at 1, a change to a mode
 * {@link classifyModeName} marks, or the RC channel the build names "return-to-home" coming
 * within ±25 µs of its `failsafeUs` (not already there before the loss). Action: the first
 * change to an action mode in that window, else {@link inferAction} over the failsafe start (or
 * loss start) to the loss end, at least {@link BEHAVIOUR_WINDOW_S}. Outcome per loss against
 * `build.failsafe`: wrong-action when the action differs (or none), late when the action latency
 * (else the failsafe latency) exceeds `expectedWithinS`, not-triggered when nothing fired on a loss
 * lasting at least `expectedWithinS` (shorter ones are "not-due"); the run takes the worst.
 * No loss → "not-tested"; a loss but no plan → "no-plan" (what happened is still reported).
 * Also reports `return-to-home` spans (RTH mode anywhere, or RTH inferred from motion), and
 * `armed`/`disarmed` events at armed-flag changes (a log that starts armed has no armed event).
 *
 * Cost: O(n × losses). Pure. `th` is accepted for the shared signature and not read yet.
 *
 * @param series the run (tS s, failsafe/armed 0/1, rc µs, altM m, speedMps m/s)
 * @param linkLost the `link-lost` events of analyseLink (other kinds are ignored)
 * @param build optional build: failsafe plan and channel map
 * @param th thresholds
 * @param distanceFromHome optional per-sample distance from home, m (track module)
 * @returns outcome, per-loss results and events
 * @example
 * // loss at 1 s, flag at 1.5 s, mode "RTH" at 1.5 s; plan RTH within 2 s
 * analyseFailsafe(series, lostEvents, { vehicleType: "ground", failsafe: { action: "return-to-home", expectedWithinS: 2 } }, th).outcome;
 * // => "pass"
 */
export function analyseFailsafe(
  series: RunSeries,
  linkLost: AnalysisEvent[],
  build: BuildConfig | undefined,
  th: Thresholds,
  distanceFromHome?: ArrayLike<number>,
): FailsafeAnalysis {
  void th;
  const { tS, n } = series;
  const plan = build?.failsafe ?? null;
  const classes = series.modeNames.map(classifyModeName);
  const held = new Float64Array(n); // last known mode index at each sample (NaN before the first)
  for (let i = 0, k = NaN; i < n; i++) held[i] = k = Number.isFinite(series.modeIndex[i]) ? series.modeIndex[i] : k;
  const modeAt = (i: number): ModeClass | null => (i >= 0 && Number.isFinite(held[i]) ? (classes[held[i]] ?? null) : null);
  const changed = (i: number) => i > 0 && Number.isFinite(held[i - 1]) && held[i] !== held[i - 1];
  const ch = build?.channels?.find((c) => channelIsRth(c.function) && c.failsafeUs !== undefined);
  const rcAt = (i: number) => {
    const v = ch && series.rc ? series.rc[i * RC_CHANNELS + ch.channel - 1] : 0;
    return v > 0 && Math.abs(v - ch!.failsafeUs!) <= RC_FAILSAFE_TOLERANCE_US;
  };
  const lastAt = (i: number) => (i >= 0 ? tS[i] : NaN);
  /** Time of the first sample after `k` where `on` fails, else the last sample's time. */
  const runEnd = (k: number, on: (i: number) => boolean) => {
    for (let i = k + 1; i < n; i++) if (Number.isFinite(tS[i]) && !on(i)) return tS[i];
    return lastAt(n - 1);
  };
  const rth = (i: number) => modeAt(i)?.action === "return-to-home";
  const events: AnalysisEvent[] = [];
  const rthSpans = findSpans(tS, rth, { minDurationS: 0 });

  // Losses are visited in time order, so the search for each one's first sample resumes where the
  // last one stopped (restarting only if time went backwards): O(n) over the run, not O(n × losses).
  let cursor = 0;
  const losses: FailsafeLossResult[] = linkLost
    .filter((e) => e.kind === "link-lost")
    .sort((a, b) => a.startS - b.startS)
    .map((loss) => {
      let a = cursor < n && tS[cursor] <= loss.startS ? cursor : 0;
      while (a < n && !(tS[a] >= loss.startS)) a++;
      cursor = a;
      let b = a;
      while (b + 1 < n && !(tS[b + 1] > loss.endS + FAILSAFE_GRACE_S)) b++;
      const lossEnd = loss.endS;
      const first = (on: (i: number) => boolean) => {
        for (let i = a; i <= b && i < n; i++) if (on(i)) return i;
        return -1;
      };
      const flagI = first((i) => series.failsafe[i] === 1);
      const modeI = first((i) => changed(i) && modeAt(i) !== null);
      const rcI = a > 0 && rcAt(a - 1) ? -1 : first(rcAt);
      const found = ([["flag", flagI], ["mode", modeI], ["rc", rcI]] as const).filter(([, i]) => i >= 0).sort((x, y) => x[1] - y[1])[0];
      const fsI = found ? found[1] : -1;
      const due = plan ? lossEnd - loss.startS + SPAN_EPSILON_S >= plan.expectedWithinS : true;

      const actI = first((i) => changed(i) && modeAt(i)?.action != null);
      let action: FailsafeActionTaken = "none";
      let actionFrom: FailsafeLossResult["actionFrom"] = null;
      let evidence: string | null = null;
      if (actI >= 0) [action, actionFrom] = [modeAt(actI)!.action!, "mode"];
      else if (fsI >= 0 || due) {
        const from = fsI >= 0 ? fsI : a;
        let to = from;
        while (to + 1 < n && (tS[to + 1] <= lossEnd || tS[to + 1] <= tS[from] + BEHAVIOUR_WINDOW_S)) to++;
        const inferred = from < n ? inferAction(series, from, to, distanceFromHome) : { action: "none" as const, evidence: "no samples" };
        [action, evidence] = [inferred.action, inferred.evidence];
        if (action !== "none") actionFrom = "behaviour";
        if (action === "return-to-home" && !rthSpans.some((s) => s.startIndex <= to && s.endIndex >= from))
          events.push(spanEvent("return-to-home", { startIndex: from, endIndex: to, startS: tS[from], endS: tS[to] }, series, { peak: null, threshold: null, distanceFromHome, detail: { source: "behaviour", evidence } }));
      }
      const triggered = fsI >= 0 || actionFrom !== null;
      const failsafeLatencyS = fsI >= 0 ? tS[fsI] - loss.startS : null;
      const actionLatencyS = actI >= 0 ? tS[actI] - loss.startS : null;
      const latency = actionLatencyS ?? failsafeLatencyS;
      const outcome: FailsafeLossResult["outcome"] =
        !plan ? "no-plan"
        : !triggered ? (due ? "not-triggered" : "not-due")
        : action !== plan.action ? "wrong-action"
        : latency !== null && latency > plan.expectedWithinS + SPAN_EPSILON_S ? "late"
        : "pass";
      const result: FailsafeLossResult = {
        lossStartS: loss.startS,
        lossEndS: loss.endS,
        source: found ? found[0] : actionFrom === "behaviour" ? "behaviour" : null,
        failsafeStartS: fsI >= 0 ? tS[fsI] : null,
        failsafeLatencyS,
        actionLatencyS,
        action,
        actionFrom,
        outcome,
      };
      if (found) {
        const on = found[0] === "flag" ? (i: number) => series.failsafe[i] !== 0 : found[0] === "rc" ? rcAt : (i: number) => modeAt(i) !== null;
        const span = { startIndex: fsI, endIndex: fsI, startS: tS[fsI], endS: runEnd(fsI, on) };
        events.push(spanEvent("failsafe", span, series, { peak: failsafeLatencyS, threshold: plan?.expectedWithinS ?? null, distanceFromHome, detail: { ...result, unit: "s", evidence, expected: plan, channel: found[0] === "rc" ? ch : undefined } }));
      }
      return result;
    });

  for (const s of rthSpans) events.push(spanEvent("return-to-home", s, series, { peak: null, threshold: null, distanceFromHome, detail: { source: "mode", mode: series.modeNames[held[s.startIndex]] } }));
  for (let i = 0, last = NaN; i < n; i++) {
    const v = series.armed[i];
    if (!Number.isFinite(v) || !Number.isFinite(tS[i])) continue;
    if (Number.isFinite(last) && v !== last) events.push(spanEvent(v === 1 ? "armed" : "disarmed", { startIndex: i, endIndex: i, startS: tS[i], endS: tS[i] }, series, { peak: null, threshold: null, distanceFromHome }));
    last = v;
  }
  events.sort((x, y) => x.startS - y.startS);

  const judged = losses.filter((l) => l.outcome !== "not-due");
  const worst = judged.reduce<FailsafeLossResult | null>((w, l) => (!w || (RANK[l.outcome] ?? 0) > (RANK[w.outcome] ?? 0) ? l : w), null);
  const outcome: FailsafeOutcome = losses.length === 0 || !worst ? "not-tested" : !plan ? "no-plan" : (worst.outcome as FailsafeOutcome);
  const decisive = !plan ? (losses.find((l) => l.source !== null) ?? losses[0] ?? null) : worst;
  return { outcome, plan, decisive, losses, events };
}
