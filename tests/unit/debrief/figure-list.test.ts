/**
 * The debrief's headline figures (components/debrief/figure-list.ts), worded with
 * lib/analysis/evidence.ts. The summaries are shaped like the analysis' own output for our demo
 * logs (npm run analyse on scripts/simulator/demo-runs.ts) and like summaries stored before
 * issue 12 (no source, why, commanded, flown, held or notAssessed).
 */
import { describe, expect, it } from "vitest";
import { summaryFigures, type Figure, type RunSummary } from "@/components/debrief/figure-list";

const fig = (figs: Figure[], label: string) => figs.find((f) => f.label === label);
const lines = (f: Figure | undefined) => [f?.value, f?.sub, ...(f?.detail ?? [])].filter(Boolean).join(" | ");

/** A bench failsafe test: RSSI on channel 14, RTH channel 8 at its failsafe value 0.4 s after the loss, no mode column. */
const bench: RunSummary = {
  durationS: 42,
  distanceM: 0,
  maxDistanceFromHomeM: null,
  maxSpeedMps: null,
  bench: true,
  home: null,
  link: { metric: "rssi-pct", unit: "%", source: { kind: "rc-channel", channel: 14 }, note: null, min: 0, median: 96.5, timeBelowFadeS: 10, fadeThreshold: 40, lostCount: 1, fadeCount: 0 },
  failsafe: {
    result: "pass",
    why: null,
    plan: { action: "return-to-home", expectedWithinS: 1 },
    commanded: { by: "rc-channel", channel: 8, atS: 20.4, latencyS: 0.4 },
    flown: { state: "not-logged" },
    latencyS: 0.4,
    actionLatencyS: null,
    action: null,
  },
  route: null,
  power: { cells: 4, cellsFrom: "build", minCellV: 4.097, sagV: 0.08, capacityUsedMah: 8 },
  range: { pathLossExponent: null, estimatedRangeM: null, reason: "Too few linked RSSI samples beyond 10 m: 0, need 20" },
  verdict: {
    level: "act",
    reasons: ["Link lost once"],
    held: ["failsafe", "battery"],
    notAssessed: [
      { what: "route", why: "no route plan is attached to the run" },
      { what: "gps", why: "the log has no usable GPS fix (a bench test, or indoors)" },
    ],
  },
};

/** A GPX track: positions only, home at the first good fix, the route from the first movement. */
const gpx: RunSummary = {
  durationS: 235,
  distanceM: 578.4,
  maxDistanceFromHomeM: 196.7,
  maxSpeedMps: 3.36,
  bench: false,
  home: { lat: 53.47012, lon: -3.05211, tS: 0, source: "first-good-fix", sats: 11, hdop: 1.19 },
  link: { metric: null, unit: null, source: null, note: null, min: null, median: null, timeBelowFadeS: 0, fadeThreshold: null },
  failsafe: { result: "not-assessed", why: "no link loss in this run to exercise it", plan: null, commanded: null, flown: null, latencyS: null, actionLatencyS: null, action: null },
  route: {
    start: { source: "movement", startS: 4, lat: 53.47014, lon: -3.05207 },
    xteRmsM: 0.63,
    xteMaxM: 1.95,
    waypointsReached: ["Slipway", "Dune post"],
    waypointsMissed: [],
    waypointsNotReached: [],
  },
  power: { cells: null, cellsFrom: null, minCellV: null, sagV: null, capacityUsedMah: null },
  range: { pathLossExponent: null, estimatedRangeM: null, reason: "Too few linked RSSI samples beyond 10 m: 0, need 20" },
  verdict: {
    level: "clear",
    reasons: [],
    held: ["route", "gps"],
    notAssessed: [
      { what: "link", why: "the log has no link metric: no RSSI or LQ column, and no build with an RSSI channel on its link sheet" },
      { what: "failsafe", why: "no link loss in this run to exercise it" },
      { what: "battery", why: "the log has no battery voltage" },
    ],
  },
};

describe("summaryFigures", () => {
  it("names the link metric's source and says when the log's column won over the link sheet's channel", () => {
    const figs = summaryFigures(bench, "metric");
    expect(lines(fig(figs, "Link minimum"))).toBe("0 % | 10 s below 40 % | RSSI from channel 14 (link sheet, 1000–2000 µs = 0–100 %)");
    const both: RunSummary = { ...bench, link: { ...bench.link!, source: { kind: "column" }, note: "The log also carries RSSI on channel 14 (link sheet); the RSSI column was used" } };
    const link = fig(summaryFigures(both, "metric"), "Link minimum")!;
    expect(link.detail).toEqual(["RSSI column (%)", "The log also carries RSSI on channel 14 (link sheet); the RSSI column was used"]);
  });

  it("says the link was not assessed, and why, when the log has no link metric — never a bare dash", () => {
    const link = fig(summaryFigures(gpx, "metric"), "Link minimum")!;
    expect(link.value).toBe("Not assessed");
    expect(link.sub).toBe("the log has no link metric: no RSSI or LQ column, and no build with an RSSI channel on its link sheet");
    expect(link.tone).toBe("muted");
    // An older summary has no notAssessed list: the figure still says it.
    const old = fig(summaryFigures({ ...gpx, verdict: { level: "clear", reasons: [] } }, "metric"), "Link minimum")!;
    expect(old.value).toBe("Not assessed");
    expect(old.sub).toBe("the log has no link metric");
  });

  it("gives the failsafe's result with what was commanded and what was flown", () => {
    const f = fig(summaryFigures(bench, "metric"), "Failsafe")!;
    expect(f.value).toBe("Acted as planned");
    expect(f.sub).toBe("plan: return to home within 1 s");
    expect(f.detail).toEqual(["commanded: 0.4 s after the loss (channel 8 at its failsafe value)", "flown: not logged (no mode column, no track)"]);
    expect(f.tone).toBeUndefined();
  });

  it("words a flown action seen in the mode column, and marks a late failsafe to act on", () => {
    const late: RunSummary = {
      ...bench,
      failsafe: {
        ...bench.failsafe!,
        result: "late",
        commanded: { by: "flag", channel: null, atS: 168.9, latencyS: 0.9 },
        flown: { state: "seen", by: "mode", action: "return-to-home", atS: 170.5, latencyS: 2.5, mode: "RTH", evidence: null },
      },
    };
    const f = fig(summaryFigures(late, "metric"), "Failsafe")!;
    expect(f.value).toBe("Acted late");
    expect(f.detail).toEqual(["commanded: 0.9 s after the loss (failsafe flag)", "flown: return to home 2.5 s after the loss (mode RTH)"]);
    expect(f.tone).toBe("act");
  });

  it("says why the failsafe was not assessed", () => {
    const f = fig(summaryFigures(gpx, "metric"), "Failsafe")!;
    expect(f.value).toBe("Not assessed");
    expect(f.sub).toBe("no link loss in this run to exercise it");
  });

  it("reads an older summary's failsafe results and latency", () => {
    const older = (result: string): RunSummary => ({ ...gpx, verdict: { level: "clear", reasons: [] }, failsafe: { result, latencyS: 1.2, actionLatencyS: 1.2, action: "return-to-home", plan: { action: "return-to-home", expectedWithinS: 1.5 } } });
    expect(lines(fig(summaryFigures(older("not-tested"), "metric"), "Failsafe"))).toBe("Not assessed | no link loss in this run to exercise it | plan: return to home within 1.5 s");
    expect(lines(fig(summaryFigures(older("no-plan"), "metric"), "Failsafe"))).toContain("Not assessed | the build has no failsafe plan");
    expect(lines(fig(summaryFigures(older("pass"), "metric"), "Failsafe"))).toBe("Acted as planned | 1.2 s after the loss (return to home) | plan: return to home within 1.5 s");
  });

  it("says which rule placed home and where the mission started", () => {
    const figs = summaryFigures(gpx, "metric");
    expect(fig(figs, "Farthest from home")!.sub).toBe("home: the first good fix (the log shows no arming)");
    expect(fig(figs, "Cross-track error")!.detail).toEqual(["measured from the mission start at 0:04, at the vehicle's first movement from home (no mission mode or channel in the log)"]);
    const armed = summaryFigures({ ...gpx, home: { ...gpx.home!, source: "arming" } }, "metric");
    expect(fig(armed, "Farthest from home")!.sub).toBe("home: where the vehicle was armed (first good fix after arming)");
  });

  it("marks the battery not assessed without a voltage, and leaves out the capacity it could not add up", () => {
    const figs = summaryFigures(gpx, "metric");
    expect(lines(fig(figs, "Lowest cell under load"))).toBe("Not assessed | the log has no battery voltage");
    expect(fig(figs, "Capacity used")).toBeUndefined();
    const noCells: RunSummary = { ...bench, power: { cells: null, cellsFrom: null, minCellV: null, sagV: null, capacityUsedMah: 8 }, verdict: { ...bench.verdict!, notAssessed: [{ what: "battery", why: "the cell count is unknown: set it on the build" }] } };
    const n = summaryFigures(noCells, "metric");
    expect(lines(fig(n, "Lowest cell under load"))).toBe("Not assessed | the cell count is unknown: set it on the build");
    expect(fig(n, "Capacity used")!.value).toBe("8 mAh");
  });

  it("says the route was not assessed, and why, without a plan", () => {
    const noPlan: RunSummary = { ...gpx, route: null, verdict: { ...gpx.verdict!, notAssessed: [...gpx.verdict!.notAssessed!, { what: "route", why: "no route plan is attached to the run" }] } };
    expect(lines(fig(summaryFigures(noPlan, "metric"), "Route"))).toBe("Not assessed | no route plan is attached to the run");
  });

  it("leaves every track figure out of a bench run", () => {
    const labels = summaryFigures(bench, "metric").map((f) => f.label);
    expect(labels).toEqual(["Duration", "Link minimum", "Failsafe", "Lowest cell under load", "Capacity used"]);
  });

  it("says the range was not estimated rather than show a dash", () => {
    const r = fig(summaryFigures(gpx, "metric"), "Range estimate")!;
    expect(r.value).toBe("Not assessed");
    expect(r.sub).toBe("Too few linked RSSI samples beyond 10 m: 0, need 20");
  });

  it("does not change its input", () => {
    const frozen = structuredClone(bench);
    Object.freeze(frozen);
    summaryFigures(frozen, "imperial");
    expect(frozen).toEqual(bench);
  });
});

describe("figures of a log whose times cannot pace it, and of a fit too poor to quote", () => {
  const base: RunSummary = { ...bench, bench: false, home: { lat: 46.43, lon: 13.75, tS: 0, source: "first-good-fix", sats: null, hdop: null } };

  it("says the duration is not available, and why, rather than 0 s", () => {
    const figs = summaryFigures({ ...base, durationS: null, maxSpeedMps: null, distanceM: 2700.9, timing: { usable: false, why: "the log's times cannot pace it" } }, "metric");
    expect(lines(fig(figs, "Duration"))).toBe("Not available | the log's times cannot pace it");
    expect(lines(fig(figs, "Distance travelled"))).toMatch(/^2\.70 km \| measured along the points; no speeds without times$/);
  });

  it("gives the moving time beside a duration with pauses, and counts stale fixes left out", () => {
    const figs = summaryFigures({ ...base, durationS: 105_508, track: { movingS: 57_618, meanSpeedMps: 27.6, jumpBoundMps: 98, jumpBoundFrom: "log-steps", staleFixes: 3 } }, "metric");
    expect(lines(fig(figs, "Duration"))).toBe("29 h 18 min | moving 16 h 00 min");
    expect(lines(fig(figs, "Distance travelled"))).toContain("3 fixes from before a long pause left out");
  });

  it("shows 'No credible fit' with the reason instead of a range", () => {
    const range = { pathLossExponent: 2.52, r2: 0.26, credible: false, notCredibleWhy: "distance explains only 26 % of the signal's variation (R² 0.26, need 0.5)", estimatedRangeM: null };
    expect(lines(fig(summaryFigures({ ...base, range }, "metric"), "Range estimate"))).toBe(`No credible fit | ${range.notCredibleWhy}`);
  });
});
