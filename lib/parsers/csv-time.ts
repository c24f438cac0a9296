import { parseNumber } from "./csv-values";

/**
 * Time values as CSV logs write them. A time is kept as whole seconds plus a fraction so that
 * differences between epoch times keep their sub-millisecond digits.
 */
export interface TimeParts {
  /** Whole seconds (epoch seconds for ISO 8601, seconds of the day for clock times). */
  whole: number;
  /** Fraction of a second, 0 ≤ frac < 1. */
  frac: number;
}

// ISO 8601-1:2019 extended format / RFC 3339 §5.6: date, "T" or space, time, optional fraction
// ("." or ","), optional offset "Z" or ±hh:mm (±hhmm and ±hh accepted as ISO 8601 allows).
const ISO = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2}):(\d{2})(?:[.,](\d{1,9}))?\s*(Z|[+-]\d{2}(?::?\d{2})?)?$/i;
const CLOCK = /^(\d{1,2}):(\d{2}):(\d{2})(?:[.,](\d{1,9}))?$/;

/**
 * True when the text looks like an ISO 8601 date-time (used to guess the unit).
 * @example looksIso("2024-05-01T12:00:00Z") // true
 */
export function looksIso(text: string): boolean {
  return ISO.test(text.trim());
}

/**
 * True when the text looks like a clock time hh:mm:ss(.sss).
 * @example looksClock("12:34:56.789") // true
 */
export function looksClock(text: string): boolean {
  return CLOCK.test(text.trim());
}

function fraction(digits: string | undefined): number {
  return digits ? Number(`0.${digits}`) : 0;
}

/**
 * Reads an ISO 8601 / RFC 3339 date-time. The offset is subtracted so `whole` is UTC epoch
 * seconds; a time without an offset is read as UTC and `hasOffset` is false.
 * @returns null when the text is not such a date-time or a part is out of range (month 13, 25:00…).
 * @example parseIsoTime("2024-05-01T12:00:00.25+02:00") // { whole: 1714557600, frac: 0.25, hasOffset: true }
 */
export function parseIsoTime(text: string): (TimeParts & { hasOffset: boolean }) | null {
  const m = ISO.exec(text.trim());
  if (!m) return null;
  const [y, mo, d, h, mi, s] = m.slice(1, 7).map(Number);
  const daysInMonth = new Date(Date.UTC(y, mo, 0)).getUTCDate();
  if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth || h > 24 || mi > 59 || s > 60) return null;
  if (h === 24 && (mi !== 0 || s !== 0 || m[7] && Number(m[7]) !== 0)) return null;
  let offsetS = 0;
  const off = m[8];
  if (off && off.toUpperCase() !== "Z") {
    const oh = Number(off.slice(1, 3));
    const om = off.length > 3 ? Number(off.slice(-2)) : 0;
    if (oh > 23 || om > 59) return null;
    offsetS = (off[0] === "-" ? -1 : 1) * (oh * 3600 + om * 60);
  }
  const whole = Date.UTC(y, mo - 1, d, h, mi, s) / 1000 - offsetS;
  return { whole, frac: fraction(m[7]), hasOffset: Boolean(off) };
}

/**
 * Reads a clock time hh:mm:ss with an optional fraction into seconds of the day.
 * @returns null when it is not a clock time or a part is out of range.
 * @example parseClockTime("23:59:59.5") // { whole: 86399, frac: 0.5 }
 */
export function parseClockTime(text: string): TimeParts | null {
  const m = CLOCK.exec(text.trim());
  if (!m) return null;
  const [h, mi, s] = m.slice(1, 4).map(Number);
  if (h > 23 || mi > 59 || s > 60) return null;
  return { whole: h * 3600 + mi * 60 + s, frac: fraction(m[4]) };
}

const DAY_S = 86_400;
// Epoch seconds between 2000-01-01 and 2100-01-01: a numeric time there is a date, not a run clock.
const EPOCH_MIN_S = 946_684_800;
const EPOCH_MAX_S = 4_102_444_800;

/**
 * Turns the time column of successive rows into seconds from the first row, in one unit
 * ("s", "ms", "iso" or "clock"). Clock times roll over at midnight: a step back of more than
 * 12 h is read as the next day.
 * @example const r = new TimeReader("clock", "."); r.read("23:59:59"); r.read("00:00:01") // 2
 */
export class TimeReader {
  private first: TimeParts | null = null;
  private lastAbs = NaN;
  private dayOffset = 0;
  /** Absolute time of the first row when the values carry dates; null otherwise. */
  startedAt: Date | null = null;
  /** False when an ISO time without offset was read (it is taken as UTC). */
  allOffsets = true;

  constructor(
    readonly unit: string,
    private readonly decimal: "." | ",",
  ) {}

  private parts(text: string): TimeParts | null {
    if (this.unit === "iso") {
      const p = parseIsoTime(text);
      if (p && !p.hasOffset) this.allOffsets = false;
      return p;
    }
    if (this.unit === "clock") {
      const p = parseClockTime(text);
      if (!p) return null;
      const abs = p.whole + p.frac + this.dayOffset;
      if (abs < this.lastAbs - DAY_S / 2) this.dayOffset += DAY_S;
      this.lastAbs = p.whole + p.frac + this.dayOffset;
      return { whole: p.whole + this.dayOffset, frac: p.frac };
    }
    const v = parseNumber(text, this.decimal);
    if (v === null || !Number.isFinite(v)) return null;
    // Split so that e.g. 1714557600123 ms − 1714557600000 ms is exactly 0.123 s.
    const whole = this.unit === "ms" ? Math.floor(v / 1000) : Math.floor(v);
    return { whole, frac: this.unit === "ms" ? (v - whole * 1000) / 1000 : v - whole };
  }

  /**
   * Seconds from the first row's time, or NaN when the text is not a time in this unit.
   * @example new TimeReader("ms", ".").read("1500") // 0 (first row), then read("2000") // 0.5
   */
  read(text: string): number {
    const p = this.parts(text);
    if (!p) return NaN;
    if (!this.first) {
      this.first = p;
      this.startedAt = this.absolute(p);
      return 0;
    }
    return p.whole - this.first.whole + (p.frac - this.first.frac);
  }

  private absolute(p: TimeParts): Date | null {
    if (this.unit === "iso") return new Date(p.whole * 1000 + Math.floor(p.frac * 1000));
    if ((this.unit === "s" || this.unit === "ms") && p.whole >= EPOCH_MIN_S && p.whole < EPOCH_MAX_S) {
      return new Date(Math.round(p.whole * 1000));
    }
    return null;
  }
}
