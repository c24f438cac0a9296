/**
 * One sample of a practice-shaped log (our own simulator, invented data). Every field a log may
 * carry; NaN where the logger would have nothing. Which fields reach the file is decided by the
 * columns a scenario writes (columns.ts), so one simulated run can give several log shapes.
 */
import type { BuildConfig, RoutePlanInput } from "@/lib/analysis/types";
import type { LogFormat } from "@/lib/parsers/types";

/** RC channels carried per sample (1–18, as the parsers read them). */
export const PRACTICE_RC_CHANNELS = 18;

export interface PracticeSample {
  /** Seconds from the first sample. */
  t: number;
  /** Degrees WGS84 as the receiver reports them (noise included); NaN without a position. */
  lat: number;
  lon: number;
  altM: number;
  speedMps: number;
  sats: number;
  hdop: number;
  /** 0 no fix, 2 2-D, 3 3-D. */
  fix: number;
  rssiPct: number;
  lqPct: number;
  voltageV: number;
  currentA: number;
  mode: string;
  armed: boolean;
  /** rc[k] = channel k + 1 in µs; 0 = not sent. */
  rc: number[];
}

export function blankSample(t: number): PracticeSample {
  return {
    t, lat: NaN, lon: NaN, altM: NaN, speedMps: NaN, sats: NaN, hdop: NaN, fix: NaN, rssiPct: NaN, lqPct: NaN,
    voltageV: NaN, currentA: NaN, mode: "", armed: false, rc: new Array<number>(PRACTICE_RC_CHANNELS).fill(0),
  };
}

/**
 * Sample times 0 … endS at `hz`, rounded to the millisecond as a logger writes them.
 * @example sampleTimes(10, 0.3) // => [0, 0.1, 0.2, 0.3]
 */
export function sampleTimes(hz: number, endS: number): number[] {
  const count = Math.round(endS * hz) + 1;
  return Array.from({ length: count }, (_, i) => Math.round((i * 1000) / hz) / 1000);
}

/** A written log: the text a crew would upload. */
export interface PracticeLog {
  fileName: string;
  format: LogFormat;
  text: string;
}

/**
 * A practice scenario: the samples, the log written from them, the ground truth it was built
 * from (`timeline`: times in s from the first sample, true positions), and the build (link sheet
 * and failsafe plan) and route plan a crew would have entered.
 */
export interface PracticeScenario<T> {
  name: string;
  /** One sentence: what the crew did. */
  story: string;
  samples: PracticeSample[];
  log: PracticeLog;
  timeline: T;
  build: BuildConfig;
  plan?: RoutePlanInput;
}
