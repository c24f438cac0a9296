/**
 * What the vehicle did after a failsafe, read from its motion when the log has no mode text.
 */
import { quantileSorted } from "simple-statistics";
import type { FailsafeAction, RunSeries } from "./types";

/** Limits of the behaviour heuristics — our own choices, not from a source. */
export const BEHAVIOUR_LIMITS = {
  /** Fewest samples of a field in the window before it is read. */
  minSamples: 3,
  /** Share of steps that must go the expected way for "steadily". */
  steadyShare: 0.7,
  /** Return-to-home: distance from home must fall by at least this (m)… */
  rthMinDropM: 2,
  /** …and by at least this share of where it started. */
  rthMinDropShare: 0.1,
  /** Land: ends within this height of the log's first altitude (m)… */
  landGroundM: 1,
  /** …after falling at least this much (m); a steady fall of 2 × this also counts. */
  landMinDropM: 1,
  /** Hold: median ground speed at or below this (m/s). */
  holdMaxSpeedMps: 0.5,
} as const;

export interface InferredAction {
  action: FailsafeAction | "none";
  /** Which reading decided it, in words (for the event detail). */
  evidence: string;
}

/** Finite values of `a` in [from, to] in order. */
const valuesIn = (a: ArrayLike<number>, from: number, to: number) => {
  const out: number[] = [];
  for (let i = from; i <= to && i < a.length; i++) if (Number.isFinite(a[i])) out.push(a[i]);
  return out;
};

/** Share of consecutive steps that go down. */
const shareDown = (v: number[]) => {
  let down = 0;
  for (let k = 1; k < v.length; k++) if (v[k] < v[k - 1]) down++;
  return v.length > 1 ? down / (v.length - 1) : 0;
};

/**
 * Infers the action from behaviour over samples `from..to` (inclusive), checked in this order:
 * **return-to-home** when the distance from home falls steadily (≥ 70 % of steps down, net fall
 * ≥ max(2 m, 10 % of the start)); **land** when the altitude falls ≥ 1 m and ends within 1 m of
 * the log's first altitude (taken as the ground at home), or falls steadily by ≥ 2 m; **hold**
 * when the median ground speed is ≤ 0.5 m/s; else **none**. Without `distanceFromHome` the
 * return-to-home test is skipped (distances need the geodesy of the track module).
 * Limits: {@link BEHAVIOUR_LIMITS}.
 *
 * Cost: O(n) (finding the first altitude) + O(k log k) for k window samples. Pure.
 *
 * @param series the run (altM in m, speedMps in m/s)
 * @param from first sample of the window
 * @param to last sample of the window (inclusive)
 * @param distanceFromHome optional per-sample distance from home, m
 * @returns the action and the evidence
 * @example
 * inferAction(makeSeries(5, { speedMps: [0, 0, 0.1, 0, 0] }), 0, 4); // => { action: "hold", evidence: "median speed 0 m/s" }
 */
export function inferAction(series: RunSeries, from: number, to: number, distanceFromHome?: ArrayLike<number>): InferredAction {
  const L = BEHAVIOUR_LIMITS;
  if (distanceFromHome) {
    const d = valuesIn(distanceFromHome, from, to);
    const drop = d.length ? d[0] - d[d.length - 1] : 0;
    if (d.length >= L.minSamples && shareDown(d) >= L.steadyShare && drop >= Math.max(L.rthMinDropM, L.rthMinDropShare * d[0]))
      return { action: "return-to-home", evidence: `distance from home fell ${drop.toFixed(1)} m` };
  }
  const alt = valuesIn(series.altM, from, to);
  if (alt.length >= L.minSamples) {
    let ground = NaN;
    for (let i = 0; i < series.altM.length && !Number.isFinite(ground); i++) ground = series.altM[i];
    const drop = alt[0] - alt[alt.length - 1];
    const nearGround = alt[alt.length - 1] - ground <= L.landGroundM;
    if ((drop >= L.landMinDropM && nearGround) || (drop >= 2 * L.landMinDropM && shareDown(alt) >= L.steadyShare))
      return { action: "land", evidence: `altitude fell ${drop.toFixed(1)} m` };
  }
  const speed = valuesIn(series.speedMps, from, to).sort((a, b) => a - b);
  if (speed.length >= L.minSamples) {
    const med = quantileSorted(speed, 0.5);
    if (med <= L.holdMaxSpeedMps) return { action: "hold", evidence: `median speed ${med} m/s` };
  }
  return { action: "none", evidence: "no steady return, descent or stop" };
}
