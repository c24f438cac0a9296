import { describe, expect, it } from "vitest";
import { buildRangeData, rangeEmptyReason } from "@/components/charts/range-data";

const ft = (m: number) => m / 0.3048;

describe("buildRangeData", () => {
  const res = {
    values: {
      distanceFromHomeM: [100, 10, 0.4, 1000, Number.NaN, 50],
      rssiDbm: [-90, -65, -35, -115, -70, Number.NaN],
    },
  };

  it("sorts by distance, drops samples under 1 m or without values", () => {
    const d = buildRangeData(res, null, null, (m) => m);
    expect(d.metres).toEqual([10, 100, 1000]);
    expect(d.rssi).toEqual([-65, -90, -115]);
    expect(d.samples).toBe(3);
    expect(d.fit).toEqual([null, null, null]);
    expect(d.freeSpace).toEqual([null, null, null]);
  });

  it("adds the estimated range as a line-only position and computes both lines in metres", () => {
    const d = buildRangeData(res, { p0Dbm: -40, pathLossExponent: 2.5 }, 400, ft);
    expect(d.metres).toEqual([10, 100, 400, 1000]);
    expect(d.rssi).toEqual([-65, -90, null, -115]);
    expect(d.samples).toBe(3);
    expect(d.fit[0]).toBeCloseTo(-65, 9);
    expect(d.fit[2]).toBeCloseTo(-40 - 25 * Math.log10(400), 9);
    expect(d.freeSpace[3]).toBeCloseTo(-100, 9);
    expect(d.x[1]).toBeCloseTo(328.084, 3);
  });

  it("ignores an estimate without a fit", () => {
    expect(buildRangeData(res, null, 400, (m) => m).metres).toEqual([10, 100, 1000]);
  });
});

describe("rangeEmptyReason", () => {
  it("names what the log lacks", () => {
    expect(rangeEmptyReason(["rssiDbm"], 0)).toMatch(/no RSSI in dBm/);
    expect(rangeEmptyReason(["distanceFromHomeM"], 0)).toMatch(/no position fix/);
    expect(rangeEmptyReason(["rssiDbm", "distanceFromHomeM"], 0)).toMatch(/neither RSSI in dBm nor a position/);
  });

  it("counts the samples when both exist but too few qualify", () => {
    expect(rangeEmptyReason([], 4)).toMatch(/^Only 4 samples have both/);
    expect(rangeEmptyReason(null, 1)).toMatch(/^Only 1 sample has both/);
  });
});
