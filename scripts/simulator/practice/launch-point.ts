/**
 * Scenario: a mission that starts at the launch point, which is not waypoint 1 (DESIGN.md §10
 * "A mission starts from wherever the vehicle is"). The rover is armed at home, the mission is
 * engaged there, it drives ~60 m straight to P1, then P2, P3 and P4 = home.
 */
import type { BuildConfig, RoutePlanInput } from "@/lib/analysis/types";
import { toColumnsCsv } from "../write-logs";
import { rng } from "../random";
import { columns, type ColumnName } from "./columns";
import { healthyLq, packV, setGoodFix } from "./fix";
import { driveThrough, endOf, place, positionAt, PRACTICE_FIELD, speedAt, type LatLon, type XY } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

/** How the log shows the mission starting: mode text, the link sheet's mission channel only, or neither (movement). */
export type MissionSignal = "mode" | "channel" | "movement";

export interface LaunchPointTimeline {
  hz: number;
  armS: number;
  /** Mission engaged (mode AUTO, mission channel to 1900 µs) and the rover starts driving. */
  engageS: number;
  /** True arrival at each waypoint's centre, s. */
  arriveS: Record<string, number>;
  /** Mission done: mode HOLD at home. */
  holdS: number;
  disarmS: number;
  endS: number;
  /** Where it was armed and the mission engaged (= P4). */
  launch: LatLon;
  speedMps: number;
  /** White GPS noise per axis, m. */
  gpsSigmaM: number;
  missionSignal: MissionSignal;
}

const HZ = 10;
const SPEED = 2;
const SIGMA = 0.3;
const MISSION_CH = 6;
const RTH_CH = 8;

/** Local metres of the plan: home (0,0); P1 60 m north; the route turns east and comes back home. */
const POINTS: Record<string, XY> = { P1: [0, 60], P2: [60, 40], P3: [50, -10], P4: [0, 0] };

export function launchPointScenario(o: { seed?: number; missionSignal?: MissionSignal } = {}): PracticeScenario<LaunchPointTimeline> {
  const r = rng(o.seed ?? 101);
  const missionSignal = o.missionSignal ?? "mode";
  const origin = PRACTICE_FIELD;
  const armS = 5;
  const engageS = 10;
  const names = Object.keys(POINTS);
  const keys = driveThrough([[0, 0], ...names.map((k) => POINTS[k])], SPEED, engageS);
  const arriveS = Object.fromEntries(names.map((k, i) => [k, keys[i + 1].t]));
  const holdS = Math.ceil(endOf(keys) * 10) / 10;
  const disarmS = holdS + 3;
  const endS = disarmS + 2;

  const samples = sampleTimes(HZ, endS).map((t) => {
    const s = blankSample(t);
    setGoodFix(s, r, origin, positionAt(keys, t), SIGMA);
    s.speedMps = Math.max(0, Math.round((speedAt(keys, t) + r.normal(0.05)) * 100) / 100);
    s.lqPct = healthyLq(r);
    const moving = t >= engageS && t < holdS;
    s.currentA = moving ? 8 + r.normal(0.5) : 0.5;
    s.voltageV = packV(r, 4, moving ? 3.8 : 3.95);
    s.armed = t >= armS && t < disarmS;
    s.mode = t < engageS ? "MANUAL" : t < holdS ? "AUTO" : "HOLD";
    s.rc[4] = s.armed ? 2000 : 1000; // channel 5: arm switch
    s.rc[MISSION_CH - 1] = t >= engageS && t < holdS ? 1900 : 1000;
    s.rc[RTH_CH - 1] = 1000;
    return s;
  });

  const always: ColumnName[] = ["time", "lat", "lon", "speed", "sats", "hdop", "fix", "lq", "voltage", "current", "armed"];
  const cols =
    missionSignal === "mode" ? columns([...always, "mode"], [5, MISSION_CH, RTH_CH])
    : missionSignal === "channel" ? columns(always, [5, MISSION_CH, RTH_CH])
    : columns(always, [5, RTH_CH]);
  const build: BuildConfig = {
    vehicleType: "ground",
    cells: 4,
    failsafe: { action: "return-to-home", expectedWithinS: 2 },
    channels: [
      { channel: 5, function: "arm", engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: MISSION_CH, function: "mission", engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: RTH_CH, function: "return-to-home", failsafeUs: 1900, engageMinUs: 1800, engageMaxUs: 2100 },
    ],
  };
  const plan: RoutePlanInput = { waypoints: names.map((name) => ({ name, ...place(origin, POINTS[name]) })) };
  return {
    name: `launch-point-${missionSignal}`,
    story: "Armed at home, mission engaged there, driven 60 m to P1 and round the plan back home (P4 = home).",
    samples,
    log: { fileName: `launch-point-${missionSignal}.csv`, format: "csv", text: toColumnsCsv(samples, cols) },
    timeline: { hz: HZ, armS, engageS, arriveS, holdS, disarmS, endS, launch: place(origin, [0, 0]), speedMps: SPEED, gpsSigmaM: SIGMA, missionSignal },
    build,
    plan,
  };
}
