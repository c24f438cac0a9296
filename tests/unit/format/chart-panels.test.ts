import { describe, expect, it } from "vitest";
import { chartPanels, linkChart, panelConversions } from "@/components/debrief/chart-panels";

describe("chartPanels", () => {
  const all = ["tS", "lat", "lon", "altM", "speedMps", "rssiDbm", "lqPct", "snrDb", "voltageV", "currentA"];

  it("puts the analysis' link metric first with its fade threshold, and skips what the log lacks", () => {
    const panels = chartPanels(all, true, { metric: "lq", unit: "%", fadeThreshold: 70 }, "metric");
    expect(panels.map((p) => p.id)).toEqual(["link", "rssi", "snr", "altitude", "speed", "voltage", "current", "xte"]);
    expect(panels[0].series[0].field).toBe("lqPct");
    expect(panels[0].thresholds).toEqual([{ value: 70, label: "fade threshold" }]);
    const gpxOnly = chartPanels(["tS", "lat", "lon", "altM"], false, { metric: null, unit: null, fadeThreshold: null }, "metric");
    expect(gpxOnly.map((p) => p.id)).toEqual(["altitude"]);
  });

  it("does not chart RSSI twice when it is the link metric, and labels imperial units", () => {
    const panels = chartPanels(all, false, { metric: "rssi-dbm", unit: "dBm", fadeThreshold: -95 }, "imperial");
    expect(panels.filter((p) => p.series.some((s) => s.field === "rssiDbm"))).toHaveLength(1);
    expect(panels.find((p) => p.id === "altitude")!.unit).toBe("ft");
    expect(panelConversions("imperial").altM!(0.3048)).toBeCloseTo(1, 12);
    expect(panelConversions("metric")).toEqual({});
  });

  it("charts RSSI read from the link sheet's channel as the derived field, with a title naming the channel", () => {
    // A bench test: no position, no RSSI column; the RSSI is on channel 14 (DESIGN.md §10).
    const bench = ["tS", "voltageV", "currentA", "armed"];
    const panels = chartPanels(bench, false, { metric: "rssi-pct", unit: "%", fadeThreshold: 40, source: { kind: "rc-channel", channel: 14 } }, "metric");
    expect(panels.map((p) => p.id)).toEqual(["link", "voltage", "current"]);
    expect(panels[0].series).toEqual([{ field: "rssiRcPct", label: "RSSI (channel 14)" }]);
    expect(panels[0].title).toBe("RSSI from channel 14 — the link metric judged");
    expect(panels[0].thresholds).toEqual([{ value: 40, label: "fade threshold" }]);
  });

  it("keeps the column when the column was judged, and charts nothing for a link the log lacks", () => {
    expect(linkChart({ metric: "rssi-pct", unit: "%", fadeThreshold: 40, source: { kind: "column" } }, ["rssiPct"])!.field).toBe("rssiPct");
    expect(linkChart({ metric: "rssi-pct", unit: "%", fadeThreshold: 40 }, ["lqPct"])).toBeNull();
    expect(linkChart({ metric: null, unit: null, fadeThreshold: null, source: null }, ["lqPct"])).toBeNull();
  });
});

