/**
 * Scenario: a GPX track with no link data (DESIGN.md §10 "Evidence, not absence"). A handheld-
 * style GPX of a rover's loop, one point a second with satellites and HDOP; GPX has no element
 * for RSSI or LQ, and there is no voltage, arming or mode either.
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toTrackGpx } from "../write-logs";
import { rng } from "../random";
import { setGoodFix } from "./fix";
import { driveThrough, endOf, place, positionAt, PRACTICE_FIELD, type Keyframe, type LatLon, type XY } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export interface GpxNoLinkTimeline {
  hz: number;
  driveStartS: number;
  driveEndS: number;
  endS: number;
  start: LatLon;
  /** Farthest corner of the loop from the start, m (local metres). */
  farthestM: number;
  gpsSigmaM: number;
}

const SIGMA = 0.4;
const LOOP: XY[] = [[0, 0], [0, 40], [50, 40], [50, 0], [0, 0]];

export function gpxNoLinkScenario(o: { seed?: number } = {}): PracticeScenario<GpxNoLinkTimeline> {
  const r = rng(o.seed ?? 505);
  const origin = PRACTICE_FIELD;
  const drive = driveThrough(LOOP, 2, 5);
  const driveEndS = endOf(drive);
  const endS = Math.ceil(driveEndS) + 5;
  const keys: Keyframe[] = [{ t: 0, at: LOOP[0] }, ...drive];
  const samples = sampleTimes(1, endS).map((t) => {
    const s = blankSample(t);
    setGoodFix(s, r, origin, positionAt(keys, t), SIGMA);
    s.altM = 6 + r.normal(0.3);
    return s;
  });
  const text = toTrackGpx(
    samples.map((s) => ({ t: s.t, lat: s.lat, lon: s.lon, alt: s.altM, sats: s.sats, hdop: s.hdop, fix: "3d" as const })),
    new Date("2026-11-22T14:05:00Z"),
    "Sandpiper loop, track only",
  );
  const build: BuildConfig = { vehicleType: "ground", cells: 4, failsafe: { action: "return-to-home", expectedWithinS: 2 } };
  return {
    name: "gpx-no-link",
    story: "A GPX track of a 180 m loop: positions, satellites and HDOP only.",
    samples,
    log: { fileName: "gpx-no-link.gpx", format: "gpx", text },
    timeline: { hz: 1, driveStartS: 5, driveEndS, endS, start: place(origin, LOOP[0]), farthestM: Math.hypot(50, 40), gpsSigmaM: SIGMA },
    build,
  };
}
