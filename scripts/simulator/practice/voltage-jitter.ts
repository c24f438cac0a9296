/**
 * Scenario: loaded pack voltage with jitter at the low-voltage threshold (DESIGN.md §10 "Noise").
 * A 4S rover logs at 25 Hz (its GPS at 5 Hz); under load the pack falls linearly from 3.60 V/cell through 3.5
 * V/cell (at a known time) to ~3.41 V/cell, with ±40 mV of uniform jitter on the pack voltage.
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toColumnsCsv } from "../write-logs";
import { rng } from "../random";
import { columns } from "./columns";
import { healthyLq, setGoodFix } from "./fix";
import { driveThrough, place, positionAt, PRACTICE_FIELD, type LatLon } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export interface VoltageJitterTimeline {
  hz: number;
  armS: number;
  /** Load on: 3.60 V/cell from here… */
  loadS: number;
  /** …falling linearly from here at `fallVPerCellPerS`… */
  fallStartS: number;
  fallVPerCellPerS: number;
  /** …through `lowCellV` at this time (true, noise-free). */
  crossesLowS: number;
  lowCellV: number;
  endS: number;
  cells: number;
  /** Uniform jitter on the pack voltage: ± this, V. */
  jitterV: number;
  start: LatLon;
}

const HZ = 25;
const GPS_HZ = 5;
const CELLS = 4;
const LOW = 3.5; // V/cell, LiPo common practice (DESIGN.md §5)

export function voltageJitterScenario(o: { seed?: number } = {}): PracticeScenario<VoltageJitterTimeline> {
  const r = rng(o.seed ?? 707);
  const origin = PRACTICE_FIELD;
  const tl = { armS: 3, loadS: 5, fallStartS: 10, fallVPerCellPerS: 0.00625, endS: 40, jitterV: 0.04 };
  const crossesLowS = tl.fallStartS + (3.6 - LOW) / tl.fallVPerCellPerS; // 26 s
  const keys = driveThrough([[0, 0], [52.5, 0]], 1.5, tl.loadS);
  const samples = sampleTimes(HZ, tl.endS).map((t) => {
    const s = blankSample(t);
    // The GPS updates at 5 Hz; the logger leaves its cells empty on the rows in between.
    if (Math.round(t * HZ) % (HZ / GPS_HZ) === 0) setGoodFix(s, r, origin, positionAt(keys, t), 0.3);
    s.lqPct = healthyLq(r);
    s.armed = t >= tl.armS;
    s.mode = "MANUAL";
    const perCell = t < tl.loadS ? 3.95 : t < tl.fallStartS ? 3.6 : 3.6 - tl.fallVPerCellPerS * (t - tl.fallStartS);
    s.voltageV = CELLS * perCell + (2 * r.next() - 1) * tl.jitterV;
    s.currentA = t < tl.loadS ? 0.5 : 15 + r.normal(0.8);
    return s;
  });
  const build: BuildConfig = { vehicleType: "ground", cells: CELLS };
  return {
    name: "voltage-jitter",
    story: "A 4S pack under load falling through 3.5 V/cell at 26 s with ±40 mV jitter, logged at 25 Hz.",
    samples,
    log: { fileName: "voltage-jitter.csv", format: "csv", text: toColumnsCsv(samples, columns(["time", "lat", "lon", "sats", "hdop", "fix", "lq", "voltage", "current", "mode", "armed"])) },
    timeline: { hz: HZ, ...tl, crossesLowS, lowCellV: LOW, cells: CELLS, start: place(origin, [0, 0]) },
    build,
  };
}
