/**
 * Issue 12, point 8 — "Noise" (DESIGN.md §10: GPS positions scatter 0.5–3 m; loaded pack voltage
 * jitters by tens of mV): thresholds on noisy signals use hysteresis or a short window so a value
 * hovering at a threshold does not fire a stream of events, nor shift an event's start.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { corridorNoiseScenario, voltageJitterScenario } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, csvRows, type AnalysedLog } from "./analyse-log";
import { expectBetween, expectWithin } from "./expect-within";
import { crossTrackM } from "./geodesic";

/**
 * A rover on a straight leg W1 → W2 with white GPS noise σ 0.3 m (seeded) against a 3 m corridor
 * (ground default, DESIGN.md §5): a 3.6 m excursion for 12 s, back on the line, then 30 s running
 * 2.8 m beside it. The contract: enter off-route when |XTE| > corridor for ≥ 2 s, leave only below
 * corridor − 0.5 m (ground exit margin).
 *
 * Why 3.6 m (and not 3.4 m): with σ 0.3 m, 9 % of the fixes at 3.4 m fall back inside 3 m, so the
 * first unbroken 2 s beyond the corridor starts within a second of the excursion with probability
 * ≈ 0.28 only, and not at all within its 12 s with ≈ 0.11. At 3.6 m 2.3 % fall inside: the 2 s
 * entry starts within a second with probability ≈ 0.78, while some fixes still dip inside the
 * corridor (in this seeded run they do, checked in practice-simulator.test.ts), which is what the
 * exit margin is for. At 2.8 m a quarter of the fixes poke past 3 m, but an unbroken 2 s of them
 * has probability ≈ 2·10⁻¹⁰ over the 30 s. (Run-length probabilities of independent samples.)
 *
 * Tolerances (times from the scenario's timeline: the true offset crosses 3 m at 16.67 s going out
 * and 2.5 m at 29.61 s coming back, ramps of 1.8 m/s):
 * - start: 0.5 s before to 1.5 s after the 3 m crossing — noise of 0.3 m on a 1.8 m/s ramp moves a
 *   crossing by 0.17 s per σ (0.5 s ≈ 3 σ), and the 2 s entry waits for the first unbroken stretch
 *   beyond 3 m, which can start after a fix that dipped back inside;
 * - end: ± 0.5 s around the 2.5 m crossing (3 σ of the same ramp noise);
 * - peak: the largest |XTE| of the written fixes inside the event, from GeographicLib (Karney 2013,
 *   J. Geodesy 87:43–55), ± 0.05 m (the analysis' local plane differs by millimetres over 150 m).
 */
describe("scenario: GPS noise at the corridor edge", () => {
  const sc = corridorNoiseScenario();
  const tl = sc.timeline;
  const [w1, w2] = sc.plan!.waypoints;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build, sc.plan);
  });

  it("fires exactly one off-route, spanning the excursion", () => {
    const off = a.of("off-route");
    expect(off.map((e) => `${e.startS}–${e.endS} s`)).toHaveLength(1);
    expectBetween(off[0].startS, tl.excursionCrossesCorridorS - 0.5, tl.excursionCrossesCorridorS + 1.5, "off-route start");
    expectWithin(off[0].endS, tl.excursionCrossesExitS, 0.5, "off-route end");
    expect(off[0].threshold).toBe(tl.corridorM);
    expect(off[0].detail.side).toBe("left");
  });

  it("gives the event's peak as the largest cross-track error of the fixes inside it", () => {
    const off = a.of("off-route");
    expect(off).toHaveLength(1);
    const inside = csvRows(sc.log.text)
      .filter((r) => Number(r.time_s) >= off[0].startS && Number(r.time_s) < off[0].endS)
      .map((r) => Math.abs(crossTrackM(w1, w2, { lat: Number(r.latitude), lon: Number(r.longitude) })));
    expectWithin(off[0].peak, Math.max(...inside), 0.05, "off-route peak");
  });

  it("fires nothing while the rover runs 2.8 m beside the line, inside the corridor", () => {
    const during = a.of("off-route").filter((e) => e.endS > tl.edgeRun.outS && e.startS < tl.edgeRun.backS);
    expect(during).toEqual([]);
  });

  it("counts the incident once in the verdict and reaches both waypoints", () => {
    expect(a.summary.verdict.reasons).toContain("Off route once");
    expect(a.summary.route.waypointsReached).toEqual(["W1", "W2"]);
    expect(a.summary.route.waypointsMissed).toEqual([]);
  });
});

/**
 * A 4S pack under load, logged at 25 Hz, falling linearly at 6.25 mV/cell/s through 3.5 V/cell
 * (LiPo common practice, DESIGN.md §5) at 26.0 s (the timeline's true crossing), with ±40 mV of
 * uniform jitter on the pack. The contract judges the per-cell voltage averaged over a centred 1 s
 * window, then needs 2 s below 3.5 V/cell.
 *
 * Tolerance on the start: ± 0.5 s. The 1 s mean of 25 jittered samples scatters by
 * 40 mV/√3/√25 = 4.6 mV on the pack (1.2 mV per cell), 0.18 s at this fall rate: 0.5 s ≈ 2.7 σ.
 * Unsmoothed, the jitter keeps poking above 3.5 V/cell for up to 1.6 s after the crossing.
 */
describe("scenario: loaded pack voltage with jitter at the low-voltage threshold", () => {
  const sc = voltageJitterScenario();
  const tl = sc.timeline;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("fires exactly one low-voltage event, starting within 0.5 s of the true crossing of 3.5 V/cell", () => {
    const low = a.of("low-voltage");
    expect(low.map((e) => `${e.startS}–${e.endS} s`)).toHaveLength(1);
    expectWithin(low[0].startS, tl.crossesLowS, 0.5, "low-voltage start");
    expect(low[0].threshold).toBe(tl.lowCellV);
    // The lowest per-cell value inside: at most the threshold, at least the lowest true value less the jitter.
    const lowestTrue = 3.6 - tl.fallVPerCellPerS * (tl.endS - tl.fallStartS);
    expectBetween(low[0].peak, lowestTrue - tl.jitterV / tl.cells, tl.lowCellV, "low-voltage peak (V/cell)");
  });

  it("says so once in the verdict", () => {
    expect(a.summary.verdict.reasons).toContain("Low voltage once");
    expect(a.summary.power.cells).toBe(tl.cells);
  });
});
