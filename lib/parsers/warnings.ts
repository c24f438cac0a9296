import type { ParseWarning } from "./types";

/** The warning a parser gives when the log's times cannot pace it: the analysis then reports no time figures. */
export const NO_TIMES = "no-times";

/** False when a parser said the log's times are not usable (see {@link NO_TIMES}). */
export function timesUsable(warnings: readonly { code: string }[] | null | undefined): boolean {
  return !(warnings ?? []).some((w) => w.code === NO_TIMES);
}

/** Aggregates repeated warnings (same code and column) into one entry with a count and the first line. */
export class WarningLog {
  private byKey = new Map<string, ParseWarning>();

  add(code: string, message: string, line?: number, column?: string): void {
    const key = `${code}\u0000${column ?? ""}`;
    const w = this.byKey.get(key);
    if (w) w.count = (w.count ?? 1) + 1;
    else this.byKey.set(key, { code, message, line, column, count: 1 });
  }

  list(): ParseWarning[] {
    return [...this.byKey.values()];
  }
}
