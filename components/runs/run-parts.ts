/**
 * The runs of one upload as the upload card, the run page and the runs list name them. A file
 * holding several separate runs (lib/parsers/run-splitter.ts) gives one run per part, in file order.
 * Pure, so the client upload card and the server pages share the words.
 */

export interface UploadRunLink {
  id: number;
  part: number;
  status: string;
  verdict: string | null;
  durationS: number | null;
  /** ISO text from the API, a Date on the server. */
  startedAt: string | Date | null;
}

/** "Part 2 of 3". */
export const partOf = (part: number, count: number) => `Part ${part} of ${count}`;

/** When the part began, to the minute in UTC, or null when the log has no clock. */
export function partStart(startedAt: string | Date | null): string | null {
  if (!startedAt) return null;
  const d = typeof startedAt === "string" ? new Date(startedAt) : startedAt;
  return Number.isNaN(d.getTime()) ? null : d.toISOString().replace("T", " ").slice(0, 16) + " UTC";
}

/** The card's sentence for a file that held several runs. */
export const severalRunsSentence = (count: number) => `This file holds ${count} separate runs, each with its own debrief.`;
