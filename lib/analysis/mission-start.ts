/**
 * When and where route following begins (DESIGN.md §10 "A mission starts from wherever the
 * vehicle is"): plans rarely list home, so the first leg runs from the vehicle's position when the
 * mission was engaged to waypoint 1.
 */
import type { MissionStartSource } from "./evidence";
import { classifyModeName } from "./failsafe-modes";
import type { BuildConfig, RunSeries } from "./types";
import { RC_CHANNELS } from "@/lib/parsers/types";

/**
 * Mode words that mean "flying/driving the planned mission", matched as whole words (split at
 * non-letters and lower→upper case changes). Generic English and common short forms; our own list.
 */
export const MISSION_MODE_WORDS: readonly string[] = ["auto", "mission", "waypoint", "waypoints", "wp"];

/**
 * The vehicle has started to move once a fix lies this far from home (m): beyond the 0.5–3 m
 * scatter of a standing GPS (DESIGN.md §10). Our choice.
 */
export const MOVE_START_M = 5;

/**
 * True for a mode name that runs the mission ("AUTO", "Mission", "NAV WP"); a name that also names
 * a failsafe action ("AUTO RTL") is that action, not the mission.
 * @example isMissionModeName("AUTO"); // => true
 * @example isMissionModeName("AUTOTUNE"); // => false
 */
export function isMissionModeName(name: string): boolean {
  if (classifyModeName(name)?.action) return false;
  const words = name.replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase().split(/[^a-z]+/);
  return words.some((w) => MISSION_MODE_WORDS.includes(w));
}

export interface MissionStartResult {
  /** Sample where following began (a usable fix); -1 without a usable fix after home. */
  index: number;
  /** Where the first leg starts: the fix at `index`, or home for "movement" (where the vehicle stood). */
  position: { lat: number; lon: number } | null;
  source: MissionStartSource | null;
  /**
   * Per sample: 1 while the mission is engaged, 0 while it is not — only when a mission mode or
   * channel showed it; null for "movement" (nothing says when the mission is off).
   */
  engaged: Uint8Array | null;
}

const lettersOnly = (s: string) => s.toLowerCase().replace(/[^a-z]/g, "");

/**
 * Finds the mission's start at or after home: the first sample in a mission mode
 * ({@link isMissionModeName}, held until the next mode row); else the first sample where the link
 * sheet's "mission" channel lies inside its engage range (engageMinUs–engageMaxUs, inclusive);
 * else the first movement — the last usable fix within {@link MOVE_START_M} of home before the first
 * one beyond it (home itself when the vehicle never left), with the first leg starting at home. The start is moved to the next usable fix when its own sample has none.
 *
 * Cost: O(n). Pure.
 *
 * @param series the run (modeIndex, modeNames, rc, tS read)
 * @param build optional build (its "mission" channel and engage range)
 * @param track home index, usable-fix mask and distance from home (track module)
 * @returns the start sample, what showed it, and the engaged mask
 * @example
 * // AUTO from 12.0 s, home at 3.0 s
 * findMissionStart(series, undefined, track); // => { index: 120, source: "mode", engaged: Uint8Array […] }
 */
export function findMissionStart(
  series: Pick<RunSeries, "n" | "tS" | "lat" | "lon" | "modeIndex" | "modeNames" | "rc">,
  build: BuildConfig | undefined,
  track: { homeIndex: number; usableFix: ArrayLike<number>; distanceFromHomeM: ArrayLike<number> },
): MissionStartResult {
  const { n } = series;
  const { homeIndex, usableFix, distanceFromHomeM } = track;
  if (homeIndex < 0) return { index: -1, position: null, source: null, engaged: null };
  const at = (i: number) => (i >= 0 ? { lat: series.lat[i], lon: series.lon[i] } : null);
  const nextFix = (i: number) => {
    for (let k = Math.max(i, homeIndex); k < n; k++) if (usableFix[k] === 1) return k;
    return -1;
  };
  const firstEngaged = (engaged: Uint8Array) => {
    for (let i = homeIndex; i < n; i++) if (engaged[i]) return i;
    return -1;
  };

  const missionModes = series.modeNames.map(isMissionModeName);
  if (missionModes.some(Boolean)) {
    const engaged = new Uint8Array(n);
    for (let i = 0, held = NaN; i < n; i++) {
      if (Number.isFinite(series.modeIndex[i])) held = series.modeIndex[i];
      engaged[i] = Number.isFinite(held) && missionModes[held] ? 1 : 0;
    }
    const i = firstEngaged(engaged);
    if (i >= 0) return { index: nextFix(i), position: at(nextFix(i)), source: "mode", engaged };
  }

  const ch = build?.channels?.find((c) => lettersOnly(c.function) === "mission" && c.engageMinUs !== undefined && c.engageMaxUs !== undefined);
  if (ch && series.rc && ch.channel >= 1 && ch.channel <= RC_CHANNELS) {
    const lo = Math.min(ch.engageMinUs!, ch.engageMaxUs!);
    const hi = Math.max(ch.engageMinUs!, ch.engageMaxUs!);
    const engaged = new Uint8Array(n);
    for (let i = 0, held = 0; i < n; i++) {
      const v = series.rc[i * RC_CHANNELS + ch.channel - 1];
      if (v > 0) held = v; // 0 = no pulse in this row: the last value holds
      engaged[i] = held >= lo && held <= hi ? 1 : 0;
    }
    const i = firstEngaged(engaged);
    if (i >= 0) return { index: nextFix(i), position: at(nextFix(i)), source: "channel", engaged };
  }

  // It left when it last stood inside the circle; it stood at home (GPS scatter aside), so the
  // first leg runs from home, not from the circle's edge.
  let lastInside = homeIndex;
  let left = false;
  for (let i = homeIndex; i < n && !left; i++) {
    if (usableFix[i] !== 1) continue;
    if (distanceFromHomeM[i] > MOVE_START_M) left = true;
    else lastInside = i;
  }
  return { index: left ? lastInside : homeIndex, position: at(homeIndex), source: "movement", engaged: null };
}
