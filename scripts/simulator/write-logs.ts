import type { SimSample } from "./simulate-run";

export const csvHeader = [
  "time_s", "latitude", "longitude", "altitude_m", "ground_speed_ms", "heading_deg", "gps_sats", "hdop", "fix", "rssi_dbm",
  "link_quality", "snr_db", "battery_v", "current_a", "used_mah", "mode", "armed", "failsafe",
  "ch1", "ch2", "ch3", "ch4", "ch5", "ch6", "ch7", "ch8",
];

const n = (v: number, d: number) => (Number.isFinite(v) ? v.toFixed(d) : "");

/** The simulator's telemetry CSV (comma, dot decimals, one header row). */
export function toCsv(samples: SimSample[]): string {
  const rows = samples.map((s) =>
    [
      n(s.t, 2), n(s.lat, 7), n(s.lon, 7), n(s.alt, 1), n(s.speed, 2), n(s.heading, 1), s.sats, n(s.hdop, 2), s.fix, n(s.rssiDbm, 1),
      s.lq, n(s.snr, 1), n(s.voltage, 2), n(s.current, 2), n(s.usedMah, 1), s.mode, s.armed ? 1 : 0, s.failsafe ? 1 : 0, ...s.ch,
    ].join(","),
  );
  return [csvHeader.join(","), ...rows].join("\n") + "\n";
}

const iso = (start: Date, t: number) => new Date(start.getTime() + Math.round(t * 1000)).toISOString();

/** A GPX 1.1 track sampled once a second, with satellites and HDOP per point. */
export function toGpx(samples: SimSample[], start: Date, name: string): string {
  const pts = samples
    .filter((s) => Math.abs(s.t - Math.round(s.t)) < 1e-6)
    .map(
      (s) =>
        `      <trkpt lat="${s.lat.toFixed(7)}" lon="${s.lon.toFixed(7)}"><ele>${s.alt.toFixed(1)}</ele><time>${iso(start, s.t)}</time>` +
        `<fix>3d</fix><sat>${s.sats}</sat><hdop>${s.hdop.toFixed(2)}</hdop></trkpt>`,
    )
    .join("\n");
  return gpxDocument("Sortie demo simulator", name, start, pts);
}

/** NMEA 0183 checksum: XOR of every character between "$" and "*" (two hex digits). */
export function nmeaChecksum(body: string): string {
  let x = 0;
  for (let i = 0; i < body.length; i++) x ^= body.charCodeAt(i);
  return x.toString(16).toUpperCase().padStart(2, "0");
}

function dm(value: number, degDigits: number, pos: string, neg: string): string {
  const a = Math.abs(value);
  const d = Math.floor(a);
  const m = (a - d) * 60;
  return `${String(d).padStart(degDigits, "0")}${m.toFixed(4).padStart(7, "0")},${value >= 0 ? pos : neg}`;
}

/** GGA + RMC once a second, as a GPS receiver's serial log would hold them. */
export function toNmea(samples: SimSample[], start: Date): string {
  const lines: string[] = [];
  for (const s of samples) {
    if (Math.abs(s.t - Math.round(s.t)) > 1e-6) continue;
    const d = new Date(start.getTime() + Math.round(s.t * 1000));
    const hh = String(d.getUTCHours()).padStart(2, "0");
    const mi = String(d.getUTCMinutes()).padStart(2, "0");
    const ss = String(d.getUTCSeconds()).padStart(2, "0");
    const time = `${hh}${mi}${ss}.00`;
    const date = `${String(d.getUTCDate()).padStart(2, "0")}${String(d.getUTCMonth() + 1).padStart(2, "0")}${String(d.getUTCFullYear() % 100).padStart(2, "0")}`;
    const lat = dm(s.lat, 2, "N", "S");
    const lon = dm(s.lon, 3, "E", "W");
    const gga = `GPGGA,${time},${lat},${lon},1,${String(s.sats).padStart(2, "0")},${s.hdop.toFixed(1)},${s.alt.toFixed(1)},M,50.1,M,,`;
    const rmc = `GPRMC,${time},A,${lat},${lon},${(s.speed / (1852 / 3600)).toFixed(2)},${s.heading.toFixed(1)},${date},,,A`;
    lines.push(`$${gga}*${nmeaChecksum(gga)}`, `$${rmc}*${nmeaChecksum(rmc)}`);
  }
  return lines.join("\r\n") + "\r\n";
}

// ---- Writers for practice-shaped logs (scripts/simulator/practice/) ---------------------------

/** One CSV column written from any sample shape: its header and its text per sample ("" = empty). */
export interface CsvColumn<S> {
  header: string;
  text: (s: S) => string;
}

/** A number with `digits` decimals, or "" when it is not finite (the cell stays empty). */
export const fixedOrEmpty = n;

/** A CSV with exactly the given columns (comma, dot decimals, one header row, LF). */
export function toColumnsCsv<S>(samples: S[], columns: CsvColumn<S>[]): string {
  const rows = samples.map((s) => columns.map((c) => c.text(s)).join(","));
  return [columns.map((c) => c.header).join(","), ...rows].join("\n") + "\n";
}

/** One GPX track point; satellites, HDOP and fix are written only when given. */
export interface GpxTrackPoint {
  t: number;
  lat: number;
  lon: number;
  alt?: number;
  sats?: number;
  hdop?: number;
  fix?: "none" | "2d" | "3d";
}

/** A GPX 1.1 track of every given point (no link data: GPX has no element for it). */
export function toTrackGpx(points: GpxTrackPoint[], start: Date, name: string): string {
  const pts = points
    .map((p) => {
      const extra = [
        p.alt !== undefined ? `<ele>${p.alt.toFixed(1)}</ele>` : "",
        `<time>${iso(start, p.t)}</time>`,
        p.fix !== undefined ? `<fix>${p.fix}</fix>` : "",
        p.sats !== undefined ? `<sat>${p.sats}</sat>` : "",
        p.hdop !== undefined ? `<hdop>${p.hdop.toFixed(2)}</hdop>` : "",
      ].join("");
      return `      <trkpt lat="${p.lat.toFixed(7)}" lon="${p.lon.toFixed(7)}">${extra}</trkpt>`;
    })
    .join("\n");
  return gpxDocument("Sortie practice simulator", name, start, pts);
}

/** A GPX 1.1 document holding one track of one segment (`pts`: its <trkpt> lines). */
function gpxDocument(creator: string, name: string, start: Date, pts: string): string {
  return `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="${creator}" xmlns="http://www.topografix.com/GPX/1/1">
  <metadata><name>${name}</name><time>${start.toISOString()}</time></metadata>
  <trk><name>${name}</name>
    <trkseg>
${pts}
    </trkseg>
  </trk>
</gpx>
`;
}
