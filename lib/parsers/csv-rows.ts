import type { BatchBuilder } from "./batch-builder";
import { csvFieldSpec, unitOf, type ColumnMap, type CsvField } from "./column-map";
import { altitudeToM, currentToA, headingTo360, parseFlag, parseNumber, pwmToPct, speedToMps } from "./csv-values";
import { TimeReader } from "./csv-time";
import { ParseError, RC_CHANNELS, type SampleField } from "./types";
import { WarningLog } from "./warnings";

/**
 * RSSI a receiver can report, dBm: below −150 dBm is under any hobby receiver's noise floor
 * (thermal noise is −174 dBm/Hz, ≈ −123 dBm over 125 kHz), above +30 dBm would burn its input.
 * A value outside is a logging artefact (common practice; bounds our choice).
 */
export const RSSI_DBM_RANGE = { min: -150, max: 30 } as const;

const TIME_EXPECTED = "seconds, milliseconds, ISO 8601 or hh:mm:ss";
/** A mode column with more distinct texts than this is not a mode column. */
const MAX_MODES = 1000;

/** How a column's text becomes a sample value; decided once per column, not per cell. */
const enum Kind {
  Plain,
  Alt,
  Speed,
  Heading,
  Current,
  RssiPct,
  RssiPwm,
  Rc,
  Mode,
  Flag,
  Lat,
  Lon,
}

interface Slot {
  index: number;
  header: string;
  field: CsvField;
  unit: string | undefined;
  seen: boolean;
  kind: Kind;
  /** The sample field written (unused for RC channels). */
  target: SampleField;
  /** 0-based RC channel for Kind.Rc. */
  channel: number;
}

const direct: Partial<Record<CsvField, SampleField>> = {
  sats: "sats", hdop: "hdop", fix: "fixType", lq: "lqPct", snr: "snrDb", voltage: "voltageV", usedMah: "usedMah",
};

function kindOf(field: CsvField, unit: string | undefined): { kind: Kind; target: SampleField; channel: number } {
  const plain = direct[field];
  if (plain) return { kind: Kind.Plain, target: plain, channel: 0 };
  switch (field) {
    case "lat": return { kind: Kind.Lat, target: "lat", channel: 0 };
    case "lon": return { kind: Kind.Lon, target: "lon", channel: 0 };
    case "alt": return { kind: Kind.Alt, target: "altM", channel: 0 };
    case "speed": return { kind: Kind.Speed, target: "speedMps", channel: 0 };
    case "heading": return { kind: Kind.Heading, target: "headingDeg", channel: 0 };
    case "current": return { kind: Kind.Current, target: "currentA", channel: 0 };
    case "rssi":
      if (unit === "dBm") return { kind: Kind.Plain, target: "rssiDbm", channel: 0 };
      return { kind: unit === "pwm" ? Kind.RssiPwm : Kind.RssiPct, target: "rssiPct", channel: 0 };
    case "mode": return { kind: Kind.Mode, target: "modeIndex", channel: 0 };
    case "armed": return { kind: Kind.Flag, target: "armed", channel: 0 };
    case "failsafe": return { kind: Kind.Flag, target: "failsafe", channel: 0 };
    default:
      if (/^rc\d+$/.test(field)) return { kind: Kind.Rc, target: "tS", channel: Number(field.slice(2)) - 1 };
      throw new Error(`no conversion for column field ${field}`);
  }
}

function convert(kind: Kind, n: number, unit: string | undefined): number {
  switch (kind) {
    case Kind.Alt: return altitudeToM(n, unit);
    case Kind.Speed: return speedToMps(n, unit);
    case Kind.Heading: return headingTo360(n);
    case Kind.Current: return currentToA(n, unit);
    case Kind.RssiPwm: return pwmToPct(n);
    default: return n;
  }
}

/**
 * Turns the data records of one CSV log into samples, converting each mapped column into the
 * units of types.ts and collecting warnings. Records are read one at a time; the caller flushes
 * the builder when it is full.
 * @throws ParseError when the map has no usable time column or the first data row's time is unreadable.
 * @example
 *   const r = new CsvRowReader(["t", "v"], { columns: [{ header: "t", field: "time" }] }, ".", builder);
 *   r.row(["0", "1"], 2); // true: one sample with tS 0, sourceLine 2
 */
export class CsvRowReader {
  readonly warnings = new WarningLog();
  readonly modeNames: string[] = [];
  /** Data records seen (empty lines not counted), ragged ones among them, and the first ragged line. */
  rows = 0;
  ragged = 0;
  firstRaggedLine = 0;
  samples = 0;
  private readonly slots: Slot[] = [];
  private readonly time: Slot;
  private readonly lat?: Slot;
  private readonly lon?: Slot;
  private readonly times: TimeReader;
  private readonly modeIndex = new Map<string, number>();
  /** Held on the instance: a module import is read through a getter on every call once bundled. */
  private readonly parse = parseNumber;
  private prevT = NaN;

  constructor(
    private readonly headers: string[],
    map: ColumnMap,
    private readonly decimal: "." | ",",
    private readonly builder: BatchBuilder,
  ) {
    const indexOf = new Map<string, number>();
    headers.forEach((h, i) => indexOf.has(h) || indexOf.set(h, i));
    const timeCol = map.columns.find((c) => c.field === "time");
    if (!timeCol) throw new ParseError("The column map has no time column; map one column to Time", 1, undefined, "a time column");
    if (!indexOf.has(timeCol.header.trim())) {
      throw new ParseError(`The file has no column "${timeCol.header}", which the column map reads as the time`, 1, timeCol.header, "a header row with that column");
    }
    for (const c of map.columns) {
      if (c.field === "ignore") continue;
      const index = indexOf.get(c.header.trim());
      if (index === undefined) {
        this.warnings.add("missing-column", `The column map names "${c.header}" (${csvFieldSpec(c.field).label}) but the file has no such column`, 1, c.header);
        continue;
      }
      const unit = unitOf(c);
      const slot: Slot = { index, header: c.header, field: c.field, unit, seen: false, ...(c.field === "time" ? { kind: Kind.Plain, target: "tS", channel: 0 } : kindOf(c.field, unit)) };
      if (c.field !== "time") this.slots.push(slot);
      if (c.field === "lat") this.lat = slot;
      if (c.field === "lon") this.lon = slot;
    }
    this.time = { index: indexOf.get(timeCol.header.trim())!, header: timeCol.header, field: "time", unit: unitOf(timeCol), seen: false, kind: Kind.Plain, target: "tS", channel: 0 };
    this.times = new TimeReader(this.time.unit ?? "s", decimal);
  }

  get startedAt(): Date | null {
    return this.times.startedAt;
  }

  /** Reads one parsed record at a 1-based file line; returns true when it became a sample. */
  row(fields: string[], line: number): boolean {
    if (fields.length === 1 && fields[0].trim() === "") return false;
    this.rows++;
    const h = this.headers.length;
    if (fields.length !== h && !(fields.length > h && fields.slice(h).every((f) => f.trim() === ""))) {
      this.ragged++;
      this.firstRaggedLine ||= line;
      this.warnings.add("ragged-row", `This row has ${fields.length} fields; the header has ${h}`, line);
      return false;
    }
    const tText = fields[this.time.index].trim();
    const t = tText === "" ? NaN : this.times.read(tText);
    if (Number.isNaN(t)) {
      const found = `expected ${TIME_EXPECTED}, found ${JSON.stringify(tText)}`;
      if (this.samples === 0) throw new ParseError(found, line, this.time.header, TIME_EXPECTED);
      this.warnings.add("bad-time", `A row's time could not be read (${found}); the row is skipped`, line, this.time.header);
      return false;
    }
    this.time.seen = true;
    if (t < this.prevT) this.warnings.add("time-backwards", "The time goes backwards here; the row is kept", line, this.time.header);
    else if (t === this.prevT) this.warnings.add("duplicate-time", "Two rows have the same time", line, this.time.header);
    this.prevT = t;

    // Written straight into the batch (NaN-filled): this loop runs once per cell of the file.
    const b = this.builder;
    b.begin(line, this.samples === 0);
    const cols = b.columns;
    const i = b.index;
    cols.tS[i] = t;
    b.markPresent("tS");
    let badCoordinate = false;
    const slots = this.slots;
    for (let k = 0; k < slots.length; k++) {
      const s = slots[k];
      const raw = fields[s.index];
      const text = raw.length && (raw.charCodeAt(0) <= 32 || raw.charCodeAt(raw.length - 1) <= 32) ? raw.trim() : raw;
      if (text === "") continue;
      s.seen = true;
      const kind = s.kind;
      if (kind === Kind.Mode) {
        const m = this.mode(text, line, s);
        cols.modeIndex[i] = m;
        if (m === m) b.markPresent("modeIndex");
        continue;
      }
      if (kind === Kind.Flag) {
        const flag = parseFlag(text);
        if (flag === null) this.warnings.add("not-a-flag", `Expected 1/0, true/false, yes/no, on/off or armed/disarmed, found ${JSON.stringify(text)}`, line, s.header);
        else (cols[s.target][i] = flag), b.markPresent(s.target);
        continue;
      }
      const n = this.parse(text, this.decimal);
      if (n === null) {
        this.warnings.add("not-a-number", `Expected a number, found ${JSON.stringify(text)}`, line, s.header);
        continue;
      }
      if (n - n !== 0) {
        if (kind === Kind.Lat || kind === Kind.Lon) badCoordinate = true;
        else if (n === n) this.warnings.add("out-of-range", `Found ${text}; the value is dropped`, line, s.header);
        continue;
      }
      if (kind === Kind.Rc) this.storeRc(s, n, line, i);
      else if (kind === Kind.Lat || kind === Kind.Lon) cols[s.target][i] = n; // presence after the position check
      else {
        const v = convert(kind, n, s.unit);
        if (s.target === "rssiDbm" && !(v >= RSSI_DBM_RANGE.min && v <= RSSI_DBM_RANGE.max)) {
          this.warnings.add("out-of-range", `Expected an RSSI between ${RSSI_DBM_RANGE.min} and +${RSSI_DBM_RANGE.max} dBm, found ${text}; the value is dropped`, line, s.header);
          continue;
        }
        cols[s.target][i] = v;
        b.markPresent(s.target);
      }
    }
    if (this.lat && this.lon) this.checkPosition(cols, i, badCoordinate, line);
    b.commit();
    this.samples++;
    return true;
  }

  private storeRc(s: Slot, n: number, line: number, i: number): void {
    const rc = this.builder.rcValues;
    if (n >= 0 && n <= 65535) {
      if (rc) (rc[i * RC_CHANNELS + s.channel] = Math.round(n)), this.builder.markRc();
    } else this.warnings.add("out-of-range", `Expected an RC pulse width in µs, found ${n}`, line, s.header);
  }

  private checkPosition(cols: Record<SampleField, Float64Array>, i: number, badCoordinate: boolean, line: number): void {
    const lat = cols.lat[i];
    const lon = cols.lon[i];
    let why = "";
    let column = this.lat!.header;
    if (badCoordinate) why = "a coordinate is NaN or infinite";
    else if (Math.abs(lat) > 90) why = `latitude ${lat} is outside ±90°`;
    else if (Math.abs(lon) > 180) (why = `longitude ${lon} is outside ±180°`), (column = this.lon!.header);
    else if (lat === 0 && lon === 0) why = "the position is exactly 0,0 (no fix)";
    if (why) this.warnings.add("out-of-range", `${why[0].toUpperCase()}${why.slice(1)}; the position is dropped`, line, column);
    if (why || Number.isNaN(lat) || Number.isNaN(lon)) cols.lat[i] = cols.lon[i] = NaN;
    else this.builder.markPresent("lat"), this.builder.markPresent("lon");
  }

  private mode(text: string, line: number, s: Slot): number {
    let i = this.modeIndex.get(text);
    if (i !== undefined) return i;
    if (this.modeNames.length >= MAX_MODES) {
      this.warnings.add("too-many-modes", `More than ${MAX_MODES} different mode texts; later ones are dropped`, line, s.header);
      return NaN;
    }
    i = this.modeNames.push(text) - 1;
    this.modeIndex.set(text, i);
    return i;
  }

  /** Warnings that need every row: mapped columns that never had a value, ISO times without offset. */
  finish(): void {
    for (const s of this.slots) {
      if (!s.seen) this.warnings.add("empty-column", `Column "${s.header}" (${csvFieldSpec(s.field).label}) is empty in every row`, undefined, s.header);
    }
    if (!this.times.allOffsets) {
      this.warnings.add("time-no-offset", "Some ISO 8601 times have no UTC offset; they were read as UTC", undefined, this.time.header);
    }
  }
}
