import {
  commandedWords,
  FAILSAFE_ACT_RESULTS,
  failsafeNotAssessed,
  failsafePlanWords,
  failsafeResultWords,
  flownWords,
  HOME_SOURCE_WORDS,
  LEGACY_FAILSAFE_WHY,
  linkSourceWords,
  MISSION_START_WORDS,
  NOT_ASSESSED_WORDS,
  NOT_AVAILABLE_WORDS,
  NO_CREDIBLE_FIT_WORDS,
  type AssessedPart,
} from "@/lib/analysis/evidence";
import { formatClock, formatDistance, formatLength, formatSpan, formatSpeed, type Units } from "@/lib/format/units";
import type { RunSummary } from "./run-summary";

export type { RunSummary } from "./run-summary";

export interface Figure {
  label: string;
  value: string;
  sub?: string;
  /** Further lines under the figure (where the value came from, what the analysis noted). */
  detail?: string[];
  /** "muted" for a part the log could not show: no value to read as good or bad. */
  tone?: "act" | "watch" | "muted";
}

/** Why a part was not assessed, from the verdict; null when the summary does not say it was not. */
export function notAssessedWhy(summary: RunSummary, part: AssessedPart): string | null {
  return summary.verdict?.notAssessed?.find((g) => g.what === part)?.why ?? null;
}

/**
 * The debrief's headline figures, in the reader's units, each with its unit, where it came from
 * and what it means; a part the log could not show says "Not assessed" and why. A bench run has
 * no track, so it gets no distance, home, route or range figures. Pure, so the page, the PDF and
 * the alert mail word them the same way.
 */
export function summaryFigures(summary: RunSummary, units: Units): Figure[] {
  const bench = summary.bench === true;
  const untimed = summary.timing?.usable === false;
  const figures: Figure[] = [
    untimed
      ? { label: "Duration", value: NOT_AVAILABLE_WORDS, sub: summary.timing?.why ?? undefined, tone: "muted" }
      : { label: "Duration", value: formatSpan(summary.durationS), sub: movingSub(summary) },
  ];
  if (!bench) figures.push(...trackFigures(summary, units));
  figures.push(linkFigure(summary), failsafeFigure(summary));
  if (!bench) figures.push(...routeFigures(summary, units));
  figures.push(...powerFigures(summary));
  if (!bench) {
    const rg = summary.range;
    figures.push(
      rg?.estimatedRangeM != null
        ? { label: "Range estimate", value: formatDistance(rg.estimatedRangeM, units), sub: `path-loss exponent ${rg.pathLossExponent}${rg.label ? `, ${rg.label}` : ""}` }
        : rg?.credible === false
          ? // A fit exists but explains little: quoting a range from it would mislead.
            { label: "Range estimate", value: NO_CREDIBLE_FIT_WORDS, sub: rg.notCredibleWhy ?? undefined, tone: "muted" }
          : // No fit: say so rather than show a blank that could pass for a figure.
            { label: "Range estimate", value: NOT_ASSESSED_WORDS, sub: rg?.reason, tone: "muted" },
    );
  }
  return figures;
}

/** "moving 16 h 00 min" when the moving time differs from the duration (pauses, gaps between segments). */
function movingSub(summary: RunSummary): string | undefined {
  const moving = summary.track?.movingS;
  const d = summary.durationS;
  if (moving == null || d == null || d - moving < 1) return undefined;
  return `moving ${formatSpan(moving)}`;
}

function trackFigures(summary: RunSummary, units: Units): Figure[] {
  const home = summary.home;
  return [
    { label: "Distance travelled", value: formatDistance(summary.distanceM, units), sub: distanceSub(summary, units) },
    {
      label: "Farthest from home",
      value: formatDistance(summary.maxDistanceFromHomeM, units),
      sub: home?.source ? `home: ${HOME_SOURCE_WORDS[home.source] ?? home.source}` : undefined,
    },
  ];
}

function linkFigure(summary: RunSummary): Figure {
  const l = summary.link;
  if (!l?.metric) {
    return {
      label: "Link minimum",
      value: NOT_ASSESSED_WORDS,
      sub: notAssessedWhy(summary, "link") ?? "the log has no link metric",
      tone: "muted",
    };
  }
  const unit = l.unit ? ` ${l.unit}` : "";
  const detail = [linkSourceWords(l.metric, l.source), l.note].filter((x): x is string => !!x);
  return {
    label: "Link minimum",
    value: l.min != null ? `${l.min}${unit}` : "—",
    sub: `${formatSpan(l.timeBelowFadeS ?? 0)} below ${l.fadeThreshold ?? "—"}${unit}`,
    detail,
    tone: l.timeBelowFadeS ? "watch" : undefined,
  };
}

function failsafeFigure(summary: RunSummary): Figure {
  const f = summary.failsafe;
  if (!f) return { label: "Failsafe", value: NOT_ASSESSED_WORDS, sub: notAssessedWhy(summary, "failsafe") ?? undefined, tone: "muted" };
  const plan = failsafePlanWords(f.plan);
  if (failsafeNotAssessed(f.result)) {
    return {
      label: "Failsafe",
      value: failsafeResultWords(f.result),
      sub: f.why ?? LEGACY_FAILSAFE_WHY[f.result] ?? notAssessedWhy(summary, "failsafe") ?? undefined,
      detail: plan ? [`plan: ${plan}`] : undefined,
      tone: "muted",
    };
  }
  const tone = FAILSAFE_ACT_RESULTS.includes(f.result) ? ("act" as const) : undefined;
  // Older summaries have no commanded/flown halves: the first failsafe sign's latency and action.
  if (f.commanded === undefined && f.flown === undefined) {
    const action = f.action ? ` (${f.action.replace(/-/g, " ")})` : "";
    return {
      label: "Failsafe",
      value: failsafeResultWords(f.result),
      sub: f.latencyS != null ? `${f.latencyS.toFixed(1)} s after the loss${action}` : undefined,
      detail: plan ? [`plan: ${plan}`] : undefined,
      tone,
    };
  }
  return {
    label: "Failsafe",
    value: failsafeResultWords(f.result),
    sub: plan ? `plan: ${plan}` : undefined,
    detail: [`commanded: ${commandedWords(f.commanded)}`, `flown: ${flownWords(f.flown)}`],
    tone,
  };
}

function routeFigures(summary: RunSummary, units: Units): Figure[] {
  const r = summary.route;
  if (!r) {
    const why = notAssessedWhy(summary, "route");
    return why ? [{ label: "Route", value: NOT_ASSESSED_WORDS, sub: why, tone: "muted" }] : [];
  }
  const start = r.start ? `measured from the mission start at ${formatClock(r.start.startS)}, ${MISSION_START_WORDS[r.start.source] ?? r.start.source}` : null;
  const total = r.waypointsReached.length + r.waypointsMissed.length + r.waypointsNotReached.length;
  return [
    {
      label: "Cross-track error",
      value: r.xteRmsM != null ? `${formatLength(r.xteRmsM, units)} RMS` : "—",
      sub: r.xteMaxM != null ? `max ${formatLength(r.xteMaxM, units)}` : undefined,
      detail: start ? [start] : undefined,
    },
    {
      label: "Waypoints",
      value: `${r.waypointsReached.length} of ${total} reached`,
      sub: r.waypointsMissed.length ? `missed: ${r.waypointsMissed.join(", ")}` : r.waypointsNotReached.length ? `not reached: ${r.waypointsNotReached.join(", ")}` : undefined,
      tone: r.waypointsMissed.length ? "act" : undefined,
    },
  ];
}

function powerFigures(summary: RunSummary): Figure[] {
  const p = summary.power;
  const why = notAssessedWhy(summary, "battery");
  const cells = p?.cells ? `${p.cells} cells (${p.cellsFrom === "build" ? "from the build" : "guessed from the resting voltage"})${p.sagV != null ? `, sag ${p.sagV.toFixed(2)} V` : ""}` : "cell count unknown";
  const out: Figure[] = [
    why && p?.minCellV == null
      ? { label: "Lowest cell under load", value: NOT_ASSESSED_WORDS, sub: why, tone: "muted" }
      : { label: "Lowest cell under load", value: p?.minCellV != null ? `${p.minCellV.toFixed(2)} V` : "—", sub: why ? `${cells}; ${NOT_ASSESSED_WORDS.toLowerCase()}: ${why}` : cells },
  ];
  // Without a pack in the log there is nothing to add up either.
  if (!(why && p?.capacityUsedMah == null)) out.push({ label: "Capacity used", value: p?.capacityUsedMah != null ? `${p.capacityUsedMah.toLocaleString("en")} mAh` : "—" });
  return out;
}

/** Top speed, and the fixes left out of the distance when there were any. */
function distanceSub(summary: RunSummary, units: Units): string | undefined {
  const parts: string[] = [];
  if (summary.maxSpeedMps != null) parts.push(`top speed ${formatSpeed(summary.maxSpeedMps, units)}`);
  if (summary.timing?.usable === false) parts.push("measured along the points; no speeds without times");
  const stale = summary.track?.staleFixes ?? 0;
  if (stale > 0) parts.push(`${stale} ${stale === 1 ? "fix" : "fixes"} from before a long pause left out`);
  return parts.length ? parts.join(" · ") : undefined;
}
