/**
 * What a flight/drive mode name says about failsafe: generic words, not any one firmware's list.
 */
import type { FailsafeAction } from "./types";

/** One word to look for in a mode name, and the action it means (null: failsafe, action unknown). */
export interface ModeRule {
  match: string;
  /** Match only as a whole word (short codes like "rth" would otherwise hit longer words). */
  wholeWord: boolean;
  action: FailsafeAction | null;
}

/**
 * Mode words, matched case-insensitively, first action match wins. Generic English words and
 * the common short codes (RTH, RTL); our own list.
 */
export const FAILSAFE_MODE_TABLE: readonly ModeRule[] = [
  { match: "rth", wholeWord: true, action: "return-to-home" },
  { match: "rtl", wholeWord: true, action: "return-to-home" },
  { match: "return", wholeWord: false, action: "return-to-home" },
  { match: "home", wholeWord: false, action: "return-to-home" },
  { match: "rescue", wholeWord: false, action: "return-to-home" },
  { match: "land", wholeWord: false, action: "land" },
  { match: "hold", wholeWord: false, action: "hold" },
  { match: "loiter", wholeWord: false, action: "hold" },
  { match: "failsafe", wholeWord: false, action: null },
];

/**
 * Pilot-flown assist modes that contain "hold" but are not a failsafe action (compared with
 * letters only, lower case: "ALT_HOLD" → "althold").
 */
export const NOT_ACTION_MODES: readonly string[] = ["althold", "poshold", "headinghold", "hdghold"];

/** A classified mode: `failsafe` when the name says failsafe; `action` when it names one. */
export interface ModeClass {
  failsafe: boolean;
  action: FailsafeAction | null;
}

/**
 * Reads a mode name against {@link FAILSAFE_MODE_TABLE}. Whole words are split at non-letters
 * and at lower→upper case changes ("SmartRTL" → "smart", "rtl").
 *
 * Cost: O(length of name × table size). Pure.
 *
 * @param name mode text as logged
 * @returns the class, or null for a mode that is neither failsafe nor an action (e.g. "MANUAL")
 * @example
 * classifyModeName("NAV RTH"); // => { failsafe: false, action: "return-to-home" }
 * classifyModeName("FAILSAFE"); // => { failsafe: true, action: null }
 * classifyModeName("ALT_HOLD"); // => null
 */
export function classifyModeName(name: string): ModeClass | null {
  const lower = name.toLowerCase();
  const letters = lower.replace(/[^a-z]/g, "");
  const words = name.replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase().split(/[^a-z]+/);
  const failsafe = lower.includes("failsafe");
  if (NOT_ACTION_MODES.some((m) => letters.includes(m))) return failsafe ? { failsafe, action: null } : null;
  const rule = FAILSAFE_MODE_TABLE.find((r) => r.action !== null && (r.wholeWord ? words.includes(r.match) : lower.includes(r.match)));
  if (!rule && !failsafe) return null;
  return { failsafe, action: rule?.action ?? null };
}
