import { CLEAR_FOR_ASSESSED_WORDS, heldWords, LEGACY_CLEAR_WORDS, notAssessedWords, type AssessedPart, type NotAssessed } from "@/lib/analysis/evidence";

export type VerdictLevel = "act" | "watch" | "clear";

/** The verdict as stored in `runs.summary`; `held` and `notAssessed` are absent from older summaries. */
export interface StoredVerdict {
  level: VerdictLevel;
  reasons: string[];
  held?: AssessedPart[];
  notAssessed?: NotAssessed[];
}

export const VERDICT_TITLES: Record<VerdictLevel, string> = {
  act: "Act before the next run",
  watch: "Watch",
  clear: "Clear",
};

/** The verdict in words, the same on the page, in the PDF and in the alert mail. */
export interface VerdictLines {
  title: string;
  /** One sentence per rule that fired. */
  reasons: string[];
  /** What was assessed and held, as one sentence; null when nothing was (or the summary predates it). */
  held: string | null;
  /** "Not assessed: link — …", one per part the log could not show. */
  notAssessed: string[];
  /** For an older summary with nothing fired: it cannot say what held, and says so. */
  legacy: string | null;
}

/**
 * Words for a stored verdict (DESIGN.md §10 "Evidence, not absence"): the reasons that fired, what
 * held and what was not assessed. "Clear" with parts not assessed is clear only for what was.
 * A summary stored before the analysis recorded held/not-assessed parts never claims anything held.
 */
export function verdictLines(v: StoredVerdict): VerdictLines {
  const reasons = v.reasons ?? [];
  const known = Array.isArray(v.held) || Array.isArray(v.notAssessed);
  const gaps = v.notAssessed ?? [];
  const title = v.level === "clear" && gaps.length > 0 ? CLEAR_FOR_ASSESSED_WORDS : (VERDICT_TITLES[v.level] ?? v.level);
  return {
    title,
    reasons,
    held: heldWords(v.held ?? []),
    notAssessed: gaps.map(notAssessedWords),
    legacy: !known && reasons.length === 0 ? LEGACY_CLEAR_WORDS : null,
  };
}
