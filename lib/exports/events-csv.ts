/**
 * A run's events as CSV (RFC 4180: comma, CRLF, quoted text). Text cells are defused against
 * formula injection as OWASP's "CSV Injection" page advises: a cell starting with = + - @ tab or
 * CR gets a leading apostrophe, and every text cell is quoted with inner quotes doubled, so a
 * separator inside it cannot start a new cell. Numbers are written as plain numbers, never escaped
 * (a leading minus there is a sign, not a formula). A UTF-8 BOM lets spreadsheets read names in
 * other scripts correctly.
 */
import { decimal } from "./track-points";

export interface CsvEvent {
  kind: string;
  startS: number;
  endS: number;
  peak: number | null;
  threshold: number | null;
  lat: number | null;
  lon: number | null;
  distanceFromHomeM: number | null;
  detail: Record<string, unknown> | null;
}

export const EVENTS_CSV_HEADER = ["kind", "start_s", "end_s", "duration_s", "peak", "threshold", "unit", "lat", "lon", "distance_from_home_m", "waypoint"] as const;

const FORMULA_START = /^[=+\-@\t\r]/;

/** One text cell, defused and quoted. */
export function csvText(s: string): string {
  const safe = FORMULA_START.test(s) ? `'${s}` : s;
  return `"${safe.replace(/"/g, '""')}"`;
}

/** One number cell: empty when missing, else a plain decimal (no exponent notation). */
export function csvNumber(v: number | null | undefined, digits = 3): string {
  if (v === null || v === undefined || !(v - v === 0) || Math.abs(v) >= 1e15) return "";
  return decimal(v, digits);
}

const str = (v: unknown) => (typeof v === "string" && v ? v : null);

/** The waypoint an event concerns, or for off-route the leg ("A → B"); user text, so escaped. */
function waypointOf(e: CsvEvent): string | null {
  const d = e.detail ?? {};
  const wp = str(d.waypoint);
  if (wp) return wp;
  const from = str(d.from);
  const to = str(d.to);
  return from && to ? `${from} → ${to}` : null;
}

export function eventsCsvRow(e: CsvEvent): string {
  const unit = str(e.detail?.unit);
  const wp = waypointOf(e);
  return [
    csvText(e.kind),
    csvNumber(e.startS),
    csvNumber(e.endS),
    csvNumber(e.endS - e.startS),
    csvNumber(e.peak),
    csvNumber(e.threshold),
    unit === null ? "" : csvText(unit),
    csvNumber(e.lat, 7),
    csvNumber(e.lon, 7),
    csvNumber(e.distanceFromHomeM, 1),
    wp === null ? "" : csvText(wp),
  ].join(",");
}

export function writeEventsCsv(events: Iterable<CsvEvent>): string {
  const lines = [EVENTS_CSV_HEADER.join(",")];
  for (const e of events) lines.push(eventsCsvRow(e));
  return "\uFEFF" + lines.join("\r\n") + "\r\n";
}
