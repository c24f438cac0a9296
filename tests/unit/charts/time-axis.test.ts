import { describe, expect, it } from "vitest";
import {
  decimalsForStep,
  formatRunTime,
  formatTimeTick,
  pickTimeStep,
  TIME_INCRS,
  timeTicks,
} from "@/components/charts/time-axis";

describe("formatRunTime", () => {
  it("writes mm:ss under an hour", () => {
    expect(formatRunTime(0)).toBe("00:00");
    expect(formatRunTime(5)).toBe("00:05");
    expect(formatRunTime(192)).toBe("03:12");
    expect(formatRunTime(3599)).toBe("59:59");
  });

  it("writes h:mm:ss from an hour on, or when asked", () => {
    expect(formatRunTime(3600)).toBe("1:00:00");
    expect(formatRunTime(3723)).toBe("1:02:03");
    expect(formatRunTime(36000 + 61)).toBe("10:01:01");
    expect(formatRunTime(65, { hours: true })).toBe("0:01:05");
  });

  it("rounds before splitting so a carry never shows 60 seconds", () => {
    expect(formatRunTime(59.96, { decimals: 1 })).toBe("01:00.0");
    expect(formatRunTime(59.96)).toBe("01:00");
    expect(formatRunTime(3599.5)).toBe("1:00:00");
    expect(formatRunTime(12.345, { decimals: 2 })).toBe("00:12.35");
    expect(formatRunTime(0.05, { decimals: 1 })).toBe("00:00.1");
  });

  it("marks negative times and blanks non-finite ones", () => {
    expect(formatRunTime(-75)).toBe("−01:15");
    expect(formatRunTime(Number.NaN)).toBe("");
    expect(formatRunTime(Number.POSITIVE_INFINITY)).toBe("");
  });
});

describe("tick labels", () => {
  it("uses decimals only for sub-second steps", () => {
    expect(decimalsForStep(1)).toBe(0);
    expect(decimalsForStep(30)).toBe(0);
    expect(decimalsForStep(0.5)).toBe(1);
    expect(decimalsForStep(0.2)).toBe(1);
    expect(decimalsForStep(0.1)).toBe(1);
    expect(formatTimeTick(12.3, 0.1, false)).toBe("00:12.3");
    expect(formatTimeTick(90, 30, false)).toBe("01:30");
    expect(formatTimeTick(90, 30, true)).toBe("0:01:30");
  });
});

describe("pickTimeStep", () => {
  it("picks the smallest clock-like step that keeps labels apart", () => {
    // 10 min over 300 px: 0.5 px/s, 64 px needs ≥ 128 s → 300 s (5 min).
    expect(pickTimeStep(600, 300, 64)).toBe(300);
    // 10 min over 1200 px: 2 px/s → 32 s → 60 s.
    expect(pickTimeStep(600, 1200, 64)).toBe(60);
    // 5 s over 800 px: 160 px/s → 0.4 s → 0.5 s.
    expect(pickTimeStep(5, 800, 64)).toBe(0.5);
    // 2 h over 360 px: 0.05 px/s → 1280 s → 1800 s.
    expect(pickTimeStep(7200, 360, 64)).toBe(1800);
  });

  it("steps are ascending and every chosen step honours the spacing", () => {
    for (let i = 1; i < TIME_INCRS.length; i++) expect(TIME_INCRS[i]).toBeGreaterThan(TIME_INCRS[i - 1]);
    for (const [span, w] of [
      [37, 320],
      [1234, 900],
      [86000, 1500],
    ]) {
      const step = pickTimeStep(span, w, 64);
      expect((step * w) / span).toBeGreaterThanOrEqual(64);
      const idx = TIME_INCRS.indexOf(step);
      if (idx > 0) expect((TIME_INCRS[idx - 1] * w) / span).toBeLessThan(64);
    }
  });
});

describe("timeTicks", () => {
  it("lists exact multiples inside the range", () => {
    expect(timeTicks(0, 600, 120)).toEqual([0, 120, 240, 360, 480, 600]);
    expect(timeTicks(61, 299, 60)).toEqual([120, 180, 240]);
    expect(timeTicks(0.25, 0.75, 0.1)).toEqual([0.3, 0.4, 0.5, 0.6, 0.7]);
  });

  it("returns nothing for a bad step or an inverted range", () => {
    expect(timeTicks(0, 10, 0)).toEqual([]);
    expect(timeTicks(10, 0, 1)).toEqual([]);
  });
});
