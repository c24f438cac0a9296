/** Build history diffs and trend series (our own invented values). */
import { describe, expect, it } from "vitest";
import { changeLabel, changesTheBuild, diffFields, diffSheet, type SheetRow } from "@/lib/builds/history";
import { buildTrends, type TrendRun } from "@/lib/builds/trends";

const row = (channel: number, more: Partial<SheetRow> = {}): SheetRow => ({
  channel,
  function: "unused",
  switchLabel: null,
  positions: null,
  engageMinUs: null,
  engageMaxUs: null,
  failsafeUs: null,
  ...more,
});

describe("history diffs", () => {
  it("records only fields sent and changed; FLOAT read-back noise is no change", () => {
    // 2.4 stored in a MariaDB FLOAT reads back as the nearest binary32 value (IEEE 754).
    const stored = { txPowerMw: Math.fround(2.4), receiver: "R1" as string | null, notes: null as string | null };
    expect(diffFields(stored, { txPowerMw: 2.4, receiver: "R1" })).toEqual({});
    expect(diffFields(stored, { receiver: null, notes: "" })).toEqual({ receiver: { from: "R1", to: null } });
    expect(diffFields(stored, { txPowerMw: 5 })).toEqual({ txPowerMw: { from: 2.4, to: 5 } });
  });

  it("keys link-sheet changes by channel and field", () => {
    const before = [row(1), row(2)];
    const after = [row(1, { function: "arm", engageMinUs: 1800, engageMaxUs: 2100 }), row(2)];
    expect(diffSheet(before, after)).toEqual({
      "ch1.function": { from: "unused", to: "arm" },
      "ch1.engageMinUs": { from: null, to: 1800 },
      "ch1.engageMaxUs": { from: null, to: 2100 },
    });
    expect(changeLabel("ch1.failsafeUs")).toBe("Channel 1 on link loss (µs)");
    expect(changeLabel("bandMhz")).toBe("Link band (MHz)");
  });

  it("does not count photos or retiring as a change to the vehicle", () => {
    expect(changesTheBuild({ photo: { from: null, to: "a.png" } })).toBe(false);
    expect(changesTheBuild({ retired: { from: false, to: true } })).toBe(false);
    expect(changesTheBuild({ "ch5.function": { from: "unused", to: "arm" } })).toBe(true);
  });
});

describe("trends", () => {
  const run = (id: number, day: number, summary: Record<string, unknown> | null, status = "ready"): TrendRun => ({
    id,
    title: `run ${id}`,
    status,
    startedAt: null,
    createdAt: new Date(Date.UTC(2026, 10, day)),
    summary,
  });

  it("takes each figure from the summaries, oldest first, in one link metric", () => {
    const runs = [
      run(2, 12, { link: { metric: "lq", unit: "%", min: 40 }, range: { estimatedRangeM: 300 }, failsafe: { latencyS: 0.8 }, route: { xteRmsM: 1.2 }, power: { minCellV: 3.61 } }),
      run(1, 10, { link: { metric: "rssi-dbm", unit: "dBm", min: -98 }, range: { estimatedRangeM: null }, failsafe: { latencyS: null }, route: null, power: { minCellV: 3.7 } }),
      run(3, 14, { link: { metric: "lq", unit: "%", min: 55 } }),
      run(4, 15, null, "failed"),
    ];
    const t = buildTrends(runs, []);
    const by = Object.fromEntries(t.metrics.map((m) => [m.key, m]));
    expect(t.runs).toBe(3);
    expect(by.linkMin.label).toBe("Link minimum (LQ %)");
    expect(by.linkMin.points.map((p) => [p.runId, p.v])).toEqual([[2, 40], [3, 55]]);
    expect(by.linkMin.note).toMatch(/1 run measured the link another way/);
    expect(by.range.points.map((p) => p.v)).toEqual([300]);
    expect(by.minCell.points.map((p) => p.runId)).toEqual([1, 2]);
    // 1 ft = 0.3048 m exactly (NIST SP 811, Appendix B).
    expect(buildTrends(runs, [], "imperial").metrics.find((m) => m.key === "xteRms")!.points[0].v).toBeCloseTo(1.2 / 0.3048, 9);
  });

  it("marks build changes but not photo uploads", () => {
    const at = new Date(Date.UTC(2026, 10, 11, 9));
    const t = buildTrends([], [
      { createdAt: at, changes: { antennas: { from: "a", to: "b" }, "ch7.failsafeUs": { from: 1000, to: 2000 } } },
      { createdAt: at, changes: { photo: { from: null, to: "x.png" } } },
    ]);
    expect(t.markers).toEqual([{ t: at.getTime() / 1000, label: "Antennas, link sheet" }]);
  });
});
