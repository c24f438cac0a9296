/**
 * Battery (DESIGN.md §5 "Power"): cell count, sag under load, capacity used, low-voltage events.
 */
import { quantileSorted } from "simple-statistics";
import { spanEvent } from "./span-event";
import { findSpans } from "./spans";
import type { AnalysisEvent, BuildConfig, RunSeries, Thresholds } from "./types";

/** LiPo per-cell voltage range (V) and nominal voltage: common practice, not from a source. */
export const LIPO_CELL_V = { min: 3.3, max: 4.35, nominal: 3.8 } as const;
/** Largest pack guessed (cells). */
export const MAX_CELLS = 14;
/** Current above which the pack is under load (A). */
export const LOAD_CURRENT_A = 1;
/** How much of the first resting stretch gives the resting voltage (s). */
export const REST_WINDOW_S = 2;

export interface PowerAnalysis {
  cells: number | null;
  cellsFrom: "build" | "guessed" | null;
  /** Median pack voltage over the first resting stretch, V. */
  restingV: number | null;
  restingPerCellV: number | null;
  /** Lowest pack voltage under load, V (current > 1 A; without current: while armed, or all). */
  minUnderLoadV: number | null;
  minUnderLoadPerCellV: number | null;
  /** Resting − minimum under load, V and V per cell. */
  sagV: number | null;
  sagPerCellV: number | null;
  /** Capacity used, mAh: the last logged value, else integrated current. */
  usedMah: number | null;
  usedMahFrom: "logged" | "integrated" | null;
  /** `low-voltage` events in time order. */
  events: AnalysisEvent[];
}

const hasAny = (a: ArrayLike<number>) => {
  for (let i = 0; i < a.length; i++) if (Number.isFinite(a[i])) return true;
  return false;
};

/**
 * Guesses a LiPo pack's cell count from a resting voltage: the smallest n whose full charge
 * (4.35 V per cell, the high-voltage LiPo maximum, so LiHV packs read right too) reaches the
 * voltage, n = ⌈V / 4.35⌉ — the usual flight-controller rule (common practice) — accepted only when V/n
 * lies in 3.3–4.35 V ({@link LIPO_CELL_V}). A full 6S pack (25.2 V) reads as 6S; a pack far below
 * 3.3 V per cell gives null. Set the build's cell count when in doubt.
 *
 * Cost: O(1). Pure.
 *
 * @param restingV resting pack voltage, V
 * @returns cells, or null when no count fits (or the voltage is not a positive number)
 * @example
 * guessCells(16.8); // => 4
 * guessCells(25.2); // => 6
 */
export function guessCells(restingV: number): number | null {
  if (!(restingV > 0)) return null;
  const n = Math.ceil(restingV / LIPO_CELL_V.max);
  const v = restingV / n;
  return n <= MAX_CELLS && v >= LIPO_CELL_V.min && v <= LIPO_CELL_V.max ? n : null;
}

/**
 * Capacity drawn, mAh, by the trapezoidal rule over consecutive samples that both carry a current
 * (missing samples are bridged: the pack kept discharging); mAh = A·s / 3.6.
 *
 * Cost: O(n). Pure.
 *
 * @param tS sample times, s
 * @param currentA battery current, A (NaN = missing)
 * @returns mAh, or null with fewer than two current samples
 * @example
 * integrateMah([0, 360], [10, 10]); // => 1000
 */
export function integrateMah(tS: ArrayLike<number>, currentA: ArrayLike<number>): number | null {
  let sum = 0;
  let prev = -1;
  let pairs = 0;
  for (let i = 0; i < currentA.length; i++) {
    if (!Number.isFinite(currentA[i]) || !Number.isFinite(tS[i])) continue;
    if (prev >= 0 && tS[i] > tS[prev]) {
      sum += ((currentA[prev] + currentA[i]) / 2) * (tS[i] - tS[prev]);
      pairs++;
    }
    prev = i;
  }
  return pairs ? sum / 3.6 : null;
}

/** Slack for clock values like 0.1·i that are not exact in binary (s). */
const WINDOW_EPS_S = 1e-9;

const medianOf = (v: number[]) => (v.length ? quantileSorted(v.sort((a, b) => a - b), 0.5) : null);

/**
 * Mean of the finite values of `v` whose times lie in [t − windowS/2, t + windowS/2) around each
 * sample's time t (a centred moving average; the log is read after the run, so no lag is needed).
 * NaN where the sample has no value; `windowS` ≤ 0 returns the values as they are. Times must not
 * decrease.
 *
 * Cost: O(n) (two pointers). Pure.
 *
 * @example centredMean([0, 0.5, 1, 1.5], [4, 2, 4, 2], 1); // => [4, 3, 3, 3]
 */
export function centredMean(tS: ArrayLike<number>, v: ArrayLike<number>, windowS: number): Float64Array {
  const n = v.length;
  const out = new Float64Array(n).fill(NaN);
  const half = windowS / 2;
  let lo = 0;
  let hi = 0; // window holds finite samples in [lo, hi)
  let sum = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(v[i]) || !Number.isFinite(tS[i])) continue;
    if (!(windowS > 0)) {
      out[i] = v[i];
      continue;
    }
    // Half-open [t − w/2, t + w/2): a window of w s holds w × rate samples, so alternating jitter cancels.
    for (; hi < n && !(tS[hi] >= tS[i] + half - WINDOW_EPS_S); hi++) if (Number.isFinite(v[hi]) && Number.isFinite(tS[hi])) (sum += v[hi]), count++;
    for (; lo < hi && !(tS[lo] >= tS[i] - half - WINDOW_EPS_S); lo++) if (Number.isFinite(v[lo]) && Number.isFinite(tS[lo])) (sum -= v[lo]), count--;
    out[i] = sum / count;
  }
  return out;
}

/**
 * Judges the battery of one run. Cells: `build.cells`, else {@link guessCells} of the resting
 * voltage — the median over the first {@link REST_WINDOW_S} s of resting samples (current < 1 A
 * where logged, else disarmed where logged, else any), or of the first 2 s when none rest.
 * Per-cell minimum under load and sag (resting − minimum under load). Capacity: the last logged
 * `usedMah`, else {@link integrateMah}. A **low-voltage** event: the pack voltage per cell,
 * averaged over a centred `th.lowVoltageWindowS` window ({@link centredMean}), below `th.lowCellV`
 * for ≥ `th.lowVoltageMinS` (missing samples do not end it; a reception gap does), peak = the
 * lowest averaged V/cell (the lowest single sample is in `detail.lowestSampleV`); only when the
 * cell count is known.
 *
 * Cost: O(n log n). Pure: inputs are only read.
 *
 * @param series the run (voltageV V, currentA A, usedMah mAh, tS s)
 * @param th thresholds (lowCellV V/cell, lowVoltageMinS s)
 * @param build optional build (cells)
 * @param distanceFromHome optional per-sample distance from home, m (track module)
 * @returns the power summary and its events
 * @example
 * // 3S pack resting at 12.6 V, 11.1 V at 20 A
 * analysePower(series, defaultThresholds("multirotor")).sagPerCellV; // => ≈ 0.5
 */
export function analysePower(series: RunSeries, th: Thresholds, build?: BuildConfig, distanceFromHome?: ArrayLike<number>): PowerAnalysis {
  const { tS, n, voltageV: v, currentA: c, armed } = series;
  const withCurrent = hasAny(c);
  const withArmed = hasAny(armed);
  const ok = (i: number) => Number.isFinite(v[i]) && Number.isFinite(tS[i]);
  const resting = (i: number) => ok(i) && (withCurrent ? c[i] < LOAD_CURRENT_A : withArmed ? armed[i] === 0 : true);
  const loaded = (i: number) => ok(i) && (withCurrent ? c[i] > LOAD_CURRENT_A : withArmed ? armed[i] === 1 : true);

  const window = (pick: (i: number) => boolean) => {
    const out: number[] = [];
    let t0 = NaN;
    for (let i = 0; i < n; i++) {
      if (!pick(i)) continue;
      if (Number.isNaN(t0)) t0 = tS[i];
      if (tS[i] > t0 + REST_WINDOW_S) break;
      out.push(v[i]);
    }
    return out;
  };
  const restSamples = window(resting);
  const restingV = medianOf(restSamples.length ? restSamples : window(ok));

  const cellsFrom = build?.cells ? "build" : restingV !== null && guessCells(restingV) !== null ? "guessed" : null;
  const cells = build?.cells ? build.cells : restingV !== null ? guessCells(restingV) : null;
  const perCell = (x: number | null) => (x !== null && cells ? x / cells : null);

  let minLoad = Infinity;
  for (let i = 0; i < n; i++) if (loaded(i) && v[i] < minLoad) minLoad = v[i];
  const minUnderLoadV = minLoad === Infinity ? null : minLoad;
  const sagV = restingV !== null && minUnderLoadV !== null ? restingV - minUnderLoadV : null;

  let lastUsed = NaN;
  for (let i = 0; i < n; i++) if (Number.isFinite(series.usedMah[i])) lastUsed = series.usedMah[i];
  const integrated = Number.isFinite(lastUsed) ? null : integrateMah(tS, c);

  const events: AnalysisEvent[] = [];
  if (cells) {
    // Loaded voltage jitters by tens of mV (DESIGN.md §10): judge its short mean, not single samples.
    const smooth = centredMean(tS, v, th.lowVoltageWindowS);
    const low = findSpans(tS, (i) => smooth[i] / cells < th.lowCellV, {
      minDurationS: th.lowVoltageMinS,
      exit: (i) => smooth[i] / cells >= th.lowCellV,
      breakBefore: (i) => series.segmentStart[i] === 1,
    });
    for (const span of low) {
      let peak = Infinity;
      let rawMin = Infinity;
      for (let i = span.startIndex; i <= span.endIndex; i++) {
        if (smooth[i] / cells < peak) peak = smooth[i] / cells;
        if (v[i] / cells < rawMin) rawMin = v[i] / cells;
      }
      events.push(spanEvent("low-voltage", span, series, {
        peak, threshold: th.lowCellV, distanceFromHome,
        detail: { unit: "V/cell", cells, cellsFrom, minPackV: peak * cells, windowS: th.lowVoltageWindowS, lowestSampleV: rawMin * cells },
      }));
    }
  }

  return {
    cells,
    cellsFrom,
    restingV,
    restingPerCellV: perCell(restingV),
    minUnderLoadV,
    minUnderLoadPerCellV: perCell(minUnderLoadV),
    sagV,
    sagPerCellV: perCell(sagV),
    usedMah: Number.isFinite(lastUsed) ? lastUsed : integrated,
    usedMahFrom: Number.isFinite(lastUsed) ? "logged" : integrated !== null ? "integrated" : null,
    events,
  };
}
