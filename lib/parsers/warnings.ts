import type { ParseWarning } from "./types";

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
