import type { ChartPanel } from "@/components/charts/chart-group";
import { lengthConversion, speedConversion, type Units } from "@/lib/format/units";
import type { LinkSource } from "@/lib/analysis/evidence";
import type { SeriesField } from "@/lib/series/types";

/** The run's link metric as the analysis chose it (summary.link); `source` is absent from older summaries. */
export interface LinkInfo {
  metric: string | null;
  unit: string | null;
  fadeThreshold: number | null;
  source?: LinkSource | null;
}

const linkLabels: Record<string, string> = { lqPct: "Link quality", rssiPct: "RSSI", rssiDbm: "RSSI", snrDb: "SNR" };
/** The analysis names its metric by kind (lib/analysis/link.ts); the charts need the sample field. */
const metricField: Record<string, SeriesField> = { lq: "lqPct", "rssi-pct": "rssiPct", "rssi-dbm": "rssiDbm" };

/**
 * The judged link metric's chart field and title. RSSI read from the link sheet's channel is not a
 * column of the log: the analysis stores it as the derived field `rssiRcPct` in the display levels.
 */
export function linkChart(link: LinkInfo, fieldsPresent: readonly string[]): { field: SeriesField; title: string; label: string } | null {
  if (link.metric && link.source?.kind === "rc-channel") {
    return { field: "rssiRcPct", title: `RSSI from channel ${link.source.channel} — the link metric judged`, label: `RSSI (channel ${link.source.channel})` };
  }
  const field = link.metric ? metricField[link.metric] : undefined;
  if (!field || !fieldsPresent.includes(field)) return null;
  const label = linkLabels[field] ?? field;
  return { field, title: `${label} — the link metric judged`, label };
}

/**
 * Which charts a run gets: one per quantity the log carries, link first (with the fade threshold
 * the analysis used), then signal, height and speed, battery, and cross-track error with a plan.
 */
export function chartPanels(fieldsPresent: string[], hasPlan: boolean, link: LinkInfo, units: Units): ChartPanel[] {
  const has = (f: string) => fieldsPresent.includes(f);
  const panels: ChartPanel[] = [];
  const judged = linkChart(link, fieldsPresent);
  const metric = judged?.field ?? null;
  if (judged) {
    panels.push({
      id: "link",
      title: judged.title,
      unit: link.unit ?? "",
      series: [{ field: judged.field, label: judged.label }],
      thresholds: link.fadeThreshold != null ? [{ value: link.fadeThreshold, label: "fade threshold" }] : undefined,
      height: 170,
    });
  }
  if (has("rssiDbm") && metric !== "rssiDbm") panels.push({ id: "rssi", title: "RSSI", unit: "dBm", series: [{ field: "rssiDbm", label: "RSSI" }] });
  if (has("rssiPct") && metric !== "rssiPct") panels.push({ id: "rssi-pct", title: "RSSI", unit: "%", series: [{ field: "rssiPct", label: "RSSI" }] });
  if (has("snrDb") && metric !== "snrDb") panels.push({ id: "snr", title: "Signal-to-noise ratio", unit: "dB", series: [{ field: "snrDb", label: "SNR" }] });
  const len = lengthConversion(units);
  const spd = speedConversion(units);
  if (has("altM")) panels.push({ id: "altitude", title: "Altitude", unit: len.unit, series: [{ field: "altM", label: "Altitude" }] });
  if (has("speedMps")) panels.push({ id: "speed", title: "Ground speed", unit: spd.unit, series: [{ field: "speedMps", label: "Speed" }] });
  if (has("voltageV")) panels.push({ id: "voltage", title: "Battery voltage", unit: "V", series: [{ field: "voltageV", label: "Pack voltage" }] });
  if (has("currentA")) panels.push({ id: "current", title: "Current", unit: "A", series: [{ field: "currentA", label: "Current" }] });
  if (hasPlan && has("lat")) {
    panels.push({
      id: "xte",
      title: "Cross-track error (+ right of the leg)",
      unit: len.unit,
      series: [{ field: "xteM", label: "XTE" }],
      thresholds: [{ value: 0, label: "on the leg" }],
    });
  }
  return panels;
}

/** SI → display conversions for the fields that change with the units setting. */
export function panelConversions(units: Units): Partial<Record<SeriesField, (v: number) => number>> {
  const len = lengthConversion(units).convert;
  const spd = speedConversion(units).convert;
  if (!len || !spd) return {};
  return { altM: len, xteM: len, distanceFromHomeM: len, speedMps: spd };
}
