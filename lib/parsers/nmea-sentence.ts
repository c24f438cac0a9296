import { parseNmeaSentence } from "nmea-simple";

/** One nautical mile is 1852 m exactly, so 1 knot = 1852/3600 m/s ≈ 0.514444 m/s. */
export const KNOT_MPS = 1852 / 3600;

/** What one sentence contributes; NaN for a field the sentence leaves empty. `talker` is "GP", "GN", "GL", … */
export type NmeaSentence =
  | { kind: "gga"; talker: string; tod: number; lat: number; lon: number; quality: number; sats: number; hdop: number; altM: number }
  | { kind: "rmc"; talker: string; tod: number; dateMs: number | null; valid: boolean; lat: number; lon: number; speedMps: number; headingDeg: number }
  | { kind: "vtg"; speedMps: number; headingDeg: number }
  /** A well-formed sentence with a valid checksum that the sample stream does not use (GSA, GSV, GLL, ZDA, TXT, $P…). */
  | { kind: "other" }
  /** No `*hh` at the end: cut short, or run into the next sentence or into junk. */
  | { kind: "truncated" }
  /** `*hh` present but not the XOR of the sentence. */
  | { kind: "bad-checksum" }
  /** Valid checksum, but a malformed address or a GGA/RMC/VTG whose fields cannot be read. */
  | { kind: "unparsed" };

/** Talker + sentence id (`GPGGA`, `GNRMC`, `AIVDM`) or a proprietary `P` + maker code (`PUBX`, `PMTK001`). */
const ADDRESS = /^[$!](?:([A-Z][A-Z0-9])([A-Z]{3})|P[A-Z0-9]{3,})(?=,|\*)/;
/** The sentences the sample stream is built from; everything else well-formed is ignored. */
const USED = new Set(["GGA", "RMC", "VTG"]);

const WITH_CHECKSUM = /^[$!]([^*]*)\*([0-9A-Fa-f]{2})$/;

/**
 * Checks the NMEA 0183 checksum: the XOR of every character between the leading `$`/`!` and the
 * `*`, written as two hex digits after the `*`.
 *
 * @param sentence one sentence without line end, e.g. "$GPGGA,…*47"
 * @returns true when the checksum is present and matches
 * @example
 * nmeaChecksumOk("$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A"); // => true
 */
export function nmeaChecksumOk(sentence: string): boolean {
  const m = WITH_CHECKSUM.exec(sentence);
  if (!m) return false;
  let x = 0;
  for (let i = 0; i < m[1].length; i++) x ^= m[1].charCodeAt(i);
  return x === parseInt(m[2], 16);
}

/**
 * Decodes one sentence with nmea-simple and keeps what the sample stream needs. nmea-simple turns
 * empty fields into 0 (and GGA's time into today's date), so emptiness and the time/date fields
 * are read from the raw fields here; an empty field becomes NaN, never 0.
 *
 * - GGA: time of day, lat/lon (°), fix quality (the GGA code 0–8), satellites used, HDOP,
 *   altitude above mean sea level (m). Quality 0 (no fix) leaves lat/lon/alt empty.
 * - RMC: time of day, date (epoch ms of that UTC midnight; yy ≥ 80 → 19yy), status, lat/lon,
 *   speed (knots → m/s), course (° true). Status V (receiver warning) leaves position and motion empty.
 * - VTG: course (° true) and speed (km/h → m/s, else knots → m/s); FAA mode N (not valid) leaves both empty.
 *
 * @param sentence one sentence without line end or leading junk, starting at `$` or `!`
 * @returns the decoded contribution, or "truncated" / "bad-checksum" / "unparsed" (damaged) / "other" (not used)
 * @example
 * decodeNmeaSentence("$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47").kind; // => "gga"
 */
export function decodeNmeaSentence(sentence: string): NmeaSentence {
  if (!/\*[0-9A-Fa-f]{2}$/.test(sentence)) return { kind: "truncated" };
  if (!nmeaChecksumOk(sentence)) return { kind: "bad-checksum" };
  const address = ADDRESS.exec(sentence);
  if (!address) return { kind: "unparsed" }; // e.g. "$GPN,…" left over from a damaged line
  if (!address[2] || !USED.has(address[2])) return { kind: "other" };
  const talker = address[1];
  let packet;
  try {
    packet = parseNmeaSentence(sentence);
  } catch {
    return { kind: "unparsed" }; // fields the library cannot read
  }
  const f = sentence.slice(0, sentence.indexOf("*")).split(",");
  const num = (i: number, v: number) => (f[i] === undefined || f[i].trim() === "" || !Number.isFinite(v) ? NaN : v);
  switch (packet.sentenceId) {
    case "GGA": {
      const quality = /^\d$/.test(f[6] ?? "") ? Number(f[6]) : NaN;
      const fix = quality !== 0;
      return {
        kind: "gga",
        talker,
        tod: timeOfDay(f[1]),
        lat: fix ? num(2, packet.latitude) : NaN,
        lon: fix ? num(4, packet.longitude) : NaN,
        quality,
        sats: num(7, packet.satellitesInView),
        hdop: num(8, packet.horizontalDilution),
        altM: fix ? num(9, packet.altitudeMeters) : NaN,
      };
    }
    case "RMC": {
      const valid = packet.status === "valid";
      return {
        kind: "rmc",
        talker,
        tod: timeOfDay(f[1]),
        dateMs: utcMidnight(f[9]),
        valid,
        lat: valid ? num(3, packet.latitude) : NaN,
        lon: valid ? num(5, packet.longitude) : NaN,
        speedMps: valid ? num(7, packet.speedKnots) * KNOT_MPS : NaN,
        headingDeg: valid ? num(8, packet.trackTrue) : NaN,
      };
    }
    case "VTG": {
      if (packet.faaMode === "N") return { kind: "vtg", speedMps: NaN, headingDeg: NaN };
      const kmh = num(7, packet.speedKmph ?? NaN);
      return {
        kind: "vtg",
        speedMps: Number.isNaN(kmh) ? num(5, packet.speedKnots) * KNOT_MPS : kmh / 3.6,
        headingDeg: num(1, packet.trackTrue),
      };
    }
    default:
      return { kind: "other" };
  }
}

/**
 * NMEA time field "hhmmss" or "hhmmss.sss" → seconds since UTC midnight; NaN when empty or invalid.
 * @example
 * timeOfDay("123519.50"); // => 45319.5
 */
export function timeOfDay(field: string | undefined): number {
  const m = /^(\d{2})(\d{2})(\d{2}(?:\.\d*)?)$/.exec(field?.trim() ?? "");
  if (!m) return NaN;
  const [h, min, s] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (h > 23 || min > 59 || s >= 61) return NaN; // 60.x allowed for a leap second
  return h * 3600 + min * 60 + s;
}

/** "ddmmyy" → epoch ms of that UTC midnight; null when empty or invalid. */
function utcMidnight(field: string | undefined): number | null {
  const m = /^(\d{2})(\d{2})(\d{2})$/.exec(field?.trim() ?? "");
  if (!m) return null;
  const [day, month, yy] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (month < 1 || month > 12 || day < 1 || day > 31) return null;
  // GPS time began in 1980; RMC carries no century.
  const ms = Date.UTC(yy >= 80 ? 1900 + yy : 2000 + yy, month - 1, day);
  return new Date(ms).getUTCDate() === day ? ms : null; // 31 April would roll into May
}
