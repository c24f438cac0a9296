/** Data for the range chart (RSSI against distance from home), pure. */
import type { PointsResponse, SeriesField } from "@/lib/series/types";
import { pathLossLines, type PathLossFit } from "./path-loss";

/** Fewer usable samples than this and the chart shows why instead. */
export const MIN_RANGE_SAMPLES = 10;
/** A log axis cannot show 0 m; samples at home add nothing to a range estimate anyway. */
export const MIN_DISTANCE_M = 1;

export interface RangeData {
  /** x in the display unit, ascending (uPlot needs sorted x). */
  x: number[];
  /** The same positions in metres (the models are in metres). */
  metres: number[];
  /** Sample RSSI, null at positions added for the lines only. */
  rssi: (number | null)[];
  fit: (number | null)[];
  freeSpace: (number | null)[];
  /** Samples plotted. */
  samples: number;
}

/**
 * Sorts the samples by distance, drops those under 1 m or without a value, and adds the estimated
 * range as an x position so the fitted line reaches it. Lines are computed at every position.
 */
export function buildRangeData(
  res: Pick<PointsResponse, "values">,
  fit: PathLossFit | null,
  estimatedRangeM: number | null,
  toUnit: (m: number) => number,
): RangeData {
  const ds = res.values.distanceFromHomeM ?? [];
  const rs = res.values.rssiDbm ?? [];
  const pairs: [number, number | null][] = [];
  const n = Math.min(ds.length, rs.length);
  for (let i = 0; i < n; i++) {
    const d = ds[i];
    const r = rs[i];
    if (Number.isFinite(d) && Number.isFinite(r) && d >= MIN_DISTANCE_M) pairs.push([d, r]);
  }
  const samples = pairs.length;
  if (fit && estimatedRangeM != null && Number.isFinite(estimatedRangeM) && estimatedRangeM >= MIN_DISTANCE_M) {
    pairs.push([estimatedRangeM, null]);
  }
  pairs.sort((a, b) => a[0] - b[0]);
  const metres = pairs.map((p) => p[0]);
  const lines = fit ? pathLossLines(metres, fit) : { fit: metres.map(() => null), freeSpace: metres.map(() => null) };
  return {
    x: metres.map(toUnit),
    metres,
    rssi: pairs.map((p) => p[1]),
    fit: lines.fit,
    freeSpace: lines.freeSpace,
    samples,
  };
}

/** Why the range chart is empty, from the run's absent fields (null = not known yet). */
export function rangeEmptyReason(absent: readonly SeriesField[] | null, samples: number): string {
  const noRssi = absent?.includes("rssiDbm") ?? false;
  const noPos = absent?.includes("distanceFromHomeM") ?? false;
  if (noRssi && noPos) return "This log has neither RSSI in dBm nor a position fix, so there is no signal against distance to plot.";
  if (noRssi)
    return "This log has no RSSI in dBm, so there is nothing to plot against distance (a percentage or LQ cannot be fitted to a path-loss model).";
  if (noPos) return "This log has no position fix, so the distance from home is unknown.";
  return `Only ${samples} sample${samples === 1 ? "" : "s"} ${samples === 1 ? "has" : "have"} both RSSI in dBm and a position more than ${MIN_DISTANCE_M} m from home; at least ${MIN_RANGE_SAMPLES} are needed to plot the signal against distance.`;
}
