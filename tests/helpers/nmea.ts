/**
 * Hand-written NMEA 0183 sentences for tests. The checksum is computed here by its definition
 * (NMEA 0183: two hex digits, the XOR of every character between `$` and `*`), independently of
 * lib/parsers, so a test never depends on the code it checks.
 */
export function xorChecksum(body: string): string {
  let x = 0;
  for (const ch of body) x ^= ch.charCodeAt(0);
  return x.toString(16).toUpperCase().padStart(2, "0");
}

/** `$` + body + `*` + checksum. */
export const sentence = (body: string) => `$${body}*${xorChecksum(body)}`;

/** A GGA with a fix (quality 1 unless given) at `time` (hhmmss.ss) near 48.1173 N, 11.5167 E. */
export const gga = (time: string, o: { talker?: string; quality?: number; sats?: string; hdop?: string; lat?: string; lon?: string } = {}) =>
  sentence(`${o.talker ?? "GP"}GGA,${time},${o.lat ?? "4807.038"},N,${o.lon ?? "01131.000"},E,${o.quality ?? 1},${o.sats ?? "08"},${o.hdop ?? "0.9"},545.4,M,46.9,M,,`);

/** An RMC at `time` on `date` (ddmmyy), status A unless given, 22.4 kn at 84.4°. */
export const rmc = (time: string, date: string, o: { talker?: string; status?: "A" | "V"; lat?: string; lon?: string } = {}) =>
  sentence(`${o.talker ?? "GP"}RMC,${time},${o.status ?? "A"},${o.lat ?? "4807.038"},N,${o.lon ?? "01131.000"},E,022.4,084.4,${date},,`);
