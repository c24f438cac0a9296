/** Checks with a stated tolerance, and readers for the parts of the issue 12 summary. */
import { expect } from "vitest";

/** Float slack for times read back from a log written with 10 ms resolution. */
export const EPS = 1e-6;

/** |actual − expected| ≤ tol; fails with the label when actual is not a number. */
export function expectWithin(actual: unknown, expected: number, tol: number, label: string): void {
  expect(typeof actual, `${label}: not a number (${JSON.stringify(actual)})`).toBe("number");
  const d = Math.abs((actual as number) - expected);
  expect(d, `${label}: ${actual} vs expected ${expected.toFixed(3)} ± ${tol}`).toBeLessThanOrEqual(tol + EPS);
}

/** lo ≤ actual ≤ hi. */
export function expectBetween(actual: unknown, lo: number, hi: number, label: string): void {
  expect(typeof actual, `${label}: not a number (${JSON.stringify(actual)})`).toBe("number");
  expect(actual as number, `${label}: below ${lo}`).toBeGreaterThanOrEqual(lo - EPS);
  expect(actual as number, `${label}: above ${hi}`).toBeLessThanOrEqual(hi + EPS);
}

/** The parts listed in `summary.verdict.notAssessed` (contract: [{what, why}]). */
export function notAssessedParts(summary: Record<string, unknown>): string[] {
  const v = summary.verdict as { notAssessed?: { what: string }[] } | undefined;
  return (v?.notAssessed ?? []).map((x) => x.what);
}
