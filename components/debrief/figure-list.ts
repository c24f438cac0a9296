import { formatDistance, formatLength, formatSpan, formatSpeed, type Units } from "@/lib/format/units";

/** The analysis summary as stored on the run (lib/analysis/analyse-run.ts), read loosely. */
export interface RunSummary {
  durationS?: number | null;
  distanceM?: number | null;
  maxDistanceFromHomeM?: number | null;
  maxSpeedMps?: number | null;
  link?: { metric: string | null; unit: string | null; min: number | null; median: number | null; timeBelowFadeS: number | null; fadeThreshold: number | null };
  failsafe?: { result: string; latencyS: number | null; actionLatencyS: number | null; action: string | null; plan: { action: string; expectedWithinS: number } | null };
  route?: { xteRmsM: number | null; xteMaxM: number | null; waypointsReached: string[]; waypointsMissed: string[]; waypointsNotReached: string[] } | null;
  power?: { cells: number | null; cellsFrom: string | null; minCellV: number | null; sagV: number | null; capacityUsedMah: number | null };
  range?: { estimatedRangeM: number | null; pathLossExponent: number | null; r2?: number | null; label?: string; reason?: string; p0Dbm?: number; thresholdDbm?: number; freeSpaceRangeM?: number | null; farthestM?: number | null };
  gps?: { fixLostS: number | null; hdopWarnS: number | null; maxHdop: number | null };
}

const failsafeWords: Record<string, string> = {
  pass: "Acted as planned",
  late: "Acted late",
  "wrong-action": "Wrong action",
  "not-triggered": "Did not trigger",
  "not-tested": "Not exercised (no link loss)",
  "no-plan": "No plan on the build",
};

const actionWords: Record<string, string> = { "return-to-home": "return to home", land: "land", hold: "hold", stop: "stop", disarm: "disarm" };

export interface Figure {
  label: string;
  value: string;
  sub?: string;
  tone?: "act" | "watch";
}

/**
 * The debrief's headline figures, in the reader's units, each with its unit and what it means.
 * Pure, so the page, the PDF and the alert mail word them the same way.
 */
export function summaryFigures(summary: RunSummary, units: Units): Figure[] {
  const l = summary.link;
  const f = summary.failsafe;
  const r = summary.route;
  const p = summary.power;
  const rg = summary.range;
  const linkUnit = l?.unit ? ` ${l.unit}` : "";
  const figures: Figure[] = [
    { label: "Duration", value: formatSpan(summary.durationS) },
    { label: "Distance travelled", value: formatDistance(summary.distanceM, units), sub: summary.maxSpeedMps != null ? `top speed ${formatSpeed(summary.maxSpeedMps, units)}` : undefined },
    { label: "Farthest from home", value: formatDistance(summary.maxDistanceFromHomeM, units) },
    {
      label: "Link minimum",
      value: l?.min != null ? `${l.min}${linkUnit}` : "—",
      sub: l?.metric ? `${formatSpan(l.timeBelowFadeS ?? 0)} below ${l.fadeThreshold ?? "—"}${linkUnit}` : "no link metric in the log",
      tone: l?.timeBelowFadeS ? "watch" : undefined,
    },
    {
      label: "Failsafe",
      value: f ? (failsafeWords[f.result] ?? f.result) : "—",
      sub: f?.latencyS != null ? `${f.latencyS.toFixed(1)} s after the loss${f.plan ? ` (plan ≤ ${f.plan.expectedWithinS} s)` : ""}${f.action ? `, ${actionWords[f.action] ?? f.action}` : ""}` : undefined,
      tone: f && ["late", "wrong-action", "not-triggered"].includes(f.result) ? "act" : undefined,
    },
  ];
  if (r) {
    figures.push({ label: "Cross-track error", value: r.xteRmsM != null ? `${formatLength(r.xteRmsM, units)} RMS` : "—", sub: r.xteMaxM != null ? `max ${formatLength(r.xteMaxM, units)}` : undefined });
    const total = r.waypointsReached.length + r.waypointsMissed.length + r.waypointsNotReached.length;
    figures.push({
      label: "Waypoints",
      value: `${r.waypointsReached.length} of ${total} reached`,
      sub: r.waypointsMissed.length ? `missed: ${r.waypointsMissed.join(", ")}` : r.waypointsNotReached.length ? `not reached: ${r.waypointsNotReached.join(", ")}` : undefined,
      tone: r.waypointsMissed.length ? "act" : undefined,
    });
  }
  figures.push({
    label: "Lowest cell under load",
    value: p?.minCellV != null ? `${p.minCellV.toFixed(2)} V` : "—",
    sub: p?.cells ? `${p.cells} cells (${p.cellsFrom === "build" ? "from the build" : "guessed from the resting voltage"})${p.sagV != null ? `, sag ${p.sagV.toFixed(2)} V` : ""}` : "cell count unknown",
  });
  figures.push({ label: "Capacity used", value: p?.capacityUsedMah != null ? `${p.capacityUsedMah.toLocaleString("en")} mAh` : "—" });
  figures.push({
    label: "Range estimate",
    value: formatDistance(rg?.estimatedRangeM ?? null, units),
    sub: rg?.estimatedRangeM != null ? `path-loss exponent ${rg.pathLossExponent}${rg.label ? `, ${rg.label}` : ""}` : rg?.reason,
  });
  return figures;
}
