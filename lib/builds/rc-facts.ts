/**
 * Facts about a run's RC channels for the sheet check's evidence rules, from a sample of rows.
 * Pure: the rows come from lib/builds/sheet-evidence.ts.
 */
import { COUNT_BASE_US, STICK_CHANNELS, type RcFacts } from "./sheet-check";

export const RC_CHANNEL_COUNT = 18;
/** Whole µs values counted per channel: COUNT_BASE_US … COUNT_BASE_US + COUNT_SPAN − 1. */
export const COUNT_SPAN = 2001;
/** Fewest rows with both channels present before a correlation is reported. Our choice. */
export const MIN_PAIRED_ROWS = 30;
/** A channel whose standard deviation is below this (µs) is flat: no correlation. Our choice. */
export const FLAT_STDDEV_US = 2;

/**
 * Per channel: rows present, a count of each whole µs value, and Pearson's r with each stick
 * channel (1–4) over the rows where both carry a value. One pass over the rows.
 *
 * Cost: O(rows × 18 × 4). Pure.
 *
 * @param rows decoded RC rows (18 values in µs, 0 = absent; null = the row has no RC)
 * @example summariseRc([[1500, 1500, …], …]).channels[4].present // => rows where channel 5 had a value
 */
export function summariseRc(rows: Iterable<ArrayLike<number> | null>): RcFacts {
  const S = STICK_CHANNELS.length;
  const present = new Uint32Array(RC_CHANNEL_COUNT);
  const counts = Array.from({ length: RC_CHANNEL_COUNT }, () => new Uint32Array(COUNT_SPAN));
  // Pair sums per (channel, stick): n, Σx, Σy, Σx², Σy², Σxy. Values are centred on 1500 µs so
  // the sums stay small enough for doubles to keep their precision.
  const acc = new Float64Array(RC_CHANNEL_COUNT * S * 6);
  let total = 0;
  for (const row of rows) {
    if (!row) continue;
    let any = false;
    for (let c = 0; c < RC_CHANNEL_COUNT; c++) {
      const v = row[c];
      if (!(v > 0)) continue;
      any = true;
      present[c]++;
      const i = Math.round(v) - COUNT_BASE_US;
      if (i >= 0 && i < COUNT_SPAN) counts[c][i]++;
      const x = v - 1500;
      for (let k = 0; k < S; k++) {
        const w = row[STICK_CHANNELS[k] - 1];
        if (!(w > 0)) continue;
        const y = w - 1500;
        const o = (c * S + k) * 6;
        acc[o] += 1;
        acc[o + 1] += x;
        acc[o + 2] += y;
        acc[o + 3] += x * x;
        acc[o + 4] += y * y;
        acc[o + 5] += x * y;
      }
    }
    if (any) total++;
  }
  const channels = Array.from({ length: RC_CHANNEL_COUNT }, (_, c) => ({
    present: present[c],
    counts: counts[c],
    stickR: Array.from({ length: S }, (_, k) => {
      const o = (c * S + k) * 6;
      const n = acc[o];
      if (n < MIN_PAIRED_ROWS) return null;
      const vx = acc[o + 3] / n - (acc[o + 1] / n) ** 2;
      const vy = acc[o + 4] / n - (acc[o + 2] / n) ** 2;
      if (!(vx >= FLAT_STDDEV_US ** 2 && vy >= FLAT_STDDEV_US ** 2)) return null;
      const cov = acc[o + 5] / n - (acc[o + 1] / n) * (acc[o + 2] / n);
      return Math.max(-1, Math.min(1, cov / Math.sqrt(vx * vy)));
    }),
  }));
  return { rows: total, channels };
}
