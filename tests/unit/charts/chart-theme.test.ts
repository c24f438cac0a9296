import { describe, expect, it } from "vitest";
import { FALLBACK_THEME, OKABE_ITO, resolveChartTheme, seriesColor } from "@/components/charts/chart-theme";

describe("chart theme", () => {
  it("falls back to the Okabe–Ito colours", () => {
    expect(FALLBACK_THEME.series).toEqual(["#0072B2", "#D55E00", "#009E73", "#CC79A7", "#E69F00", "#56B4E9"]);
    expect(FALLBACK_THEME.series).not.toContain(OKABE_ITO.yellow);
    expect(FALLBACK_THEME.band.act).toBe("#b42318");
  });

  it("takes custom properties where set, trimmed", () => {
    const vars: Record<string, string> = { "--chart-1": " #111111 ", "--chart-band-watch": "rgb(1 2 3)", "--chart-grid": "  " };
    const t = resolveChartTheme((n) => vars[n] ?? "", "Plex Sans, sans-serif");
    expect(t.series[0]).toBe("#111111");
    expect(t.series[1]).toBe("#D55E00");
    expect(t.band.watch).toBe("rgb(1 2 3)");
    expect(t.grid).toBe(FALLBACK_THEME.grid);
    expect(t.font).toBe("Plex Sans, sans-serif");
  });

  it("gives series their own colour or the palette's in turn", () => {
    expect(seriesColor(FALLBACK_THEME, 1)).toBe("#D55E00");
    expect(seriesColor(FALLBACK_THEME, 7)).toBe("#D55E00");
    expect(seriesColor(FALLBACK_THEME, 0, "#123456")).toBe("#123456");
  });
});
