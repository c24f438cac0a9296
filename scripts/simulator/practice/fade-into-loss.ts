/**
 * Scenario: one incident, one event (DESIGN.md §10). The rover drives out; LQ slides from ~98 %
 * to ~45 % (below the 70 % fade threshold), stays there, then the link is lost (LQ 0) for 4 s;
 * the controller switches to RTH 0.5 s into the loss; the link comes back at 50 % and climbs to
 * ~98 % over 2 s. Option `separateFade`: an earlier, unrelated fade (LQ ~55 % for 3 s) that
 * recovers fully before the loss.
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toColumnsCsv } from "../write-logs";
import { rng } from "../random";
import { columns } from "./columns";
import { healthyLq, packV, setGoodFix } from "./fix";
import { driveThrough, endOf, place, positionAt, PRACTICE_FIELD, speedAt, type Keyframe, type LatLon, type XY } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export interface FadeIntoLossTimeline {
  hz: number;
  armS: number;
  driveStartS: number;
  /** LQ ramps from `highLq` at fadeRampS to `fadeLq` at fadeLowS, holds until lossStartS. */
  fadeRampS: number;
  fadeLowS: number;
  highLq: number;
  fadeLq: number;
  /** LQ 0 from lossStartS until lossEndS (the first sample with the link back). */
  lossStartS: number;
  lossEndS: number;
  /** LQ ramps from `recoverLq` at lossEndS to `highLq` at recoveredS. */
  recoverLq: number;
  recoveredS: number;
  /** True times LQ crosses the fade threshold going down, and threshold + hysteresis coming back. */
  fadeOnsetS: number;
  fadeExitS: number;
  fadeThresholdPct: number;
  exitThresholdPct: number;
  rthModeS: number;
  /** The unrelated earlier fade, when asked for: LQ `separateFadeLq` from startS until endS. */
  separateFade: { startS: number; endS: number; lq: number } | null;
  homeS: number;
  disarmS: number;
  endS: number;
  home: LatLon;
}

const HZ = 10;
const OUT: XY = [0, 90]; // due north
const LQ_FADE = 70; // DESIGN.md §5 default
const LQ_EXIT = 75; // + 5 points hysteresis

export function fadeIntoLossScenario(o: { seed?: number; separateFade?: boolean } = {}): PracticeScenario<FadeIntoLossTimeline> {
  const r = rng(o.seed ?? 808);
  const origin = PRACTICE_FIELD;
  const tl = { armS: 5, driveStartS: 10, fadeRampS: 30, fadeLowS: 33, highLq: 98, fadeLq: 45, lossStartS: 36, lossEndS: 40, recoverLq: 50, recoveredS: 42, rthModeS: 36.5 };
  const separateFade = o.separateFade ? { startS: 20, endS: 23, lq: 55 } : null;
  const out = driveThrough([[0, 0], OUT], 2, tl.driveStartS);
  const turn = positionAt(out, tl.rthModeS);
  const back = driveThrough([turn, [0, 0]], 2, tl.rthModeS);
  const keys: Keyframe[] = [{ t: 0, at: [0, 0] }, { t: tl.driveStartS, at: [0, 0] }, { t: tl.rthModeS, at: turn }, ...back.slice(1)];
  const homeS = endOf(back);
  const disarmS = Math.ceil(homeS) + 3;
  const endS = disarmS + 2;
  const lerp = (t: number, t0: number, v0: number, t1: number, v1: number) => v0 + ((v1 - v0) * (t - t0)) / (t1 - t0);

  const samples = sampleTimes(HZ, endS).map((t) => {
    const s = blankSample(t);
    setGoodFix(s, r, origin, positionAt(keys, t), 0.3);
    const noise = r.normal(1);
    const lq =
      separateFade && t >= separateFade.startS && t < separateFade.endS ? separateFade.lq + noise
      : t < tl.fadeRampS || t >= tl.recoveredS ? healthyLq(r)
      : t < tl.fadeLowS ? lerp(t, tl.fadeRampS, tl.highLq, tl.fadeLowS, tl.fadeLq) + noise
      : t < tl.lossStartS ? tl.fadeLq + noise
      : t < tl.lossEndS ? 0
      : lerp(t, tl.lossEndS, tl.recoverLq, tl.recoveredS, tl.highLq) + noise;
    s.lqPct = Math.max(0, Math.min(100, Math.round(lq)));
    s.armed = t >= tl.armS && t < disarmS;
    s.rc[4] = s.armed ? 2000 : 1000;
    s.rc[7] = t >= tl.lossStartS + 0.3 && t < tl.lossEndS ? 1900 : 1000; // channel 8 to its failsafe value 0.3 s into the loss
    s.mode = t >= tl.rthModeS && t < homeS ? "RTH" : t >= homeS ? "HOLD" : "MANUAL";
    const moving = speedAt(keys, t) > 0;
    s.currentA = moving ? 8 + r.normal(0.5) : 0.5;
    s.voltageV = packV(r, 4, moving ? 3.8 : 3.95);
    return s;
  });
  const build: BuildConfig = {
    vehicleType: "ground",
    cells: 4,
    failsafe: { action: "return-to-home", expectedWithinS: 2 },
    channels: [
      { channel: 5, function: "arm", engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: 8, function: "return-to-home", failsafeUs: 1900, engageMinUs: 1800, engageMaxUs: 2100 },
    ],
  };
  const name = o.separateFade ? "fade-into-loss-and-separate-fade" : "fade-into-loss";
  return {
    name,
    story: "LQ fades below 70 % and runs into a 4 s loss; RTH; the link recovers over 2 s.",
    samples,
    log: { fileName: `${name}.csv`, format: "csv", text: toColumnsCsv(samples, columns(["time", "lat", "lon", "sats", "hdop", "fix", "lq", "voltage", "current", "mode", "armed"], [5, 8])) },
    timeline: {
      hz: HZ, ...tl, separateFade, homeS, disarmS, endS, home: place(origin, [0, 0]),
      fadeOnsetS: lerp(LQ_FADE, tl.highLq, tl.fadeRampS, tl.fadeLq, tl.fadeLowS),
      fadeExitS: lerp(LQ_EXIT, tl.recoverLq, tl.lossEndS, tl.highLq, tl.recoveredS),
      fadeThresholdPct: LQ_FADE,
      exitThresholdPct: LQ_EXIT,
    },
    build,
  };
}
