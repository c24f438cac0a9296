/**
 * The debrief's time axis: seconds from the run's first sample, labelled mm:ss (or h:mm:ss once a
 * run reaches an hour), with tick steps that read as clock time (15 s, 30 s, 1 min, 5 min …).
 */

/** Tick steps in seconds, smallest first. Sub-second steps are for deep zooms into a fade. */
export const TIME_INCRS = [
  0.1, 0.2, 0.5, 1, 2, 5, 10, 15, 30, 60, 120, 300, 600, 900, 1800, 3600, 7200, 10800, 21600, 43200, 86400,
];

/** Minimum space between time labels, CSS px ("00:00" in an 11 px font is about 30 px wide). */
export const TIME_LABEL_SPACE_PX = 56;
/** h:mm:ss labels are wider. */
export const TIME_LABEL_SPACE_HOURS_PX = 72;

export interface RunTimeFormat {
  /** Always show hours (h:mm:ss), e.g. so every label of a long run has the same shape. */
  hours?: boolean;
  /** Digits after the seconds' decimal point (0–3). */
  decimals?: number;
}

const pad2 = (n: number) => (n < 10 ? `0${n}` : String(n));

/**
 * Formats seconds from run start as mm:ss[.d] or h:mm:ss[.d]. Rounds before splitting so 59.96 s
 * with one decimal reads "01:00.0", never "00:60.0".
 */
export function formatRunTime(seconds: number, opts: RunTimeFormat = {}): string {
  if (!Number.isFinite(seconds)) return "";
  const decimals = Math.max(0, Math.min(3, Math.floor(opts.decimals ?? 0)));
  const scale = 10 ** decimals;
  const sign = seconds < 0 ? "−" : "";
  const total = Math.round(Math.abs(seconds) * scale);
  const whole = Math.floor(total / scale);
  const frac = total - whole * scale;
  const h = Math.floor(whole / 3600);
  const m = Math.floor((whole % 3600) / 60);
  const s = whole % 60;
  const fracPart = decimals > 0 ? `.${String(frac).padStart(decimals, "0")}` : "";
  const showHours = opts.hours || h > 0;
  return showHours ? `${sign}${h}:${pad2(m)}:${pad2(s)}${fracPart}` : `${sign}${pad2(m)}:${pad2(s)}${fracPart}`;
}

/** Decimals a tick step needs: 0 for whole seconds, 1 for 0.1–0.5 s steps. */
export function decimalsForStep(stepS: number): number {
  if (stepS >= 1) return 0;
  return Math.min(3, Math.ceil(-Math.log10(stepS) - 1e-9));
}

/** Label of one tick; `hours` when the visible range reaches an hour so all labels match. */
export function formatTimeTick(valueS: number, stepS: number, hours: boolean): string {
  return formatRunTime(valueS, { hours, decimals: decimalsForStep(stepS) });
}

/**
 * The smallest step from TIME_INCRS whose ticks are at least `minSpacePx` apart when `spanS`
 * seconds fill `widthPx`. Mirrors how uPlot picks from `incrs`, so tests can check the spacing.
 */
export function pickTimeStep(spanS: number, widthPx: number, minSpacePx = TIME_LABEL_SPACE_PX): number {
  if (!(spanS > 0) || !(widthPx > 0)) return TIME_INCRS[TIME_INCRS.length - 1];
  const pxPerS = widthPx / spanS;
  for (const incr of TIME_INCRS) if (incr * pxPerS >= minSpacePx) return incr;
  return TIME_INCRS[TIME_INCRS.length - 1];
}

/**
 * Tick positions: every multiple of `stepS` inside [min, max]. Computed from integer multiples
 * (not by repeated addition) so 0.1 s steps give 0.3, not 0.30000000000000004.
 */
export function timeTicks(minS: number, maxS: number, stepS: number): number[] {
  if (!(stepS > 0) || !Number.isFinite(minS) || !Number.isFinite(maxS) || maxS < minS) return [];
  const digits = decimalsForStep(stepS) + 1;
  const first = Math.ceil(minS / stepS - 1e-9);
  const last = Math.floor(maxS / stepS + 1e-9);
  const out: number[] = [];
  for (let k = first; k <= last && out.length < 1000; k++) out.push(Number((k * stepS).toFixed(digits)));
  return out;
}
