/**
 * Where home is (DESIGN.md §10 "Home is where the vehicle was armed"): crews power up at the car,
 * get a fix, carry the vehicle to the launch point and arm there; first fixes after a cold start
 * are poor. Home is therefore the first *good* fix at or after arming, not the log's first fix.
 */
import type { HomeSource } from "./evidence";
import type { RunSeries, Thresholds } from "./types";

export interface HomePlacement {
  /** Sample that placed home; -1 when the log has no usable fix. */
  index: number;
  source: HomeSource | null;
  /** First armed sample, -1 when the log never shows the vehicle armed. */
  armedIndex: number;
}

/**
 * A good fix for home: a usable fix with at least `th.homeMinSats` satellites and HDOP at most
 * `th.homeMaxHdop`, each only where the log carries it (a GPX without satellites is judged on
 * what it has).
 */
export function isGoodHomeFix(series: Pick<RunSeries, "sats" | "hdop">, usable: ArrayLike<number>, i: number, th: Pick<Thresholds, "homeMinSats" | "homeMaxHdop">): boolean {
  if (usable[i] !== 1) return false;
  const sats = series.sats[i];
  const hdop = series.hdop[i];
  return !(sats < th.homeMinSats) && !(hdop > th.homeMaxHdop); // NaN (not logged) passes both
}

/**
 * Places home, in this order: the first good fix at or after the first armed sample ("arming");
 * without an armed sample, the first good fix ("first-good-fix"); armed but no good fix after it,
 * the last good fix before arming ("before-arming"); no good fix at all, the first usable fix —
 * at or after arming when armed ("first-fix").
 *
 * Cost: O(n). Pure.
 *
 * @param series the run (armed, sats, hdop read)
 * @param usable 1 at a usable fix (TrackResult.usableFix)
 * @param th thresholds (homeMinSats, homeMaxHdop)
 * @returns the sample that placed home and the rule that placed it
 * @example
 * // fixes from sample 0, armed at sample 40 → home at the first good fix from 40 on
 * placeHome(series, usable, th); // => { index: 40, source: "arming", armedIndex: 40 }
 */
export function placeHome(series: Pick<RunSeries, "n" | "armed" | "sats" | "hdop">, usable: ArrayLike<number>, th: Pick<Thresholds, "homeMinSats" | "homeMaxHdop">): HomePlacement {
  const { n, armed } = series;
  let armedIndex = -1;
  for (let i = 0; i < n && armedIndex < 0; i++) if (armed[i] === 1) armedIndex = i;
  const good = (i: number) => isGoodHomeFix(series, usable, i, th);
  const firstFrom = (from: number, ok: (i: number) => boolean) => {
    for (let i = Math.max(0, from); i < n; i++) if (ok(i)) return i;
    return -1;
  };
  if (armedIndex < 0) {
    const g = firstFrom(0, good);
    if (g >= 0) return { index: g, source: "first-good-fix", armedIndex };
    const u = firstFrom(0, (i) => usable[i] === 1);
    return { index: u, source: u >= 0 ? "first-fix" : null, armedIndex };
  }
  const after = firstFrom(armedIndex, good);
  if (after >= 0) return { index: after, source: "arming", armedIndex };
  for (let i = armedIndex - 1; i >= 0; i--) if (good(i)) return { index: i, source: "before-arming", armedIndex };
  let u = firstFrom(armedIndex, (i) => usable[i] === 1);
  if (u < 0) u = firstFrom(0, (i) => usable[i] === 1);
  return { index: u, source: u >= 0 ? "first-fix" : null, armedIndex };
}
