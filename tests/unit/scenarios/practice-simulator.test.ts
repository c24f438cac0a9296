/**
 * The practice simulator itself: its logs say what their timelines say, the parsers read them, and
 * the demo logs are byte-for-byte what they were (the demo seed depends on them). These checks pass
 * whatever the analysis does, so a scenario test that fails points at the analysis, not at the data.
 * All data is our own, simulated (scripts/simulator/practice).
 */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { RC_CHANNELS } from "@/lib/parsers/types";
import { demoLogs } from "@/scripts/simulator/demo-runs";
import {
  benchFailsafeScenario,
  corridorNoiseScenario,
  fadeIntoLossScenario,
  gpxNoLinkScenario,
  launchPointScenario,
  practiceScenarios,
  rssiChannelScenario,
  voltageJitterScenario,
  walkToLaunchScenario,
} from "@/scripts/simulator/practice-scenarios";
import { csvRows, parsePracticeLog } from "./analyse-log";
import { crossTrackM, geodesicM } from "./geodesic";

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");

describe("practice simulator", () => {
  it("leaves the demo logs unchanged", () => {
    // Pinned when the practice scenarios were added; the demo crew's seeded runs are built from these.
    // (The demo bench test after them comes from its own generator, scripts/simulator/bench-test.ts.)
    expect(demoLogs().slice(0, 3).map((l) => [l.fileName, sha256(l.body)])).toEqual([
      ["mudlark-flats-loop.csv", "bd8d6b2bd53f5c10f4644f98578e108c240aaf3d3b33f4a786ce7026e5c71810"],
      ["sandpiper-flats-loop.gpx", "d4667acc7aaab8b2de26d0b3d96c610f71599e51757e494798b9676b151fae95"],
      ["heron-gps.nmea", "e8a4c9534eb6d18c34617954ae052a7428cf218c45bddf5208b5375852044b24"],
    ]);
  });

  it("is deterministic: the same seed gives the same log", () => {
    const a = practiceScenarios().map((s) => sha256(s.log.text));
    const b = practiceScenarios().map((s) => sha256(s.log.text));
    expect(a).toEqual(b);
    expect(new Set(practiceScenarios().map((s) => s.name)).size).toBe(a.length);
  });

  it.each(practiceScenarios().map((s) => [s.name, s] as const))("%s: the real parser reads every sample", async (_name, s) => {
    const { parsed } = await parsePracticeLog(s.log);
    expect(parsed.format).toBe(s.log.format);
    const written = s.log.format === "gpx" ? (s.log.text.match(/<trkpt /g) ?? []).length : s.log.text.trimEnd().split("\n").length - 1;
    expect(parsed.sampleCount).toBe(written);
    // The indoor bench log reports "no fix" as 0,0, which the parser drops with a warning.
    expect(parsed.warnings.map((w) => w.code)).toEqual(s.name === "bench-failsafe-no-fix" ? ["out-of-range"] : []);
  });

  it("launch point: home is P4, 60 m short of P1 (geodesic), and the rover arrives at P1 30 s after the mission start", () => {
    const { timeline: tl, plan } = launchPointScenario();
    const wp = Object.fromEntries(plan!.waypoints.map((w) => [w.name, w]));
    expect(geodesicM(tl.launch, wp.P1)).toBeCloseTo(60, 2);
    expect(geodesicM(tl.launch, wp.P4)).toBeLessThan(1e-6);
    expect(tl.arriveS.P1 - tl.engageS).toBeCloseTo(60 / tl.speedMps, 9);
    expect(plan!.waypoints.map((w) => w.name)).toEqual(["P1", "P2", "P3", "P4"]);
  });

  it("launch point: the mission channel and the mode column carry the engage time; the movement variant has neither", () => {
    const header = (v: "mode" | "channel" | "movement") => launchPointScenario({ missionSignal: v }).log.text.split("\n")[0].split(",");
    expect(header("mode")).toEqual(expect.arrayContaining(["mode", "ch6"]));
    expect(header("channel")).toContain("ch6");
    expect(header("channel")).not.toContain("mode");
    expect(header("movement")).not.toContain("mode");
    expect(header("movement")).not.toContain("ch6");
    const s = launchPointScenario({ missionSignal: "channel" });
    const rows = csvRows(s.log.text);
    const first = rows.findIndex((r) => Number(r.ch6) >= 1800);
    expect(Number(rows[first].time_s)).toBe(s.timeline.engageS);
  });

  it("walk to the launch point: 70 m from the car (geodesic); cold-start fixes are poor, later ones good", () => {
    const s = walkToLaunchScenario();
    expect(geodesicM(s.timeline.car, s.timeline.launch)).toBeCloseTo(70, 2);
    const cold = s.samples.filter((p) => p.t < s.timeline.coldStartEndS);
    expect(Math.min(...cold.map((p) => p.hdop))).toBeGreaterThanOrEqual(5);
    expect(Math.max(...cold.map((p) => p.hdop))).toBeLessThanOrEqual(20);
    expect(Math.max(...cold.map((p) => p.sats))).toBeLessThanOrEqual(5);
    // Some cold-start fixes have 5 satellites: enough for the "fix lost" rule (< 5), not for home (≥ 6).
    expect(cold.some((p) => p.sats === 5)).toBe(true);
    expect(Math.max(...cold.map((p) => geodesicM(p, s.timeline.car)))).toBeGreaterThan(10);
    const good = s.samples.filter((p) => p.t >= s.timeline.goodFixS);
    expect(good.every((p) => p.sats >= 6 && p.hdop <= 2.5)).toBe(true);
  });

  it("RSSI on channel 12: no link column, channel 12 at 1000 µs exactly during the loss and above it elsewhere", async () => {
    const s = rssiChannelScenario();
    const { series, parsed } = await parsePracticeLog(s.log);
    for (const f of ["rssiPct", "rssiDbm", "lqPct"] as const) expect(parsed.fieldsPresent).not.toContain(f);
    expect(parsed.hasRc).toBe(true);
    const tl = s.timeline;
    let inLoss = 0;
    for (let i = 0; i < series.n; i++) {
      const us = series.rc![i * RC_CHANNELS + tl.rssiChannel - 1];
      const lost = series.tS[i] >= tl.lossStartS - 1e-9 && series.tS[i] < tl.lossEndS - 1e-9;
      if (lost) inLoss++;
      expect(lost ? us === 1000 : us > 1000, `t=${series.tS[i]}`).toBe(true);
      const rth = series.rc![i * RC_CHANNELS + tl.rthChannel - 1];
      expect(rth).toBe(series.tS[i] >= tl.commandS - 1e-9 && series.tS[i] < tl.lossEndS - 1e-9 ? 1900 : 1000);
    }
    expect(inLoss).toBe(Math.round((tl.lossEndS - tl.lossStartS) * tl.hz));
    expect(rssiChannelScenario({ withRssiColumn: true }).log.text.split("\n")[0]).toContain("rssi_pct");
  });

  it("bench test: no position columns (or no fix: 0,0, fix type 0), RSSI channel 14 at 0 % while the transmitter is off, channel 8 at 1900 µs from 0.4 s", async () => {
    const s = benchFailsafeScenario();
    const { series, parsed } = await parsePracticeLog(s.log);
    expect(parsed.fieldsPresent).not.toContain("lat");
    expect(parsed.fieldsPresent).not.toContain("modeIndex");
    const tl = s.timeline;
    const at = (t: number, ch: number) => series.rc![Math.round(t * tl.hz) * RC_CHANNELS + ch - 1];
    expect(at(tl.txOffS - 0.1, tl.rssiChannel)).toBeGreaterThan(1900);
    expect(at(tl.txOffS, tl.rssiChannel)).toBe(1000);
    expect(at(tl.txOnS - 0.1, tl.rssiChannel)).toBe(1000);
    expect(at(tl.txOnS, tl.rssiChannel)).toBeGreaterThan(1900);
    expect(at(tl.commandS - 0.1, tl.rthChannel)).toBe(1000);
    expect(at(tl.commandS, tl.rthChannel)).toBe(s.timeline.failsafeUs);
    expect(at(tl.txOnS, tl.rthChannel)).toBe(1000);
    const withMode = await parsePracticeLog(benchFailsafeScenario({ variant: "rc-rssi-mode" }).log);
    expect(withMode.parsed.modeNames).toEqual(["MANUAL", "RTH"]);
    const column = await parsePracticeLog(benchFailsafeScenario({ variant: "rssi-column" }).log);
    expect(column.parsed.fieldsPresent).toContain("rssiPct");
    expect(column.parsed.fieldsPresent).not.toContain("modeIndex");
    const noFix = await parsePracticeLog(benchFailsafeScenario({ variant: "no-fix" }).log);
    expect(noFix.parsed.fieldsPresent).toEqual(expect.arrayContaining(["sats", "hdop", "fixType"]));
    expect(noFix.parsed.fieldsPresent).not.toContain("lat"); // 0,0 is dropped as "no fix"
    for (let i = 0; i < noFix.series.n; i++) expect(noFix.series.fixType[i]).toBe(0);
  });

  it("GPX track: positions, satellites and HDOP, and nothing about the link, the battery or arming", async () => {
    const { parsed } = await parsePracticeLog(gpxNoLinkScenario().log);
    expect([...parsed.fieldsPresent].sort()).toEqual(["altM", "fixType", "hdop", "lat", "lon", "sats", "tS"]);
  });

  it("corridor edge: the excursion's fixes dip back inside the corridor and the 2.8 m run's fixes poke past it, never for 2 s", () => {
    // Preconditions of the noise test, on the written fixes with GeographicLib: without them the
    // scenario would not exercise the exit margin or the 2 s entry rule.
    const s = corridorNoiseScenario();
    const [w1, w2] = s.plan!.waypoints;
    const tl = s.timeline;
    const rows = csvRows(s.log.text).map((r) => ({ t: Number(r.time_s), x: Math.abs(crossTrackM(w1, w2, { lat: Number(r.latitude), lon: Number(r.longitude) })) }));
    const plateau = rows.filter((r) => r.t >= tl.excursion.levelS && r.t < tl.excursion.inS);
    expect(plateau.filter((r) => r.x <= tl.corridorM).length).toBeGreaterThanOrEqual(2);
    expect(plateau.filter((r) => r.x < tl.corridorM - tl.exitMarginM)).toEqual([]);
    const edge = rows.filter((r) => r.t >= tl.edgeRun.outS && r.t < tl.edgeRun.backS);
    expect(edge.filter((r) => r.x > tl.corridorM).length).toBeGreaterThan(20);
    let run = 0;
    let longest = 0;
    for (const r of edge) longest = Math.max(longest, (run = r.x > tl.corridorM ? run + 1 : 0));
    expect(longest).toBeLessThan(2 * tl.hz);
    // The first unbroken 2 s beyond the corridor starts near the true crossing (see noise.test.ts).
    const outside = rows.map((r) => r.x > tl.corridorM);
    const firstRun = rows.findIndex((r, i) => r.t >= tl.excursion.outS && outside.slice(i, i + 2 * tl.hz + 1).every(Boolean));
    expect(Math.abs(rows[firstRun].t - tl.excursionCrossesCorridorS)).toBeLessThanOrEqual(0.5);
    // …and the first fix back inside corridor − exit margin comes near the true crossing of 2.5 m.
    const exit = rows.find((r) => r.t > tl.excursion.inS && r.x < tl.corridorM - tl.exitMarginM)!;
    expect(Math.abs(exit.t - tl.excursionCrossesExitS)).toBeLessThanOrEqual(0.5);
  });

  it("loaded voltage: the jitter crosses 3.5 V/cell early and late around the true crossing", () => {
    const s = voltageJitterScenario();
    const tl = s.timeline;
    const perCell = s.samples.map((p) => ({ t: p.t, v: p.voltageV / tl.cells }));
    expect(perCell.some((p) => p.t < tl.crossesLowS - 0.5 && p.v < tl.lowCellV)).toBe(true);
    expect(perCell.some((p) => p.t > tl.crossesLowS + 0.5 && p.v >= tl.lowCellV)).toBe(true);
    const falling = s.samples.filter((p) => p.t >= tl.fallStartS);
    const trueV = (t: number) => tl.cells * (3.6 - tl.fallVPerCellPerS * (t - tl.fallStartS));
    expect(Math.max(...falling.map((p) => Math.abs(p.voltageV - trueV(p.t))))).toBeLessThanOrEqual(tl.jitterV);
    expect(trueV(tl.crossesLowS) / tl.cells).toBeCloseTo(tl.lowCellV, 12);
  });

  it("fade into loss: LQ below 70 % from the fade onset, 0 % during the loss, back above 75 % after the recovery", () => {
    const s = fadeIntoLossScenario();
    const tl = s.timeline;
    const lq = (t: number) => s.samples[Math.round(t * tl.hz)].lqPct;
    expect(lq(tl.fadeOnsetS - 0.3)).toBeGreaterThanOrEqual(tl.fadeThresholdPct);
    expect(lq(tl.fadeOnsetS + 0.3)).toBeLessThan(tl.fadeThresholdPct);
    for (let t = tl.lossStartS; t < tl.lossEndS - 1e-9; t += 0.1) expect(lq(t)).toBe(0);
    expect(lq(tl.lossEndS)).toBeGreaterThan(0);
    expect(lq(tl.fadeExitS + 0.3)).toBeGreaterThanOrEqual(tl.exitThresholdPct);
    expect(lq(tl.fadeExitS - 0.3)).toBeLessThan(tl.exitThresholdPct);
  });
});
