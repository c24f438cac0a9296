/**
 * Scenario: fix before arming and a walk to the launch point (DESIGN.md §10 "Home is where the
 * vehicle was armed"). Powered up at the car: a cold start (HDOP 18 → 5, 4–5 satellites, the
 * position converging from 25 m off), then good fixes; carried 70 m to the launch point, armed
 * there, a short loop driven, back to the launch point, disarmed.
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toColumnsCsv, toTrackGpx } from "../write-logs";
import { rng } from "../random";
import { columns } from "./columns";
import { healthyLq, packV, setGoodFix } from "./fix";
import { driveThrough, endOf, place, positionAt, PRACTICE_FIELD, type Keyframe, type LatLon, type XY } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export interface WalkToLaunchTimeline {
  hz: number;
  /** Cold start until here: HDOP 18 → 5, 4 satellites (5 from `fiveSatsS`), position off by up to 25 m. */
  coldStartEndS: number;
  fiveSatsS: number;
  /** First good fix (≥ 8 satellites, HDOP ≤ 1.2), at the car. */
  goodFixS: number;
  walkStartS: number;
  walkEndS: number;
  armS: number;
  driveStartS: number;
  driveEndS: number;
  disarmS: number;
  endS: number;
  car: LatLon;
  launch: LatLon;
  /** Car → launch point, m (local metres; the geodesic agrees to the millimetre). */
  walkM: number;
  gpsSigmaM: number;
}

const HZ = 10;
const SIGMA = 0.4;
const LAUNCH: XY = [70 * Math.sin(Math.PI / 3), 70 * Math.cos(Math.PI / 3)]; // 70 m at bearing 60°
/** A diamond east of the launch point: its far corner is 40 m from the launch point, ~106 m from the car. */
const LOOP: XY[] = [[0, 0], [20, 20], [40, 0], [20, -20], [0, 0]].map(([e, n]) => [LAUNCH[0] + e, LAUNCH[1] + n]);

export function walkToLaunchScenario(o: { seed?: number; format?: "csv" | "gpx" } = {}): PracticeScenario<WalkToLaunchTimeline> {
  const r = rng(o.seed ?? 202);
  const origin = PRACTICE_FIELD;
  const format = o.format ?? "csv";
  const tl = { coldStartEndS: 15, fiveSatsS: 7, goodFixS: 15, walkStartS: 30, walkEndS: 80, armS: 85, driveStartS: 88 };
  const drive = driveThrough(LOOP, 2, tl.driveStartS);
  const driveEndS = endOf(drive);
  const disarmS = Math.ceil(driveEndS) + 3;
  const endS = disarmS + 2;
  const keys: Keyframe[] = [{ t: 0, at: [0, 0] }, { t: tl.walkStartS, at: [0, 0] }, { t: tl.walkEndS, at: LAUNCH }, ...drive];
  const coldBias = (t: number): XY => {
    const k = 25 * (1 - t / tl.coldStartEndS); // converging on the true position
    return [k * Math.sin((200 * Math.PI) / 180), k * Math.cos((200 * Math.PI) / 180)];
  };

  const samples = sampleTimes(HZ, endS).map((t) => {
    const s = blankSample(t);
    const at = positionAt(keys, t);
    if (t < tl.coldStartEndS) {
      const b = coldBias(t);
      const p = place(origin, [at[0] + b[0] + r.normal(SIGMA), at[1] + b[1] + r.normal(SIGMA)]);
      s.lat = p.lat;
      s.lon = p.lon;
      s.sats = t < tl.fiveSatsS ? 4 : 5;
      s.hdop = Math.round((18 - (13 * t) / tl.coldStartEndS) * 100) / 100;
      s.fix = t < tl.fiveSatsS ? 2 : 3;
    } else setGoodFix(s, r, origin, at, SIGMA);
    s.lqPct = healthyLq(r);
    const driving = t >= tl.driveStartS && t < driveEndS;
    s.currentA = driving ? 7 + r.normal(0.5) : 0.4;
    s.voltageV = packV(r, 4, driving ? 3.82 : 3.95);
    s.armed = t >= tl.armS && t < disarmS;
    s.mode = "MANUAL";
    s.rc[4] = s.armed ? 2000 : 1000;
    return s;
  });

  const csvCols = columns(["time", "lat", "lon", "sats", "hdop", "fix", "lq", "voltage", "current", "mode", "armed"], [5]);
  const text =
    format === "csv" ? toColumnsCsv(samples, csvCols)
    : toTrackGpx(
        // A handheld-style GPX: one point a second, no arming, no link data.
        samples.filter((s) => Number.isInteger(s.t)).map((s) => ({ t: s.t, lat: s.lat, lon: s.lon, sats: s.sats, hdop: s.hdop, fix: s.fix === 2 ? ("2d" as const) : ("3d" as const) })),
        new Date("2026-11-21T09:30:00Z"),
        "Mudlark walk to the launch point",
      );
  const build: BuildConfig = { vehicleType: "ground", cells: 4, channels: [{ channel: 5, function: "arm", engageMinUs: 1800, engageMaxUs: 2100 }] };
  return {
    name: `walk-to-launch-${format}`,
    story: "Cold start at the car, good fixes, carried 70 m to the launch point, armed there, a 40 m loop, disarmed.",
    samples,
    log: { fileName: `walk-to-launch.${format}`, format, text },
    timeline: {
      hz: format === "csv" ? HZ : 1, ...tl, driveEndS, disarmS, endS, car: place(origin, [0, 0]), launch: place(origin, LAUNCH),
      walkM: Math.hypot(LAUNCH[0], LAUNCH[1]), gpsSigmaM: SIGMA,
    },
    build,
  };
}
