import type { BatchBuilder } from "./batch-builder";
import { csvFieldSpec, unitOf, type ColumnMap, type CsvField } from "./column-map";
import { altitudeToM, currentToA, headingTo360, parseFlag, parseNumber, pwmToPct, speedToMps } from "./csv-values";
import { TimeReader } from "./csv-time";
import { ParseError, RC_CHANNELS, sampleFields, type SampleField } from "./types";
import { WarningLog } from "./warnings";

const TIME_EXPECTED = "seconds, milliseconds, ISO 8601 or hh:mm:ss";
/** A mode column with more distinct texts than this is not a mode column. */
const MAX_MODES = 1000;

interface Slot {
  index: number;
  header: string;
  field: CsvField;
  unit: string | undefined;
  seen: boolean;
}

const direct: Partial<Record<CsvField, SampleField>> = {
  sats: "sats", hdop: "hdop", fix: "fixType", lq: "lqPct", snr: "snrDb", voltage: "voltageV", usedMah: "usedMah",
};

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
  private readonly v = {} as Record<SampleField, number>;
  private readonly rc = new Uint16Array(RC_CHANNELS);
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
      const slot: Slot = { index, header: c.header, field: c.field, unit: unitOf(c), seen: false };
      if (c.field !== "time") this.slots.push(slot);
      if (c.field === "lat") this.lat = slot;
      if (c.field === "lon") this.lon = slot;
    }
    this.time = { index: indexOf.get(timeCol.header.trim())!, header: timeCol.header, field: "time", unit: unitOf(timeCol), seen: false };
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

    for (const f of sampleFields) this.v[f] = NaN;
    this.rc.fill(0);
    this.v.tS = t;
    let badCoordinate = false;
    for (const s of this.slots) {
      const text = fields[s.index].trim();
      if (text === "") continue;
      s.seen = true;
      if (s.field === "mode") {
        this.v.modeIndex = this.mode(text, line, s);
        continue;
      }
      if (s.field === "armed" || s.field === "failsafe") {
        const flag = parseFlag(text);
        if (flag === null) this.warnings.add("not-a-flag", `Expected 1/0, true/false, yes/no, on/off or armed/disarmed, found ${JSON.stringify(text)}`, line, s.header);
        else this.v[s.field] = flag;
        continue;
      }
      const n = parseNumber(text, this.decimal);
      if (n === null) {
        this.warnings.add("not-a-number", `Expected a number, found ${JSON.stringify(text)}`, line, s.header);
        continue;
      }
      if (!Number.isFinite(n)) {
        if (s === this.lat || s === this.lon) badCoordinate = true;
        else if (!Number.isNaN(n)) this.warnings.add("out-of-range", `Found ${text}; the value is dropped`, line, s.header);
        continue;
      }
      this.store(s, n, line);
    }
    if (this.lat && this.lon) this.checkPosition(badCoordinate, line);

    const b = this.builder;
    b.begin(line, this.samples === 0);
    for (const f of sampleFields) b.set(f, this.v[f]);
    for (let ch = 0; ch < RC_CHANNELS; ch++) if (this.rc[ch]) b.setRc(ch + 1, this.rc[ch]);
    b.commit();
    this.samples++;
    return true;
  }

  private store(s: Slot, n: number, line: number): void {
    const v = this.v;
    const to = direct[s.field];
    if (to) v[to] = n;
    else if (s.field === "lat") v.lat = n;
    else if (s.field === "lon") v.lon = n;
    else if (s.field === "alt") v.altM = altitudeToM(n, s.unit);
    else if (s.field === "speed") v.speedMps = speedToMps(n, s.unit);
    else if (s.field === "heading") v.headingDeg = headingTo360(n);
    else if (s.field === "current") v.currentA = currentToA(n, s.unit);
    else if (s.field === "rssi") {
      if (s.unit === "dBm") v.rssiDbm = n;
      else v.rssiPct = s.unit === "pwm" ? pwmToPct(n) : n;
    } else if (s.field.startsWith("rc")) {
      if (n >= 0 && n <= 65535) this.rc[Number(s.field.slice(2)) - 1] = Math.round(n);
      else this.warnings.add("out-of-range", `Expected an RC pulse width in µs, found ${n}`, line, s.header);
    }
  }

  private checkPosition(badCoordinate: boolean, line: number): void {
    const { lat, lon } = this.v;
    let why = "";
    let column = this.lat!.header;
    if (badCoordinate) why = "a coordinate is NaN or infinite";
    else if (Math.abs(lat) > 90) why = `latitude ${lat} is outside ±90°`;
    else if (Math.abs(lon) > 180) (why = `longitude ${lon} is outside ±180°`), (column = this.lon!.header);
    else if (lat === 0 && lon === 0) why = "the position is exactly 0,0 (no fix)";
    if (why) this.warnings.add("out-of-range", `${why[0].toUpperCase()}${why.slice(1)}; the position is dropped`, line, column);
    if (why || Number.isNaN(lat) || Number.isNaN(lon)) this.v.lat = this.v.lon = NaN;
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
