/** Lat/lon grid for the map without tiles: line spacing on a 1-2-5 ladder that follows the zoom. */

/** Largest and smallest spacing, degrees: 10° for a world view, 1e-6° (≈ 0.1 m) for a rover's yard. */
export const MAX_STEP_DEG = 10;
export const MIN_STEP_DEG = 1e-6;

/** The smallest 1, 2 or 5 × 10^k that is ≥ raw. */
export function niceStep(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return NaN;
  const exp = Math.floor(Math.log10(raw));
  const base = 10 ** exp;
  for (const m of [1, 2, 5, 10]) {
    // Small tolerance: 0.2 / 10^-1 is 1.9999999999999998 in floating point.
    const step = m * base;
    if (step >= raw * (1 - 1e-9)) return Number(step.toPrecision(12));
  }
  return 10 * base;
}

/**
 * Grid spacing in degrees for a view `spanDeg` wide drawn over `spanPx` pixels, so neighbouring
 * lines are at least `minGapPx` apart.
 */
export function graticuleStep(spanDeg: number, spanPx: number, minGapPx = 90): number {
  if (!(spanDeg > 0) || !(spanPx > 0)) return MAX_STEP_DEG;
  const step = niceStep((spanDeg * minGapPx) / spanPx);
  return Math.min(MAX_STEP_DEG, Math.max(MIN_STEP_DEG, step));
}

/** Decimal places that show a multiple of `step` exactly. */
export function stepDecimals(step: number): number {
  if (!(step > 0)) return 0;
  return Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
}

/** Multiples of `step` inside [min, max], rounded to the step's decimals (no 0.30000000000000004). */
export function graticuleValues(min: number, max: number, step: number, limit = 500): number[] {
  if (!(step > 0) || !(max >= min)) return [];
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  if (last - first + 1 > limit) return [];
  const d = stepDecimals(step);
  const out: number[] = [];
  for (let k = first; k <= last; k++) out.push(Number((k * step).toFixed(d)));
  return out;
}

/** "51.25° N", "0.5° W", "0°" — degrees with the step's decimals and a hemisphere letter. */
export function formatDegrees(value: number, step: number, axis: "lat" | "lon"): string {
  const d = stepDecimals(step);
  const abs = Math.abs(value).toFixed(d);
  if (Number(abs) === 0) return `${(0).toFixed(d)}°`;
  const hemi = axis === "lat" ? (value > 0 ? "N" : "S") : value > 0 ? "E" : "W";
  return `${abs}° ${hemi}`;
}
