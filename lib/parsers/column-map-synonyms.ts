import type { CsvField } from "./column-map";

/**
 * Generic header words for each field. Keys are normalised: lower case, no spaces, underscores
 * or punctuation ("GPS_Sats" → "gpssats"). The number is how sure a match makes us (0–1):
 * short or ambiguous words ("t", "yaw", "fs") count for less.
 */
const synonyms: Record<string, [CsvField, number]> = {};

function add(field: CsvField, strength: number, words: string[]): void {
  for (const w of words) synonyms[w] = [field, strength];
}

add("time", 0.95, ["time", "timestamp", "datetime", "clock", "gpstime", "timeutc", "utctime", "elapsed", "elapsedtime", "timeofday"]);
add("time", 0.85, ["t", "ts", "utc", "date"]);
add("lat", 0.95, ["lat", "latitude", "gpslat", "gpslatitude", "poslat"]);
add("lon", 0.95, ["lon", "lng", "longitude", "gpslon", "gpslng", "gpslong", "gpslongitude", "poslon"]);
add("lon", 0.9, ["long"]);
add("alt", 0.95, ["alt", "altitude", "ele", "elevation", "gpsalt", "gpsaltitude", "altmsl"]);
add("alt", 0.9, ["height"]);
add("speed", 0.95, ["speed", "gspd", "groundspeed", "gpsspeed", "gndspeed", "sog"]);
add("speed", 0.85, ["vel", "velocity", "spd"]);
add("heading", 0.95, ["heading", "course", "hdg", "cog", "gpscourse", "gpsheading"]);
add("heading", 0.8, ["track"]);
add("heading", 0.6, ["yaw"]);
add("sats", 0.95, ["sats", "satellites", "numsat", "numsats", "gpssats", "satcount", "nsats", "sat", "gpsnumsat"]);
add("hdop", 0.95, ["hdop", "gpshdop"]);
add("fix", 0.95, ["fix", "fixtype", "gpsfix", "gpsfixtype"]);
add("rssi", 0.95, ["rssi", "rssidbm", "rxrssi", "rssipct", "rxrssidbm", "rssipercent", "linkrssi"]);
add("lq", 0.95, ["lq", "linkquality", "linkq", "rxquality", "rxlq", "lqpct", "uplinklq"]);
add("snr", 0.95, ["snr", "rxsnr", "snrdb", "uplinksnr"]);
add("voltage", 0.95, ["volt", "volts", "voltage", "vbat", "batteryv", "batv", "packv", "batteryvoltage", "batvoltage", "packvoltage", "vbatt"]);
add("current", 0.95, ["current", "curr", "amps", "batterya", "batterycurrent", "batcurrent", "ibat"]);
add("usedMah", 0.95, ["mah", "usedmah", "consumed", "consumedmah", "mahused", "batteryused"]);
add("usedMah", 0.8, ["capacity"]);
add("mode", 0.95, ["mode", "flightmode", "drivemode", "fltmode", "navmode"]);
add("armed", 0.95, ["armed", "armstate", "isarmed", "armedstate"]);
add("armed", 0.85, ["arm"]);
add("failsafe", 0.95, ["failsafe", "rxfailsafe", "failsafestate", "rcfailsafe"]);
add("failsafe", 0.8, ["fs"]);
for (let ch = 1; ch <= 18; ch++) {
  const field = `rc${ch}` as CsvField;
  add(field, 0.95, [`ch${ch}`, `rc${ch}`, `channel${ch}`, `rcch${ch}`, `rcchannel${ch}`, `rcin${ch}`]);
}

/** Trailing header words that name a unit rather than the quantity ("time_ms", "alt (ft)"). */
const unitWords = new Set([
  "s", "sec", "secs", "seconds", "ms", "msec", "millis", "us", "m", "meters", "metres", "ft", "feet",
  "kmh", "kph", "kn", "kt", "kts", "knots", "mph", "mps", "deg", "degrees", "db", "dbm", "pct", "percent",
  "v", "volts", "a", "amps", "ma", "mah", "utc", "iso", "pwm",
]);

/**
 * Splits a header into lower-case words, spelling out unit symbols so they survive.
 * @example headerWords("groundSpeed (km/h)") // ["ground", "speed", "kmh"]
 */
export function headerWords(header: string): string[] {
  const s = header
    .trim()
    .replace(/([a-z]{2,}|[0-9])([A-Z])/g, "$1 $2")
    .toLowerCase()
    .replace(/°/g, " deg ")
    .replace(/[µμ]s/g, " us ")
    .replace(/km\/h/g, " kmh ")
    .replace(/m\/s/g, " mps ")
    .replace(/%/g, " pct ");
  return s.split(/[^a-z0-9]+/).filter(Boolean);
}

export interface HeaderMatch {
  field: CsvField;
  /** 0–1, how strongly the words alone suggest the field. */
  strength: number;
  /** Unit words that followed the matched name, e.g. ["ms"] for "time_ms". */
  unitWords: string[];
}

/**
 * Matches a header to a field by generic words, ignoring case, spacing, punctuation and a
 * trailing unit. Tries the shortest name first so "altitude_m" reads as altitude in metres.
 * @example matchHeader("Ground Speed (km/h)") // { field: "speed", strength: 0.95, unitWords: ["kmh"] }
 */
export function matchHeader(header: string): HeaderMatch | null {
  const words = headerWords(header);
  let trailing = 0;
  while (trailing < words.length && unitWords.has(words[words.length - 1 - trailing])) trailing++;
  for (let k = trailing; k >= 0; k--) {
    const name = words.slice(0, words.length - k).join("");
    const hit = name ? synonyms[name] : undefined;
    if (hit) return { field: hit[0], strength: hit[1], unitWords: words.slice(words.length - k) };
  }
  return null;
}

/**
 * The unit a header's trailing words name for a field, if any ("ms" is m/s for speed, milliseconds for time).
 * @example unitFromWords("speed", ["ms"]) // "m/s"
 */
export function unitFromWords(field: CsvField, words: string[]): string | undefined {
  const has = (...w: string[]) => words.some((x) => w.includes(x));
  switch (field) {
    case "time":
      if (has("ms", "msec", "millis")) return "ms";
      if (has("s", "sec", "secs", "seconds")) return "s";
      return undefined;
    case "alt":
      if (has("ft", "feet")) return "ft";
      if (has("m", "meters", "metres")) return "m";
      return undefined;
    case "speed":
      if (has("kmh", "kph")) return "km/h";
      if (has("kn", "kt", "kts", "knots")) return "kn";
      if (has("mph")) return "mph";
      if (has("mps", "ms")) return "m/s";
      return undefined;
    case "rssi":
      if (has("dbm")) return "dBm";
      if (has("pct", "percent")) return "%";
      if (has("pwm", "us")) return "pwm";
      return undefined;
    case "current":
      if (has("ma")) return "mA";
      if (has("a", "amps")) return "A";
      return undefined;
    default:
      return undefined;
  }
}
