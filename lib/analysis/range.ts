import { freeSpaceLossDb } from "./free-space-loss";
import { linearFit } from "./linear-fit";

/** Fewer usable samples than this and the fit says more about noise than about the link. */
export const RANGE_MIN_SAMPLES = 20;
/** Farthest / nearest usable distance must reach this: a slope in log10(d) needs a spread of d. */
export const RANGE_MIN_DISTANCE_RATIO = 2;
/**
 * Below this R² the distance explains too little of the signal for its line to be quoted as a
 * range (our choice: half the variance; a one-run hobby log over open ground fits ≈ 0.6–0.9).
 */
export const RANGE_MIN_R2 = 0.5;
/**
 * Path-loss exponents a real link shows: Rappaport, Wireless Communications, 2nd ed., Table 4.2
 * lists 1.6 (in-building line of sight) to 6 (obstructed in building); outside this a fitted n
 * says the data are not log-distance (from memory of the table).
 */
export const PLAUSIBLE_EXPONENT = { min: 1.5, max: 6 } as const;
/** Shown with every estimate (DESIGN.md §5). */
export const RANGE_LABEL = "estimate from one run, not a promise" as const;

/** Options of estimateRange. */
export interface RangeOptions {
  /** Samples at or inside this distance from home are left out (m). Default 10. */
  minDistanceM?: number;
  /** Receiver sensitivity (dBm). */
  sensitivityDbm: number;
  /** Margin kept above sensitivity, as for a dBm link fade (dB). */
  fadeMarginDb: number;
  /** Carrier frequency (MHz); when given, a free-space reference is reported beside the fit. */
  bandMhz?: number;
  /** 1 where the link was up; any other value (0, NaN) drops the sample. Absent = all up. */
  linked?: ArrayLike<number>;
}

/** A log-distance fit of one run's RSSI; distances in m, powers in dBm, margins in dB. */
export interface RangeEstimate {
  /** n in RSSI = P0 − 10·n·log10(d); 2 in free space, typically 2–4 near the ground. */
  pathLossExponent: number;
  /** Fitted RSSI at d = 1 m (dBm): a fit parameter, not a measured power (see estimateRange). */
  p0Dbm: number;
  /** R² of RSSI against log10(d) (dimensionless). */
  r2: number;
  samples: number;
  /** Nearest and farthest usable sample from home (m). */
  nearestM: number;
  farthestM: number;
  /** sensitivityDbm + fadeMarginDb (dBm): where the fit "runs out". */
  thresholdDbm: number;
  /** Fit at farthestM minus thresholdDbm (dB); negative = the fit says the run went past it. */
  marginAtFarthestDb: number;
  /** Distance at which the fit meets thresholdDbm (m); null when n ≤ 0 or the fit is not finite. */
  estimatedRangeM: number | null;
  /** Free-space (n = 2) reference through the same P0; null without bandMhz. */
  freeSpace: { lossAtFarthestDb: number; rangeM: number } | null;
  /** False when R² is under RANGE_MIN_R2 or n is outside PLAUSIBLE_EXPONENT: the line is shown, no range is quoted. */
  credible: boolean;
  /** Why the fit is not credible; null when it is. */
  notCredibleWhy: string | null;
  label: typeof RANGE_LABEL;
}

/** Why a fit with this R² and exponent should not be quoted as a range; null when it may be. */
export function fitDoubt(r2: number, n: number): string | null {
  if (!(r2 >= RANGE_MIN_R2))
    return `distance explains only ${Math.round(Math.max(0, r2) * 100)} % of the signal's variation (R² ${r2.toFixed(2)}, need ${RANGE_MIN_R2}): the signal here is set by something other than distance`;
  if (!(n >= PLAUSIBLE_EXPONENT.min && n <= PLAUSIBLE_EXPONENT.max))
    return `the fitted path-loss exponent ${n.toFixed(2)} is outside the ${PLAUSIBLE_EXPONENT.min}–${PLAUSIBLE_EXPONENT.max} real links show`;
  return null;
}

/** Either an estimate, or null with the reason it was refused. */
export type RangeEstimateResult = { estimate: RangeEstimate; reason: null } | { estimate: null; reason: string };

/**
 * Link range estimate from one run: fits the log-distance path-loss model
 * RSSI(d) = P0 − 10·n·log10(d / 1 m) (Rappaport, Wireless Communications, 2nd ed., §4.9.1) by
 * ordinary least squares of RSSI dBm on log10(d) over samples with the link up, RSSI present and
 * d > minDistanceM (DESIGN.md §5). Slope = −10·n, intercept = P0.
 *
 * P0 is FREE — fitted, at d = 1 m — not a measured power at a reference distance d0 as in
 * Rappaport's Example 4.9 (see pathLossExponentFixedReference). A hobby log has no trustworthy
 * reference reading: next to home the receiver saturates, the vehicle sits on the ground beside
 * the pilot's body, and transmit power, antenna gains and the RSSI calibration are unknown. Fixing
 * P0 to a guess would push all of that error into n; fitting it lets the run set both. The price:
 * P0 is an extrapolation (1 m is usually outside the data) and it trades off against n.
 *
 * estimatedRangeM = 10^((P0 − threshold) / (10·n)), threshold = sensitivity + fade margin; it is
 * an extrapolation past the farthest point when the margin there is positive.
 *
 * Free-space reference (bandMhz given): lossAtFarthestDb is ITU-R P.525 loss at farthestM. Its
 * line uses the same convention — through the fitted P0 at 1 m, then falling by
 * L_fs(f, d) − L_fs(f, 1 m) = 20·log10(d) — so rangeM = 10^((P0 − threshold) / 20) and the band
 * cancels out of it. It shows what the same P0 would reach at n = 2, not a second estimate.
 *
 * A fit is returned but marked not credible (see fitDoubt) when R² < RANGE_MIN_R2 or n is outside
 * PLAUSIBLE_EXPONENT: the debrief then shows the data and the line and quotes no range.
 * Refuses (estimate null, reason set) below RANGE_MIN_SAMPLES usable samples or a distance spread
 * under RANGE_MIN_DISTANCE_RATIO.
 *
 * Cost: O(n) time and memory.
 *
 * @param rssiDbm received signal strength per sample (dBm); NaN = missing
 * @param distanceFromHomeM distance from home per sample (m); NaN = missing
 * @param opts threshold, band and link-up mask; see RangeOptions
 * @returns `{ estimate, reason: null }`, or `{ estimate: null, reason }` when it refuses
 * @throws {Error} when the arrays (or `linked`) differ in length
 * @throws {Error} when sensitivityDbm or fadeMarginDb is not finite
 * @example
 * // d = 20…400 m, RSSI = −40 − 30·log10(d) exactly (n = 3, P0 = −40 dBm)
 * estimateRange(rssi, d, { sensitivityDbm: -105, fadeMarginDb: 10 }).estimate;
 * // => { pathLossExponent: 3, p0Dbm: -40, estimatedRangeM: 10^(55/30) ≈ 68.1 … } (m)
 */
export function estimateRange(
  rssiDbm: ArrayLike<number>,
  distanceFromHomeM: ArrayLike<number>,
  opts: RangeOptions,
): RangeEstimateResult {
  const { minDistanceM = 10, sensitivityDbm, fadeMarginDb, bandMhz, linked } = opts;
  const len = rssiDbm.length;
  if (distanceFromHomeM.length !== len) throw new Error("estimateRange requires rssiDbm and distanceFromHomeM of equal length");
  if (linked && linked.length !== len) throw new Error("estimateRange requires linked of the same length as rssiDbm");
  if (!Number.isFinite(sensitivityDbm) || !Number.isFinite(fadeMarginDb)) {
    throw new Error("estimateRange requires finite sensitivityDbm and fadeMarginDb");
  }

  const logAll = new Float64Array(len);
  const rssiAll = new Float64Array(len);
  let used = 0;
  let nearestM = Infinity;
  let farthestM = -Infinity;
  for (let i = 0; i < len; i++) {
    const d = distanceFromHomeM[i];
    const p = rssiDbm[i];
    if (!Number.isFinite(p) || !Number.isFinite(d) || !(d > minDistanceM) || !(d > 0)) continue;
    if (linked && linked[i] !== 1) continue;
    logAll[used] = Math.log10(d);
    rssiAll[used++] = p;
    if (d < nearestM) nearestM = d;
    if (d > farthestM) farthestM = d;
  }
  const logD = logAll.subarray(0, used);
  const rssi = rssiAll.subarray(0, used);
  if (rssi.length < RANGE_MIN_SAMPLES) {
    return { estimate: null, reason: `Too few linked RSSI samples beyond ${minDistanceM} m: ${rssi.length}, need ${RANGE_MIN_SAMPLES}` };
  }
  if (farthestM / nearestM < RANGE_MIN_DISTANCE_RATIO) {
    return {
      estimate: null,
      reason: `Distances span only ${nearestM.toFixed(0)}–${farthestM.toFixed(0)} m; need the farthest at least ${RANGE_MIN_DISTANCE_RATIO}× the nearest`,
    };
  }

  const fit = linearFit(logD, rssi);
  const n = -fit.slope / 10;
  const p0Dbm = fit.intercept;
  const thresholdDbm = sensitivityDbm + fadeMarginDb;
  const marginAtFarthestDb = p0Dbm - 10 * n * Math.log10(farthestM) - thresholdDbm;
  const range = 10 ** ((p0Dbm - thresholdDbm) / (10 * n));
  const estimatedRangeM = n > 0 && Number.isFinite(range) ? range : null;
  const freeSpace =
    bandMhz === undefined
      ? null
      : { lossAtFarthestDb: freeSpaceLossDb(bandMhz, farthestM), rangeM: 10 ** ((p0Dbm - thresholdDbm) / 20) };

  const doubt = fitDoubt(fit.r2, n);
  return {
    estimate: {
      pathLossExponent: n,
      p0Dbm,
      r2: fit.r2,
      samples: fit.n,
      nearestM,
      farthestM,
      thresholdDbm,
      marginAtFarthestDb,
      estimatedRangeM,
      freeSpace,
      credible: doubt === null,
      notCredibleWhy: doubt,
      label: RANGE_LABEL,
    },
    reason: null,
  };
}

/**
 * Path-loss exponent with the reference FIXED: the MMSE n of Rappaport, Wireless Communications,
 * 2nd ed., Example 4.9. With xᵢ = log10(dᵢ / d0), J(n) = Σ(pᵢ − (p0 − 10·n·xᵢ))² is least at
 * n = Σ(p0 − pᵢ)·xᵢ / (10·Σxᵢ²); σ = √(J(n) / k) over the k usable samples (the book's divisor).
 * estimateRange does not use this (its P0 is fitted); it is here to check against the book and
 * to show the difference.
 *
 * Cost: O(n), no allocation.
 *
 * @param distanceM sample distances (m); NaN = missing
 * @param powerDbm received power per sample (dBm); NaN = missing
 * @param d0M reference distance (m)
 * @param p0Dbm received power measured at d0M (dBm)
 * @returns exponent n, spread σ (dB) and samples used
 * @throws {Error} when the arrays differ in length, d0M ≤ 0 or p0Dbm is not finite
 * @throws {Error} when no usable sample lies away from d0M (Σxᵢ² = 0)
 * @example
 * pathLossExponentFixedReference([100, 200, 1000, 3000], [0, -20, -35, -70], 100, 0);
 * // => { pathLossExponent: 4.413…, sigmaDb: 6.17…, samples: 4 }
 */
export function pathLossExponentFixedReference(
  distanceM: ArrayLike<number>,
  powerDbm: ArrayLike<number>,
  d0M: number,
  p0Dbm: number,
): { pathLossExponent: number; sigmaDb: number; samples: number } {
  if (distanceM.length !== powerDbm.length) throw new Error("pathLossExponentFixedReference requires arrays of equal length");
  if (!(d0M > 0) || !Number.isFinite(d0M) || !Number.isFinite(p0Dbm)) {
    throw new Error("pathLossExponentFixedReference requires a positive d0M and a finite p0Dbm");
  }
  let sxx = 0;
  let sxy = 0;
  let k = 0;
  for (let i = 0; i < distanceM.length; i++) {
    const d = distanceM[i];
    const p = powerDbm[i];
    if (!(d > 0) || !Number.isFinite(d) || !Number.isFinite(p)) continue;
    const x = Math.log10(d / d0M);
    sxx += x * x;
    sxy += (p0Dbm - p) * x;
    k++;
  }
  if (!(sxx > 0)) throw new Error("pathLossExponentFixedReference requires a usable sample away from d0M");
  const n = sxy / (10 * sxx);
  let j = 0;
  for (let i = 0; i < distanceM.length; i++) {
    const d = distanceM[i];
    const p = powerDbm[i];
    if (!(d > 0) || !Number.isFinite(d) || !Number.isFinite(p)) continue;
    j += (p - (p0Dbm - 10 * n * Math.log10(d / d0M))) ** 2;
  }
  return { pathLossExponent: n, sigmaDb: Math.sqrt(j / k), samples: k };
}
