import { assessedParts, FAILSAFE_ACT_RESULTS, type AssessedPart, type NotAssessed } from "./evidence";

/** clear: nothing fired · watch: look at it · act: fix before the next run (DESIGN.md §5). */
export type VerdictLevel = "clear" | "watch" | "act";

/** What the other analysis steps found in one run: event counts, names, seconds. */
export interface VerdictInput {
  linkLost: number;
  linkFades: number;
  /** Failsafe check outcome: "pass", "late", "wrong-action", "not-triggered" (anything else: no rule). */
  failsafeResult?: string;
  offRoute: number;
  waypointsMissed: string[];
  lowVoltage: number;
  fixLost: number;
  positionJumps: number;
  /** Seconds with HDOP above the warning threshold. */
  hdopWarnS?: number;
  /** Parts the log could not show (DESIGN.md §10 "Evidence, not absence"); their rules are not read. */
  notAssessed?: NotAssessed[];
}

/** Result of judgeRun. */
export interface Verdict {
  level: VerdictLevel;
  /** One short sentence per rule that fired, act rules first; empty when clear. */
  reasons: string[];
  /** Parts that were assessed and where nothing fired. */
  held: AssessedPart[];
  /** Parts the log could not show, and why: "clear" is only ever clear for what was assessed. */
  notAssessed: NotAssessed[];
}

/** "once", "twice", "3 times". */
const times = (n: number) => (n === 1 ? "once" : n === 2 ? "twice" : `${n} times`);
const fired = (n: number | undefined): n is number => typeof n === "number" && n > 0;

const FAILSAFE_REASONS: Record<string, string> = {
  late: "Failsafe acted later than planned",
  "wrong-action": "Failsafe took the wrong action",
  "not-triggered": "Failsafe did not trigger when the link was lost",
};

/**
 * The run's verdict (DESIGN.md §5): **act** when the link was lost, the failsafe check came out
 * wrong-action, late or not-triggered, the battery went low or a waypoint was missed; otherwise
 * **watch** when the link faded, the run left the route or GPS warned (fix lost, position jumps,
 * HDOP above the warning); otherwise **clear** (nothing fired). Every rule that fired gives a
 * plain sentence with its count, so "act" always says why — watch reasons are listed under act too.
 *
 * Counts are incidents (a fade that ran into a loss is counted once, as the loss). Counts that are
 * zero, negative or NaN do not fire. failsafeResult is matched ignoring case, spaces and
 * underscores ("Wrong action" = "wrong-action"); "pass" or unknown values fire nothing.
 * `held` lists the parts assessed where nothing fired; `notAssessed` is passed through, and a part
 * in it is never "held".
 *
 * Cost: O(number of missed waypoints).
 *
 * @param input event counts from the link, failsafe, route, power and track steps
 * @returns level and reasons
 * @example
 * judgeRun({ linkLost: 2, linkFades: 0, offRoute: 0, waypointsMissed: ["Dune post"],
 *   lowVoltage: 0, fixLost: 0, positionJumps: 0 });
 * // => { level: "act", reasons: ["Link lost twice", "1 waypoint missed: Dune post"] }
 */
export function judgeRun(input: VerdictInput): Verdict {
  const act: string[] = [];
  const watch: string[] = [];

  if (fired(input.linkLost)) act.push(`Link lost ${times(input.linkLost)}`);
  const failsafe = input.failsafeResult?.trim().toLowerCase().replace(/[\s_]+/g, "-");
  if (failsafe && FAILSAFE_ACT_RESULTS.includes(failsafe) && Object.hasOwn(FAILSAFE_REASONS, failsafe)) act.push(FAILSAFE_REASONS[failsafe]);
  if (fired(input.lowVoltage)) act.push(`Low voltage ${times(input.lowVoltage)}`);
  const missed = input.waypointsMissed;
  if (missed.length > 0) {
    act.push(`${missed.length} waypoint${missed.length === 1 ? "" : "s"} missed: ${missed.join(", ")}`);
  }

  if (fired(input.linkFades)) watch.push(`Link faded ${times(input.linkFades)}`);
  if (fired(input.offRoute)) watch.push(`Off route ${times(input.offRoute)}`);
  if (fired(input.fixLost)) watch.push(`GPS fix lost ${times(input.fixLost)}`);
  if (fired(input.positionJumps)) {
    watch.push(`${input.positionJumps} position jump${input.positionJumps === 1 ? "" : "s"}`);
  }
  if (fired(input.hdopWarnS)) watch.push(`HDOP above the warning level for ${formatSeconds(input.hdopWarnS)}`);

  const level: VerdictLevel = act.length > 0 ? "act" : watch.length > 0 ? "watch" : "clear";
  const notAssessed = input.notAssessed ?? [];
  const firedFor: Record<AssessedPart, boolean> = {
    link: fired(input.linkLost) || fired(input.linkFades),
    failsafe: failsafe !== "pass",
    route: fired(input.offRoute) || missed.length > 0,
    battery: fired(input.lowVoltage),
    gps: fired(input.fixLost) || fired(input.positionJumps) || fired(input.hdopWarnS),
  };
  const held = assessedParts.filter((p) => !firedFor[p] && !notAssessed.some((g) => g.what === p));
  return { level, reasons: [...act, ...watch], held, notAssessed };
}

/** 0.4 s, 12 s, 95 s — one decimal below 10 s. */
function formatSeconds(s: number): string {
  return `${s < 10 ? Math.round(s * 10) / 10 : Math.round(s)} s`;
}
