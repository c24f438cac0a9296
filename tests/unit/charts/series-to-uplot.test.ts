import { describe, expect, it } from "vitest";
import type { SeriesResponse } from "@/lib/series/types";
import {
  absentMessage,
  countInRange,
  formatValue,
  isolatedIndices,
  mergeSeries,
  paddedRange,
  presentFields,
  toAlignedData,
  unionFields,
} from "@/components/charts/series-to-uplot";

function res(partial: Partial<SeriesResponse>): SeriesResponse {
  return { runId: 7, from: 0, to: 10, resolution: "raw", t: [], values: {}, absent: [], ...partial };
}

describe("toAlignedData", () => {
  const r = res({
    t: [0, 1, 2, 3],
    values: { altM: [10, null, 30, Number.NaN], rssiDbm: [-50, -60, null, -80] },
  });

  it("puts t first and one column per field, keeping nulls as gaps", () => {
    expect(toAlignedData(r, ["altM", "rssiDbm"])).toEqual([
      [0, 1, 2, 3],
      [10, null, 30, null],
      [-50, -60, null, -80],
    ]);
  });

  it("converts values but never gaps", () => {
    const ft = (m: number) => m / 0.3048;
    const out = toAlignedData(r, ["altM"], { altM: ft });
    expect(out[1][0]).toBeCloseTo(32.8084, 4);
    expect(out[1][1]).toBeNull();
    expect(out[1][2]).toBeCloseTo(98.4252, 4);
    expect(out[1][3]).toBeNull();
  });

  it("fills a field the response lacks with nulls", () => {
    expect(toAlignedData(r, ["lqPct"])[1]).toEqual([null, null, null, null]);
  });

  it("copies t so uPlot never shares the response's array", () => {
    expect(toAlignedData(r, [])[0]).not.toBe(r.t);
  });
});

describe("fields", () => {
  it("unions the panels' fields once each, in order", () => {
    expect(
      unionFields([
        { series: [{ field: "rssiDbm" }, { field: "lqPct" }] },
        { series: [{ field: "voltageV" }, { field: "rssiDbm" }] },
      ]),
    ).toEqual(["rssiDbm", "lqPct", "voltageV"]);
  });

  it("drops absent fields", () => {
    expect(presentFields({ absent: ["lqPct"] }, ["rssiDbm", "lqPct", "snrDb"])).toEqual(["rssiDbm", "snrDb"]);
  });

  it("says what is missing", () => {
    expect(absentMessage(["RSSI"])).toBe("No RSSI in this log.");
    expect(absentMessage(["LQ", "SNR"])).toBe("No LQ or SNR in this log.");
    expect(absentMessage(["Voltage", "Current", "Used"])).toBe("No Voltage, Current or Used in this log.");
    expect(absentMessage([])).toBe("No data for this chart in this log.");
  });
});

describe("mergeSeries", () => {
  const overview = res({
    from: 0,
    to: 100,
    resolution: 10,
    t: [0, 20, 40, 60, 80, 100],
    values: { rssiDbm: [-40, -50, -60, -70, -80, -90] },
    absent: ["lqPct"],
  });
  const detail = res({
    from: 35,
    to: 65,
    resolution: "raw",
    t: [35, 45, 55, 65],
    values: { rssiDbm: [-58, null, -66, -71] },
  });

  it("uses the detail inside its window and the overview outside", () => {
    const m = mergeSeries(overview, detail);
    expect(m.t).toEqual([0, 20, 35, 45, 55, 65, 80, 100]);
    expect(m.values.rssiDbm).toEqual([-40, -50, -58, null, -66, -71, -80, -90]);
    expect(m.resolution).toBe("raw");
    expect(m.absent).toEqual(["lqPct"]);
    expect(m.from).toBe(0);
    expect(m.to).toBe(100);
  });

  it("keeps the overview when there is no detail", () => {
    expect(mergeSeries(overview, null)).toBe(overview);
    expect(mergeSeries(overview, res({ t: [] }))).toBe(overview);
  });

  it("gives gaps for a field only one side has", () => {
    const d2 = res({ from: 35, to: 65, t: [50], values: { rssiDbm: [-65], snrDb: [12] } });
    const m = mergeSeries(overview, d2);
    expect(m.t).toEqual([0, 20, 50, 80, 100]);
    expect(m.values.snrDb).toEqual([null, null, 12, null, null]);
  });
});

describe("isolatedIndices", () => {
  it("finds values with gaps on both sides", () => {
    expect(isolatedIndices([1, null, 3, null, null, 6, 7, null, 9])).toEqual([0, 2, 8]);
    expect(isolatedIndices([1, 2, null, 3, null, 5, 6])).toEqual([3]);
    expect(isolatedIndices([5])).toEqual([0]);
    expect(isolatedIndices([1, 2, 3])).toEqual([]);
    expect(isolatedIndices([null, null])).toEqual([]);
  });
});

describe("countInRange", () => {
  it("counts sorted x inside [min, max]", () => {
    const xs = [0, 1, 2, 2, 3, 5, 8];
    expect(countInRange(xs, 2, 5)).toBe(4);
    expect(countInRange(xs, -10, 100)).toBe(7);
    expect(countInRange(xs, 5.5, 7.9)).toBe(0);
    expect(countInRange([], 0, 1)).toBe(0);
  });
});

describe("formatValue", () => {
  it("uses fewer decimals for larger magnitudes", () => {
    expect(formatValue(-87.26)).toBe("−87.3");
    expect(formatValue(-102.6)).toBe("−103");
    expect(formatValue(3.14159)).toBe("3.14");
    expect(formatValue(1520)).toBe("1520");
    expect(formatValue(-0.001)).toBe("0.00");
    expect(formatValue(null)).toBe("");
    expect(formatValue(Number.NaN)).toBe("");
  });
});

describe("paddedRange", () => {
  it("pads the data range and takes thresholds in", () => {
    expect(paddedRange(-80, -40, [])).toEqual([-83.2, -36.8]);
    const [lo, hi] = paddedRange(-80, -40, [-100]);
    expect(lo).toBeCloseTo(-104.8, 9);
    expect(hi).toBeCloseTo(-35.2, 9);
  });

  it("gives a flat or empty series a visible band", () => {
    expect(paddedRange(12, 12)).toEqual([11, 13]);
    expect(paddedRange(null, null)).toEqual([0, 1]);
    expect(paddedRange(null, null, [3.5])).toEqual([2.5, 4.5]);
  });
});
