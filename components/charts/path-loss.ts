/**
 * The two reference lines of the range chart.
 *
 * Log-distance path loss model (T. S. Rappaport, "Wireless Communications: Principles and
 * Practice", 2nd ed., §4.9): received power falls 10·n dB per decade of distance,
 *   RSSI(d) = P0 − 10·n·log10(d / d0),  d0 = 1 m here, P0 = RSSI at 1 m from the fit.
 * Free space is the n = 2 case: 20 dB per decade (Friis; ITU-R P.525), drawn from the same P0
 * so the reader sees how much faster than free space this link faded.
 */

export interface PathLossFit {
  /** Fitted RSSI at 1 m, dBm. */
  p0Dbm: number;
  /** Fitted path-loss exponent n (2 = free space). */
  pathLossExponent: number;
}

/** Free-space path-loss exponent. */
export const FREE_SPACE_EXPONENT = 2;

/** RSSI (dBm) the log-distance model gives at `distanceM` metres; null where log10 is undefined. */
export function logDistanceRssi(distanceM: number, p0Dbm: number, n: number): number | null {
  if (!(distanceM > 0) || !Number.isFinite(distanceM)) return null;
  return p0Dbm - 10 * n * Math.log10(distanceM);
}

/** The fitted line's and the free-space line's y values at each distance (m). */
export function pathLossLines(
  distancesM: readonly number[],
  fit: PathLossFit,
): { fit: (number | null)[]; freeSpace: (number | null)[] } {
  return {
    fit: distancesM.map((d) => logDistanceRssi(d, fit.p0Dbm, fit.pathLossExponent)),
    freeSpace: distancesM.map((d) => logDistanceRssi(d, fit.p0Dbm, FREE_SPACE_EXPONENT)),
  };
}

/** Distance (m) at which the model falls to `thresholdDbm`: 10^((P0 − threshold) / (10·n)). */
export function distanceAtRssi(thresholdDbm: number, p0Dbm: number, n: number): number | null {
  if (!(n > 0) || !Number.isFinite(thresholdDbm) || !Number.isFinite(p0Dbm)) return null;
  return 10 ** ((p0Dbm - thresholdDbm) / (10 * n));
}
