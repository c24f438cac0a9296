/**
 * Failsafe audit (DESIGN.md §5 "Failsafe", §10 "Failsafe is set in two places"): for each link
 * loss, what the receiver *commanded* (the link sheet's failsafe channel at its planned value, or
 * the failsafe flag) and what the vehicle *flew* (a mode change, or its track), each with its
 * latency, compared with the build's plan.
 */
import type { FailsafeCommanded, FailsafeFlown, FailsafeResult } from "./evidence";
import { BEHAVIOUR_LIMITS, inferAction } from "./failsafe-behaviour";
import { classifyModeName, type ModeClass } from "./failsafe-modes";
import { spanEvent } from "./span-event";
import { SPAN_EPSILON_S, findSpans } from "./spans";
import type { AnalysisEvent, BuildConfig, ChannelConfig, FailsafeAction, RunSeries, Thresholds } from "./types";
import { RC_CHANNELS } from "@/lib/parsers/types";

export type FailsafeActionTaken = FailsafeAction | "none";

/** The audit of one link-lost event. "not-due": shorter than the planned delay and nothing fired. */
export interface FailsafeLossResult {
  lossStartS: number;
  lossEndS: number;
  commanded: FailsafeCommanded | null;
  flown: FailsafeFlown;
  /** First sign of the failsafe (commanded, or a failsafe/action mode), s; null when none. */
  failsafeStartS: number | null;
  /** failsafeStartS − loss start, s. */
  failsafeLatencyS: number | null;
  /** Flown latency (mode or track), s; null when not seen. */
  actionLatencyS: number | null;
  action: FailsafeActionTaken | null;
  outcome: FailsafeResult | "not-due";
  /** Why the loss could not be judged (outcome "not-assessed"). */
  why: string | null;
}

export interface FailsafeAnalysis {
  outcome: FailsafeResult;
  /** Set when the outcome is "not-assessed". */
  why: string | null;
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

const RANK: Record<string, number> = { "not-assessed": 0, pass: 1, late: 2, "wrong-action": 3, "not-triggered": 4 };
const letters = (fn: string) => fn.toLowerCase().replace(/[^a-z]/g, "");
/** Link-sheet functions whose channel a receiver's failsafe moves to command the action. */
const COMMAND_FUNCTIONS = new Set(["returntohome", "rth", "mode", "land", "hold"]);

export const NO_LOSS_WHY = "no link loss in this run to exercise it";
export const NO_PLAN_WHY = "the build has no failsafe plan to judge it by";
export const NO_EVIDENCE_WHY = "nothing in the log can show a failsafe: no failsafe flag, no failsafe channel value, no mode column and no track";

const hasAny = (a: ArrayLike<number>) => {
  for (let i = 0; i < a.length; i++) if (Number.isFinite(a[i])) return true;
  return false;
};

/** Options beyond the loss list. */
export interface FailsafeOptions {
  /** Per-sample distance from home, m (track module): the track's return home. */
  distanceFromHome?: ArrayLike<number>;
  /** Per-sample usable-fix mask (track module). Without any usable fix the track shows nothing (a bench test). */
  usableFix?: ArrayLike<number>;
}

/**
 * Audits the failsafe against each link loss, in a window from the loss start to its end plus
 * {@link FAILSAFE_GRACE_S}.
 *
 * **Commanded**: the first of the failsafe flag at 1, or a link-sheet channel with a planned
 * failsafe value (functions return-to-home, mode, land, hold) coming within ±25 µs of it — not
 * already there before the loss (that is the pilot's switch).
 *
 * **Flown**: a change to an action mode ({@link classifyModeName}), else a change to a failsafe
 * mode that names no action; with a mode column and neither, "none" (a mode the pilot chose before
 * the loss is not the failsafe). Without a mode column, the track over the commanded start (or the loss) to
 * the loss end, at least {@link BEHAVIOUR_WINDOW_S} ({@link inferAction}); its latency is when the
 * motion began (the turn for home, the top of the descent, the stop). With no mode column and no
 * track (no usable fix in the log: a bench test) flown is "not-logged".
 *
 * **Result** per loss against `build.failsafe`: not-assessed without a plan, or when the log has
 * nothing that could show a failsafe; not-triggered when nothing was commanded or flown on a loss
 * lasting at least the planned delay (shorter: "not-due"); wrong-action only when the vehicle was
 * seen to do something else (a different action, or no action while the receiver commanded one) —
 * never because a column is missing; late when the latency exceeds the plan (the mode's latency,
 * else the command's — a track shows an action only after the vehicle turns, so its latency is
 * judged only when nothing was commanded); else pass. The run takes the worst; no loss → not-assessed.
 * Also reports `return-to-home` spans (RTH mode anywhere, or RTH read from the track), and
 * `armed`/`disarmed` events at armed-flag changes (a log that starts armed has no armed event).
 *
 * Cost: O(n) over the run plus O(window) per loss. Pure. `th` is accepted for the shared signature.
 *
 * @param series the run (tS s, failsafe/armed 0/1, rc µs, altM m, speedMps m/s)
 * @param linkLost the `link-lost` events of analyseLink (other kinds are ignored)
 * @param build optional build: failsafe plan and link sheet
 * @param th thresholds
 * @param opts distance from home and usable fixes from the track module
 * @returns outcome, per-loss results and events
 * @example
 * // loss at 1 s, RTH channel at its failsafe value at 1.4 s, no mode column, no GPS (bench)
 * analyseFailsafe(series, lostEvents, build, th).decisive;
 * // => { commanded: { by: "rc-channel", channel: 8, latencyS: 0.4 }, flown: { state: "not-logged" }, outcome: "pass", … }
 */
export function analyseFailsafe(
  series: RunSeries,
  linkLost: readonly AnalysisEvent[],
  build: BuildConfig | undefined,
  th: Thresholds,
  opts: FailsafeOptions = {},
): FailsafeAnalysis {
  void th;
  const { tS, n } = series;
  const { distanceFromHome, usableFix } = opts;
  const plan = build?.failsafe ?? null;
  const classes = series.modeNames.map(classifyModeName);
  const held = new Float64Array(n); // last known mode index at each sample (NaN before the first)
  for (let i = 0, k = NaN; i < n; i++) held[i] = k = Number.isFinite(series.modeIndex[i]) ? series.modeIndex[i] : k;
  const modeLogged = n > 0 && series.modeNames.length > 0 && hasAny(series.modeIndex);
  const modeAt = (i: number): ModeClass | null => (i >= 0 && Number.isFinite(held[i]) ? (classes[held[i]] ?? null) : null);
  const modeName = (i: number) => (Number.isFinite(held[i]) ? (series.modeNames[held[i]] ?? null) : null);
  const changed = (i: number) => i > 0 && Number.isFinite(held[i - 1]) && held[i] !== held[i - 1];
  const flagLogged = hasAny(series.failsafe);
  const commandChannels: ChannelConfig[] = (build?.channels ?? []).filter((c) => COMMAND_FUNCTIONS.has(letters(c.function)) && c.failsafeUs !== undefined && c.channel >= 1 && c.channel <= RC_CHANNELS);
  const rcValue = (i: number, c: ChannelConfig) => (series.rc ? series.rc[i * RC_CHANNELS + c.channel - 1] : 0);
  const atFailsafe = (i: number, c: ChannelConfig) => {
    const v = rcValue(i, c);
    return v > 0 && Math.abs(v - c.failsafeUs!) <= RC_FAILSAFE_TOLERANCE_US;
  };
  const channelLogged = commandChannels.some((c) => {
    for (let i = 0; i < n; i++) if (rcValue(i, c) > 0) return true;
    return false;
  });
  let anyFix = false;
  if (usableFix) for (let i = 0; i < n && !anyFix; i++) anyFix = usableFix[i] === 1;
  else anyFix = hasAny(series.lat);
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
      const first = (on: (i: number) => boolean) => {
        for (let i = a; i <= b && i < n; i++) if (on(i)) return i;
        return -1;
      };
      const latency = (i: number) => tS[i] - loss.startS;

      // Commanded: the flag, or the earliest planned failsafe channel reaching its value.
      let commanded: FailsafeCommanded | null = null;
      let commandedI = -1;
      const flagI = first((i) => series.failsafe[i] === 1);
      if (flagI >= 0) [commanded, commandedI] = [{ by: "flag", channel: null, atS: tS[flagI], latencyS: latency(flagI) }, flagI];
      for (const c of commandChannels) {
        if (a > 0 && atFailsafe(a - 1, c)) continue; // already there: the pilot's switch
        const ci = first((i) => atFailsafe(i, c));
        if (ci >= 0 && (commandedI < 0 || ci < commandedI)) [commanded, commandedI] = [{ by: "rc-channel", channel: c.channel, atS: tS[ci], latencyS: latency(ci) }, ci];
      }

      // Flown: a mode, else the track, else not logged.
      let flown: FailsafeFlown;
      let flownI = -1;
      // A mode the pilot chose before the loss is not the failsafe: only a change inside the window counts.
      const actI = first((i) => changed(i) && modeAt(i)?.action != null);
      const fsModeI = actI >= 0 ? -1 : first((i) => changed(i) && modeAt(i)?.failsafe === true);
      const modeI = actI >= 0 ? actI : fsModeI;
      let evidence: string | null = null;
      if (modeI >= 0) {
        flownI = modeI;
        flown = { state: "seen", by: "mode", action: modeAt(modeI)!.action, atS: tS[modeI], latencyS: latency(modeI), mode: modeName(modeI), evidence };
      } else if (modeLogged) {
        flown = { state: "none", by: "mode", evidence: `mode stayed ${modeName(Math.min(b, n - 1)) ?? "unchanged"}` };
      } else if (anyFix && a < n) {
        const from = commandedI >= 0 ? commandedI : a;
        let to = from;
        while (to + 1 < n && (tS[to + 1] <= loss.endS || tS[to + 1] <= tS[from] + BEHAVIOUR_WINDOW_S)) to++;
        const inferred = inferAction(series, from, to, distanceFromHome);
        evidence = inferred.evidence;
        if (inferred.action === "none") flown = { state: "none", by: "track", evidence };
        else {
          flownI = motionOnset(series, inferred.action, a, to, distanceFromHome);
          flown = { state: "seen", by: "track", action: inferred.action, atS: tS[flownI], latencyS: latency(flownI), mode: null, evidence };
          if (inferred.action === "return-to-home" && !rthSpans.some((s) => s.startIndex <= to && s.endIndex >= from))
            events.push(spanEvent("return-to-home", { startIndex: flownI, endIndex: to, startS: tS[flownI], endS: tS[to] }, series, { peak: null, threshold: null, distanceFromHome, detail: { source: "behaviour", evidence } }));
        }
      } else flown = { state: "not-logged" };

      const seen = flown.state === "seen";
      const triggered = commanded !== null || seen;
      const due = plan ? loss.endS - loss.startS + SPAN_EPSILON_S >= plan.expectedWithinS : true;
      const canShow = flagLogged || channelLogged || modeLogged || anyFix;
      const flownLatency = flown.state === "seen" ? flown.latencyS : null;
      const judged = flown.state === "seen" && flown.by === "mode" ? flownLatency : (commanded?.latencyS ?? flownLatency);
      let outcome: FailsafeLossResult["outcome"];
      let why: string | null = null;
      if (!plan) [outcome, why] = ["not-assessed", NO_PLAN_WHY];
      else if (!canShow) [outcome, why] = ["not-assessed", NO_EVIDENCE_WHY];
      else if (!triggered) outcome = due ? "not-triggered" : "not-due";
      else if (flown.state === "seen" && flown.action !== null && flown.action !== plan.action) outcome = "wrong-action";
      else if (flown.state === "none") outcome = "wrong-action"; // commanded, and the vehicle was seen not to act
      else outcome = judged !== null && judged > plan.expectedWithinS + SPAN_EPSILON_S ? "late" : "pass";

      const signs = [commandedI, modeI].filter((i) => i >= 0);
      const fsI = signs.length ? Math.min(...signs) : -1;
      const result: FailsafeLossResult = {
        lossStartS: loss.startS,
        lossEndS: loss.endS,
        commanded,
        flown,
        failsafeStartS: fsI >= 0 ? tS[fsI] : null,
        failsafeLatencyS: fsI >= 0 ? latency(fsI) : null,
        actionLatencyS: flown.state === "seen" ? flown.latencyS : null,
        action: flown.state === "seen" ? flown.action : flown.state === "none" ? "none" : null,
        outcome,
        why,
      };
      if (fsI >= 0) {
        const on =
          fsI === commandedI && commanded?.by === "flag" ? (i: number) => series.failsafe[i] !== 0
          : fsI === commandedI && commanded?.by === "rc-channel" ? (i: number) => atFailsafe(i, commandChannels.find((c) => c.channel === commanded!.channel)!)
          : (i: number) => modeAt(i) !== null;
        const span = { startIndex: fsI, endIndex: fsI, startS: tS[fsI], endS: runEnd(fsI, on) };
        events.push(spanEvent("failsafe", span, series, { peak: result.failsafeLatencyS, threshold: plan?.expectedWithinS ?? null, distanceFromHome, detail: { ...result, unit: "s", expected: plan } }));
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
  let outcome: FailsafeResult;
  let why: string | null = null;
  if (losses.length === 0) [outcome, why] = ["not-assessed", NO_LOSS_WHY];
  else if (!worst) [outcome, why] = ["not-assessed", `no link loss lasted the planned ${plan?.expectedWithinS} s, and nothing fired`];
  else [outcome, why] = [worst.outcome as FailsafeResult, worst.why];
  const decisive = worst ?? losses[0] ?? null;
  return { outcome, why, plan, decisive, losses, events };
}

/**
 * When the motion of a failsafe action began, between the loss (`from`) and `to`: the last
 * farthest point from home (the turn for home), the last highest point (the top of the descent),
 * or the first sample at hold speed. Falls back to `from`.
 */
function motionOnset(series: RunSeries, action: FailsafeAction, from: number, to: number, distanceFromHome?: ArrayLike<number>): number {
  let best = -1;
  if (action === "return-to-home" && distanceFromHome) {
    for (let i = from; i <= to; i++) if (Number.isFinite(distanceFromHome[i]) && (best < 0 || distanceFromHome[i] >= distanceFromHome[best])) best = i;
  } else if (action === "land") {
    for (let i = from; i <= to; i++) if (Number.isFinite(series.altM[i]) && (best < 0 || series.altM[i] >= series.altM[best])) best = i;
  } else if (action === "hold") {
    for (let i = from; i <= to && best < 0; i++) if (series.speedMps[i] <= BEHAVIOUR_LIMITS.holdMaxSpeedMps) best = i;
  }
  return best >= 0 ? best : from;
}
