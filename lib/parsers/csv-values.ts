/**
 * Reading single CSV values and converting them into the sample units of types.ts.
 * The conversion factors are exact by definition, not measured.
 */

/** 1 ft = 0.3048 m exactly (International Yard and Pound Agreement, 1959; NIST SP 811 App. B). */
export const M_PER_FT = 0.3048;
/** 1 mph = 0.44704 m/s exactly (follows from the 1959 yard; NIST SP 811 App. B). */
export const MPS_PER_MPH = 0.44704;
/** 1 kn = 1852 m/h (BIPM SI Brochure, 9th ed., Table 8). */
export const MPS_PER_KN = 1852 / 3600;
/** 1 km/h = 1000 m / 3600 s. */
export const MPS_PER_KMH = 1 / 3.6;

const DOT_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const COMMA_NUMBER = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const SPECIAL = /^([+-]?)(nan|inf|infinity)$/i;

const POW10 = Array.from({ length: 23 }, (_, k) => 10 ** k); // 10^0 … 10^22, all exact doubles
const MAX_EXACT = 2 ** 53;

/**
 * Plain decimals ("-12.345", "7", ",5" with a comma mark) read without a general conversion.
 * Clinger's fast path (W. D. Clinger, "How to Read Floating Point Numbers Accurately", PLDI 1990,
 * §3): when the digits form an integer below 2^53 and at most 22 of them follow the mark, one
 * IEEE division of two exact doubles is correctly rounded, so the result equals Number(text).
 * @returns NaN when the text is anything else (the caller then takes the general path).
 */
function plainDecimal(text: string, mark: number): number {
  const n = text.length;
  let i = 0;
  let c = text.charCodeAt(0);
  const negative = c === 45;
  if (negative || c === 43) i = 1;
  let m = 0;
  let digits = 0;
  let scale = -1;
  for (; i < n; i++) {
    c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      m = m * 10 + (c - 48);
      digits++;
    } else if (c === mark && scale < 0) scale = digits;
    else return NaN;
  }
  if (digits === 0 || m >= MAX_EXACT) return NaN;
  const places = scale < 0 ? 0 : digits - scale;
  if (places > 22) return NaN;
  const v = places ? m / POW10[places] : m;
  return negative ? -v : v;
}

/**
 * Reads a decimal number written with "." or "," as the decimal mark.
 * "nan", "inf" and "infinity" (any case, signed) give NaN or ±Infinity; anything else that is not
 * a plain decimal number (thousands separators, units, text) gives null.
 * @example parseNumber("12,5", ",") // 12.5
 */
export function parseNumber(text: string, decimal: "." | ","): number | null {
  const fast = plainDecimal(text, decimal === "." ? 46 : 44);
  if (fast === fast) return fast;
  // Fast path for the common case (plain dot-decimal numbers): Number() accepts the same forms as
  // DOT_NUMBER except hex/octal/binary prefixes ("0x…", letter at index 1), blank text (→ 0) and
  // "Infinity" (not finite), which fall through to the full check below.
  if (decimal === ".") {
    const c1 = text.charCodeAt(1) | 32;
    // Leading blanks would hide a radix prefix from the check on character 1.
    if (c1 !== 120 && c1 !== 111 && c1 !== 98 && text.charCodeAt(0) > 32) {
      const v = Number(text);
      if (v - v === 0 && (v !== 0 || text.trim() !== "")) return v;
    }
  }
  const s = text.trim();
  if (decimal === "." ? DOT_NUMBER.test(s) : COMMA_NUMBER.test(s)) {
    return Number(decimal === "," ? s.replace(",", ".") : s);
  }
  const special = SPECIAL.exec(s);
  if (special) return special[2].toLowerCase() === "nan" ? NaN : special[1] === "-" ? -Infinity : Infinity;
  return null;
}

const TRUE_WORDS = new Set(["1", "true", "yes", "on", "armed", "y", "t"]);
const FALSE_WORDS = new Set(["0", "false", "no", "off", "disarmed", "n", "f"]);

/**
 * Reads an on/off flag: 1/0, true/false, yes/no, on/off, armed/disarmed (any case).
 * @returns 1, 0, or null for anything else.
 * @example parseFlag("Disarmed") // 0
 */
export function parseFlag(text: string): 1 | 0 | null {
  const s = text.trim().toLowerCase();
  if (TRUE_WORDS.has(s)) return 1;
  if (FALSE_WORDS.has(s)) return 0;
  return null;
}

/**
 * Altitude in metres.
 * @example altitudeToM(1000, "ft") // 304.8
 */
export function altitudeToM(value: number, unit: string | undefined): number {
  return unit === "ft" ? value * M_PER_FT : value;
}

/**
 * Ground speed in m/s from m/s, km/h, kn or mph.
 * @example speedToMps(36, "km/h") // 10
 */
export function speedToMps(value: number, unit: string | undefined): number {
  switch (unit) {
    case "km/h":
      return value / 3.6;
    case "kn":
      return (value * 1852) / 3600;
    case "mph":
      return value * MPS_PER_MPH;
    default:
      return value;
  }
}

/**
 * RSSI read from a PWM channel: 1000 µs is 0 %, 2000 µs is 100 %, clamped to 0–100.
 * @example pwmToPct(1500) // 50
 */
export function pwmToPct(us: number): number {
  return Math.min(100, Math.max(0, (us - 1000) / 10));
}

/**
 * Battery current in amperes from A or mA.
 * @example currentToA(1500, "mA") // 1.5
 */
export function currentToA(value: number, unit: string | undefined): number {
  return unit === "mA" ? value / 1000 : value;
}

/**
 * A course in degrees folded into 0–360 (a yaw of −90° is 270°).
 * @example headingTo360(-90) // 270
 */
export function headingTo360(deg: number): number {
  const h = deg % 360;
  return h < 0 ? h + 360 : h;
}
