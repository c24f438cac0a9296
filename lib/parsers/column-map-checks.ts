import type { CsvField } from "./column-map";
import { parseFlag, parseNumber } from "./csv-values";
import { looksClock, looksIso, TimeReader } from "./csv-time";

/** What the first rows say about a column that a header matched to a field. */
export interface ColumnCheck {
  /** Unit chosen (from the header's unit words, else from the values); undefined = field default. */
  unit?: string;
  /** Share of the non-empty sample values that fit the field, 0–1. */
  plausible: number;
  /** True when the unit came from the values alone. */
  unitGuessed: boolean;
  problem?: string;
}

type Num = number | null;

function share(values: Num[], ok: (n: number) => boolean): number {
  if (!values.length) return 0;
  return values.filter((n) => n !== null && Number.isFinite(n) && ok(n)).length / values.length;
}

function outside(header: string, values: Num[], p: number, what: string): string | undefined {
  if (p >= 1) return undefined;
  const bad = Math.round((1 - p) * values.length);
  return `Column "${header}": ${bad} of ${values.length} values in the first rows are not ${what}`;
}

const between = (lo: number, hi: number) => (n: number) => n >= lo && n <= hi;
const integerBetween = (lo: number, hi: number) => (n: number) => Number.isInteger(n) && n >= lo && n <= hi;

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.floor(s.length / 2)] : NaN;
}

/**
 * Unit of a time column from its values: ISO 8601, clock, epoch or stepped milliseconds, else seconds.
 * @example guessTimeUnit(["0", "100", "200"], ".") // "ms"
 */
export function guessTimeUnit(values: string[], decimal: "." | ","): "s" | "ms" | "iso" | "clock" {
  if (values.filter(looksIso).length * 2 >= values.length && values.length) return "iso";
  if (values.filter(looksClock).length * 2 >= values.length && values.length) return "clock";
  const ns = values.map((v) => parseNumber(v, decimal)).filter((n): n is number => n !== null && Number.isFinite(n));
  if (!ns.length) return "s";
  if (median(ns) > 1e11) return "ms"; // epoch milliseconds (1e11 s would be the year 5138)
  const steps = ns.slice(1).map((n, i) => n - ns[i]).filter((d) => d > 0);
  const allIntegers = ns.every(Number.isInteger);
  const step = median(steps);
  return allIntegers && step >= 10 && step <= 1000 ? "ms" : "s";
}

function checkTime(header: string, values: string[], decimal: "." | ",", hint: string | undefined): ColumnCheck {
  const byValues = guessTimeUnit(values, decimal);
  const unit = byValues === "iso" || byValues === "clock" || !hint ? byValues : hint;
  const reader = new TimeReader(unit, decimal);
  const ts = values.map((v) => reader.read(v));
  const readable = ts.filter((t) => !Number.isNaN(t));
  let plausible = readable.length / values.length;
  let problem: string | undefined;
  const back = readable.slice(1).filter((t, i) => t < readable[i]).length;
  if (plausible < 1) problem = `Column "${header}": some values in the first rows are not times`;
  else if (back > readable.length / 10) {
    plausible *= 0.5;
    problem = `Column "${header}": the time goes backwards in the first rows`;
  }
  return { unit, plausible, unitGuessed: unit !== hint, problem };
}

function checkRssi(header: string, nums: Num[], hint: string | undefined): ColumnCheck {
  const fit: Record<string, number> = {
    dBm: share(nums, between(-150, 0)),
    "%": share(nums, between(0, 100)),
    pwm: share(nums, between(800, 2200)),
  };
  const anyNegative = nums.some((n) => n !== null && n < 0);
  const byValues = anyNegative && fit.dBm >= 0.9 ? "dBm" : fit.pwm >= 0.9 ? "pwm" : fit["%"] >= 0.9 ? "%" : fit.dBm >= 0.9 ? "dBm" : undefined;
  if (hint && (fit[hint] >= 0.5 || !byValues)) return { unit: hint, plausible: fit[hint], unitGuessed: false, problem: outside(header, nums, fit[hint], `RSSI in ${hint}`) };
  if (byValues) {
    const problem = hint ? `Column "${header}": the name says ${hint} but the values look like ${byValues}` : undefined;
    return { unit: byValues, plausible: fit[byValues], unitGuessed: true, problem };
  }
  const p = Math.max(fit.dBm, fit["%"], fit.pwm);
  return { unit: "dBm", plausible: p, unitGuessed: true, problem: outside(header, nums, p, "RSSI in dBm, % or PWM µs") };
}

const ranges: Partial<Record<CsvField, [(n: number) => boolean, string]>> = {
  lat: [between(-90, 90), "latitudes between -90° and 90°"],
  lon: [between(-180, 180), "longitudes between -180° and 180°"],
  alt: [between(-1000, 100_000), "altitudes"],
  speed: [between(-1, 2000), "speeds"],
  heading: [between(-360, 360), "courses in degrees"],
  sats: [integerBetween(0, 128), "satellite counts"],
  hdop: [between(0, 100), "HDOP values"],
  fix: [integerBetween(0, 20), "fix type codes"],
  lq: [between(0, 100), "link quality percentages"],
  snr: [between(-40, 60), "SNR values in dB"],
  voltage: [between(0, 200), "voltages"],
  usedMah: [between(-10, 1e6), "mAh values"],
};
const rcRange: [(n: number) => boolean, string] = [(n) => n === 0 || (n >= 700 && n <= 2300), "RC pulse widths in µs"];

/**
 * Checks the first rows of a column against the field a header matched, and picks the unit.
 * @example checkColumn("lat", "lat", ["48.1", "48.2"], ".", undefined).plausible // 1
 */
export function checkColumn(field: CsvField, header: string, values: string[], decimal: "." | ",", hint: string | undefined): ColumnCheck {
  if (field === "time") return checkTime(header, values, decimal, hint);
  if (field === "mode") return { plausible: 1, unitGuessed: false };
  if (field === "armed" || field === "failsafe") {
    const p = values.filter((v) => parseFlag(v) !== null).length / values.length;
    return { plausible: p, unitGuessed: false, problem: p < 1 ? `Column "${header}": some values in the first rows are not on/off flags` : undefined };
  }
  const nums = values.map((v) => parseNumber(v, decimal));
  if (field === "rssi") return checkRssi(header, nums, hint);
  if (field === "current") {
    const unit = hint ?? "A";
    const p = share(nums, unit === "mA" ? between(-500_000, 1e6) : between(-500, 1000));
    return { unit, plausible: p, unitGuessed: false, problem: outside(header, nums, p, "currents") };
  }
  const [ok, what] = /^rc\d+$/.test(field) ? rcRange : ranges[field] ?? [() => true, "numbers"];
  const p = share(nums, ok);
  const unit = field === "alt" ? hint ?? "m" : field === "speed" ? hint ?? "m/s" : undefined;
  return { unit, plausible: p, unitGuessed: false, problem: outside(header, nums, p, what) };
}
