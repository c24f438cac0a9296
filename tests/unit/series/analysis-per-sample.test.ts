/**
 * analyseRun's per-sample arrays and range figures, which the display levels and the range chart
 * read; over our own simulator's log (demo data, not a reference: only shapes and consistency are checked).
 */
import { describe, expect, it } from "vitest";
import { demoCrew } from "@/db/demo-crew";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import { parseLog } from "@/lib/parsers/parse-log";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { chunksOf } from "../../helpers/byte-source";

async function simulated() {
  const csv = toCsv(simulateRun({ seed: 5, waypoints: demoCrew.routePlans[0].waypoints }));
  const c = new SeriesCollector();
  const parsed = await parseLog("csv", chunksOf(csv), { onBatch: (b) => c.add(b) });
  return c.series(parsed.modeNames);
}

describe("analyseRun per-sample output", () => {
  it("returns distance from home per sample and no XTE without a plan", async () => {
    const series = await simulated();
    const a = analyseRun(series, { build: { vehicleType: "ground", bandMhz: 868, rxSensitivityDbm: -112 } });
    expect(a.perSample.distanceFromHomeM.length).toBe(series.n);
    expect(a.perSample.xteM).toBeNull();
    const max = Math.max(...Array.from(a.perSample.distanceFromHomeM).filter(Number.isFinite));
    expect(max).toBeCloseTo(a.summary.maxDistanceFromHomeM!, -1);
  });

  it("returns XTE per sample with a plan, and the range line's figures", async () => {
    const series = await simulated();
    const a = analyseRun(series, { build: { vehicleType: "ground", bandMhz: 868, rxSensitivityDbm: -112 }, plan: { waypoints: demoCrew.routePlans[0].waypoints } });
    expect(a.perSample.xteM!.length).toBe(series.n);
    expect(Array.from(a.perSample.xteM!).some(Number.isFinite)).toBe(true);
    const range = a.summary.range as { p0Dbm: number; thresholdDbm: number; freeSpaceRangeM: number | null; pathLossExponent: number; estimatedRangeM: number };
    // thresholdDbm = sensitivity + the default 10 dB fade margin (DESIGN.md §5).
    expect(range.thresholdDbm).toBe(-102);
    expect(Number.isFinite(range.p0Dbm)).toBe(true);
    expect(range.freeSpaceRangeM).toBeGreaterThan(0);
    // The fit meets the threshold at the estimated range: P0 − 10·n·log10(d) = threshold.
    expect(range.p0Dbm - 10 * range.pathLossExponent * Math.log10(range.estimatedRangeM)).toBeCloseTo(range.thresholdDbm, 0);
  });
});
