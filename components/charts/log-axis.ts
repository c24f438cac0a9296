/** Labels for a log-10 distance axis: only 1, 2 and 5 × 10^k, so a phone-width axis stays legible. */

/** True for 1, 2 or 5 × 10^k (within float error). */
export function isLogLabelValue(v: number): boolean {
  if (!(v > 0) || !Number.isFinite(v)) return false;
  const mag = 10 ** Math.floor(Math.log10(v) + 1e-9);
  const m = v / mag;
  return [1, 2, 5].some((k) => Math.abs(m - k) < 1e-6 * k);
}

/** "0.5", "20", "500", "1k", "20k": compact figures; the unit is in the axis title. */
export function formatLogTick(v: number): string {
  if (!(v > 0) || !Number.isFinite(v)) return "";
  const trim = (x: number) => String(Number(x.toPrecision(3)));
  if (v >= 1e6) return `${trim(v / 1e6)}M`;
  if (v >= 1e3) return `${trim(v / 1e3)}k`;
  return trim(v);
}

/** Tick labels for uPlot: blank except the 1-2-5 values (and every decade when space is short). */
export function logAxisLabels(splits: readonly number[], decadesOnly = false): string[] {
  return splits.map((v) => {
    if (!isLogLabelValue(v)) return "";
    if (decadesOnly) {
      const m = v / 10 ** Math.floor(Math.log10(v) + 1e-9);
      if (Math.abs(m - 1) > 1e-6) return "";
    }
    return formatLogTick(v);
  });
}

/** Metres → a named display unit; unknown units stay in metres. */
export const DISTANCE_UNITS: Record<string, (m: number) => number> = {
  m: (m) => m,
  km: (m) => m / 1000,
  ft: (m) => m / 0.3048,
  mi: (m) => m / 1609.344,
};

/**
 * The converter for the range chart: the caller's function if given (client callers), else one
 * picked by unit name (server components cannot pass functions to client components).
 */
export function distanceConverter(unit: string | undefined, convert?: (m: number) => number): (m: number) => number {
  return convert ?? DISTANCE_UNITS[unit ?? "m"] ?? DISTANCE_UNITS.m;
}

/** "350 m", "1.2k ft": a value already in the display unit. */
export function formatDistance(v: number, unit: string): string {
  if (!Number.isFinite(v)) return "";
  const s = v >= 1000 ? formatLogTick(v) : v >= 100 ? String(Math.round(v)) : String(Number(v.toPrecision(2)));
  return `${s} ${unit}`;
}
