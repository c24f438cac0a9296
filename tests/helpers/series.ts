/**
 * Builds small synthetic RunSeries for analysis tests (our own data, not from any log).
 */
import type { RunSeries } from "@/lib/analysis/types";
import { RC_CHANNELS } from "@/lib/parsers/types";

/** Columns a test may set: every per-sample field, plus `rc` (row-major n × 18) and `segmentStart`. */
export type SeriesField = Exclude<keyof RunSeries, "n" | "modeNames">;

/** A column as a list of n values or a function of the sample index (for `rc`: the flat index). */
export type SeriesValues = number[] | ((i: number) => number);

export interface MakeSeriesOptions {
  /** Sample rate for the default clock tS = i / hz (s). Default 10 Hz. */
  hz?: number;
  /** Mode names that `modeIndex` refers to. Default none. */
  modeNames?: string[];
}

const fill = (len: number, v: SeriesValues | undefined, dflt: number, name: string) => {
  if (Array.isArray(v) && v.length !== len) throw new Error(`makeSeries: ${name} has ${v.length} values, expected ${len}`);
  return Float64Array.from({ length: len }, (_, i) => (v === undefined ? dflt : Array.isArray(v) ? v[i] : v(i)));
};

/**
 * A RunSeries of `n` samples: tS = i / hz unless given, every other field NaN unless given,
 * `segmentStart` 1 at the first sample only, `rc` null unless given.
 * @throws {Error} when a list has the wrong length
 * @example
 * makeSeries(3, { lqPct: [100, 50, 100] }).tS; // => Float64Array [0, 0.1, 0.2]
 */
export function makeSeries(n: number, fields: Partial<Record<SeriesField, SeriesValues>> = {}, opts: MakeSeriesOptions = {}): RunSeries {
  const hz = opts.hz ?? 10;
  const col = (f: Exclude<SeriesField, "rc" | "segmentStart" | "tS">) => fill(n, fields[f], NaN, f);
  return {
    n,
    tS: fill(n, fields.tS ?? ((i) => i / hz), NaN, "tS"),
    lat: col("lat"),
    lon: col("lon"),
    altM: col("altM"),
    speedMps: col("speedMps"),
    headingDeg: col("headingDeg"),
    sats: col("sats"),
    hdop: col("hdop"),
    fixType: col("fixType"),
    rssiDbm: col("rssiDbm"),
    rssiPct: col("rssiPct"),
    lqPct: col("lqPct"),
    snrDb: col("snrDb"),
    voltageV: col("voltageV"),
    currentA: col("currentA"),
    usedMah: col("usedMah"),
    modeIndex: col("modeIndex"),
    armed: col("armed"),
    failsafe: col("failsafe"),
    rc: fields.rc === undefined ? null : fill(n * RC_CHANNELS, fields.rc, 0, "rc"),
    segmentStart: Uint8Array.from(fill(n, fields.segmentStart ?? ((i) => (i === 0 ? 1 : 0)), 0, "segmentStart")),
    modeNames: [...(opts.modeNames ?? [])],
  };
}

/**
 * A flat row-major `rc` column (n × 18, µs, 0 = absent) from per-channel values, channels 1-based.
 * @example
 * rcColumn(2, { 5: [1000, 2000] })[18 + 4]; // => 2000
 */
export function rcColumn(n: number, channels: Record<number, SeriesValues>): number[] {
  const out = new Array<number>(n * RC_CHANNELS).fill(0);
  for (const [ch, v] of Object.entries(channels)) {
    const c = Number(ch) - 1;
    const values = fill(n, v, 0, `channel ${ch}`);
    for (let i = 0; i < n; i++) out[i * RC_CHANNELS + c] = values[i];
  }
  return out;
}

/** A deep-frozen copy of a series (typed arrays copied into frozen plain arrays) to prove purity. */
export function frozenCopy(s: RunSeries): RunSeries {
  const copy = (a: ArrayLike<number>) => Object.freeze(Array.from(a));
  const out = { ...s, modeNames: Object.freeze([...s.modeNames]) } as unknown as Record<string, unknown>;
  for (const [k, v] of Object.entries(s)) if (v && typeof v === "object" && "length" in v && k !== "modeNames") out[k] = copy(v as ArrayLike<number>);
  return Object.freeze(out) as unknown as RunSeries;
}
