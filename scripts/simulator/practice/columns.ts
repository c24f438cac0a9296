/**
 * The CSV columns a practice log may carry, with generic header words the column-map detection
 * knows. A scenario picks the columns its logger would have written (a bench log has no position,
 * a receiver without telemetry has RSSI only on an RC channel, …).
 */
import { fixedOrEmpty as f, type CsvColumn } from "../write-logs";
import type { PracticeSample } from "./sample";

type Col = CsvColumn<PracticeSample>;

const int = (v: number) => (Number.isFinite(v) ? String(Math.round(v)) : "");

export const COLUMNS = {
  time: { header: "time_s", text: (s) => f(s.t, 2) },
  lat: { header: "latitude", text: (s) => f(s.lat, 7) },
  lon: { header: "longitude", text: (s) => f(s.lon, 7) },
  alt: { header: "altitude_m", text: (s) => f(s.altM, 1) },
  speed: { header: "ground_speed_ms", text: (s) => f(s.speedMps, 2) },
  sats: { header: "gps_sats", text: (s) => int(s.sats) },
  hdop: { header: "hdop", text: (s) => f(s.hdop, 2) },
  fix: { header: "fix", text: (s) => int(s.fix) },
  rssiPct: { header: "rssi_pct", text: (s) => f(s.rssiPct, 1) },
  lq: { header: "link_quality", text: (s) => int(s.lqPct) },
  voltage: { header: "battery_v", text: (s) => f(s.voltageV, 3) },
  current: { header: "current_a", text: (s) => f(s.currentA, 2) },
  mode: { header: "mode", text: (s) => s.mode },
  armed: { header: "armed", text: (s) => (s.armed ? "1" : "0") },
} satisfies Record<string, Col>;

export type ColumnName = keyof typeof COLUMNS;

/** RC channel `ch` (1–18) in µs, header "chN". */
export function rcColumn(ch: number): Col {
  return { header: `ch${ch}`, text: (s) => int(s.rc[ch - 1]) };
}

/** The columns named, then the RC channels listed, in that order. */
export function columns(names: readonly ColumnName[], rcChannels: readonly number[] = []): Col[] {
  return [...names.map((k) => COLUMNS[k] as Col), ...rcChannels.map(rcColumn)];
}
