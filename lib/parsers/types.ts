/**
 * The one normalised sample stream every log format is parsed into. Columnar typed arrays,
 * NaN for a value the log does not carry at that sample. Units are fixed here; parsers convert.
 */

export const sampleFields = [
  "tS", // seconds from the first sample (first sample = 0)
  "lat", // degrees WGS84
  "lon", // degrees WGS84
  "altM", // metres
  "speedMps", // ground speed, m/s
  "headingDeg", // course over ground, degrees true 0–360
  "sats", // satellites used
  "hdop", // horizontal dilution of precision
  "fixType", // the source's fix code, 0 = no fix always: GPX none/2d/3d/dgps/pps → 0/2/3/2/3, NMEA GGA quality 0–8, CSV as logged
  "rssiDbm", // received signal strength, dBm
  "rssiPct", // received signal strength, 0–100 %
  "lqPct", // link quality, share of packets received, 0–100 %
  "snrDb", // signal-to-noise ratio, dB
  "voltageV", // battery pack voltage, V
  "currentA", // battery current, A
  "usedMah", // capacity used so far, mAh
  "modeIndex", // index into ParseSummary.modeNames
  "armed", // 1 armed, 0 disarmed
  "failsafe", // 1 failsafe flag raised, 0 not
] as const;

export type SampleField = (typeof sampleFields)[number];

export const RC_CHANNELS = 18;

export interface SampleBatch {
  /** Number of samples in this batch. */
  length: number;
  /** One Float64Array of `length` per field. */
  columns: Record<SampleField, Float64Array>;
  /** RC channels 1–18 in µs, row-major (`length × 18`), 0 where absent; null when the log has none. */
  rc: Uint16Array | null;
  /** 1 where a new track segment starts at this sample (a reception gap that must not be bridged). */
  segmentStart: Uint8Array;
  /**
   * 1 where a new recording starts (a GPX <trk> after the first): a place where one upload may
   * hold several runs (lib/parsers/run-splitter.ts). Always a segment start too.
   */
  trackStart: Uint8Array;
  /** 1-based source line (CSV/NMEA) or point number (GPX) of each sample, for messages. */
  sourceLine: Uint32Array;
}

export interface ParseWarning {
  /** Stable machine code, e.g. "time-backwards", "bad-checksum", "out-of-range", "empty-column". */
  code: string;
  message: string;
  /** First line (1-based) where it happened. */
  line?: number;
  column?: string;
  /** How many times it happened (warnings are aggregated per code and column). */
  count?: number;
}

export type LogFormat = "csv" | "gpx" | "nmea";

export interface ParseSummary {
  format: LogFormat;
  sampleCount: number;
  /** Absolute time of the first sample when the log carries dates; null otherwise. */
  startedAt: Date | null;
  /** Mode/flight-mode texts in order of first appearance; samples refer to them by index. */
  modeNames: string[];
  warnings: ParseWarning[];
  /** Fields that carry at least one value. */
  fieldsPresent: SampleField[];
  /** True when RC channel values were seen. */
  hasRc: boolean;
}

/** Bad input: names the place and what was expected. Nothing is stored for a log that throws this. */
export class ParseError extends Error {
  constructor(
    message: string,
    readonly line?: number,
    readonly column?: string | number,
    readonly expected?: string,
  ) {
    super(message);
    this.name = "ParseError";
  }

  /** "line 12, column "lat": expected a number in degrees, found "abc"" style text for people. */
  describe(): string {
    const where = [this.line ? `line ${this.line}` : null, this.column !== undefined ? `column ${JSON.stringify(String(this.column))}` : null]
      .filter(Boolean)
      .join(", ");
    return where ? `${where}: ${this.message}` : this.message;
  }
}

/** Receives each batch in order; the parser awaits it (backpressure). */
export type BatchSink = (batch: SampleBatch) => Promise<void> | void;

/** Input as it comes from storage or a file: chunks of bytes (UTF-8) or text. */
export type ByteSource = AsyncIterable<Uint8Array | string>;
