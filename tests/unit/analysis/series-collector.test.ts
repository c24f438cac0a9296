import { describe, expect, it } from "vitest";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import { BatchBuilder } from "@/lib/parsers/batch-builder";

function batches(total: number, size: number, rcFrom = Infinity) {
  const out = [];
  const b = new BatchBuilder(true, size);
  for (let i = 0; i < total; i++) {
    b.begin(i + 2, i === 0);
    b.set("tS", i / 10);
    b.set("lat", 53 + i * 1e-6);
    b.set("voltageV", 16 - i * 0.001);
    if (i >= rcFrom) b.setRc(3, 1000 + i);
    b.commit();
    if (b.full) out.push(b.take()!);
  }
  const last = b.take();
  if (last) out.push(last);
  return out;
}

describe("SeriesCollector", () => {
  it("concatenates batches in order across growth, keeping doubles for time and position", () => {
    const c = new SeriesCollector();
    for (const b of batches(10_000, 777)) c.add(b);
    const s = c.series(["AUTO"]);
    expect(s.n).toBe(10_000);
    expect(s.tS[9_999]).toBeCloseTo(999.9, 9);
    expect(s.lat[5_000]).toBe(53 + 5_000 * 1e-6); // exact: stored as a double
    expect(s.voltageV[5_000]).toBeCloseTo(11, 5); // 32-bit float: close, not exact
    expect(Number.isNaN(s.rssiDbm[0])).toBe(true);
    expect(s.segmentStart[0]).toBe(1);
    expect(s.segmentStart[1]).toBe(0);
    expect(s.modeNames).toEqual(["AUTO"]);
  });

  it("keeps RC channels that appear only in later batches", () => {
    const c = new SeriesCollector();
    for (const b of batches(3_000, 1000, 2_500)) c.add(b);
    const s = c.series([]);
    expect(s.rc).not.toBeNull();
    expect(s.rc![2_600 * 18 + 2]).toBe(3600);
    expect(s.rc![100 * 18 + 2]).toBe(0);
  });

  it("gives an empty series when nothing was added", () => {
    expect(new SeriesCollector().series([]).n).toBe(0);
  });
});

describe("SeriesCollector.reserve", () => {
  it("keeps every sample when the reservation was too small or too large", () => {
    for (const reserveFor of [10, 3_000, 50_000]) {
      const c = new SeriesCollector();
      c.reserve(reserveFor, true);
      for (const b of batches(3_000, 500, 100)) c.add(b);
      const s = c.series([]);
      expect(s.n).toBe(3_000);
      expect(s.tS[2_999]).toBeCloseTo(299.9, 9);
      expect(s.rc![2_999 * 18 + 2]).toBe(3_999);
    }
  });
});
