import { describe, expect, it } from "vitest";
import { chartPanels, panelConversions } from "@/components/debrief/chart-panels";

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
});
