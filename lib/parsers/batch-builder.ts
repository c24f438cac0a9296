import { RC_CHANNELS, sampleFields, type SampleBatch, type SampleField } from "./types";

export const DEFAULT_BATCH_SIZE = 8192;

/**
 * Collects samples one at a time into fixed-size typed arrays and hands out full batches.
 * Each `begin()` starts a sample with every field NaN; set fields, then `commit()`.
 */
export class BatchBuilder {
  private batch: SampleBatch;
  private i = -1;
  readonly present = new Set<SampleField>();
  private readonly seen: Partial<Record<SampleField, boolean>> = {};
  hasRc = false;

  constructor(
    private readonly withRc: boolean,
    private readonly size = DEFAULT_BATCH_SIZE,
  ) {
    this.batch = this.fresh();
  }

  private fresh(): SampleBatch {
    const columns = {} as Record<SampleField, Float64Array>;
    for (const f of sampleFields) columns[f] = new Float64Array(this.size).fill(NaN);
    return {
      length: 0,
      columns,
      rc: this.withRc ? new Uint16Array(this.size * RC_CHANNELS) : null,
      segmentStart: new Uint8Array(this.size),
      trackStart: new Uint8Array(this.size),
      sourceLine: new Uint32Array(this.size),
    };
  }

  /** Starts a new sample; returns false when the batch is full (call `take()` first). */
  get full(): boolean {
    return this.batch.length >= this.size;
  }

  /** `trackStart` marks a new recording (GPX <trk>) and implies a segment start. */
  begin(sourceLine: number, segmentStart = false, trackStart = false): void {
    this.i = this.batch.length;
    this.batch.sourceLine[this.i] = sourceLine;
    this.batch.segmentStart[this.i] = segmentStart || trackStart ? 1 : 0;
    this.batch.trackStart[this.i] = trackStart ? 1 : 0;
  }

  set(field: SampleField, value: number): void {
    this.batch.columns[field][this.i] = value;
    // Checked per cell on the hot path: a plain flag first, the Set only once per field.
    if (value === value && !this.seen[field]) {
      this.seen[field] = true;
      this.present.add(field);
    }
  }

  setRc(channel1Based: number, us: number): void {
    if (!this.batch.rc) return;
    this.batch.rc[this.i * RC_CHANNELS + channel1Based - 1] = us;
    this.hasRc = true;
  }

  /**
   * Direct access for a parser's hot loop: the current sample's index and the batch's columns
   * (NaN-filled). Whoever writes here calls `markPresent` for a field's first real value.
   */
  get index(): number {
    return this.i;
  }

  get columns(): Record<SampleField, Float64Array> {
    return this.batch.columns;
  }

  /** RC values of the current batch, row-major; null when built without RC. */
  get rcValues(): Uint16Array | null {
    return this.batch.rc;
  }

  markPresent(field: SampleField): void {
    if (this.seen[field]) return;
    this.seen[field] = true;
    this.present.add(field);
  }

  markRc(): void {
    this.hasRc = this.batch.rc !== null;
  }

  commit(): void {
    this.batch.length = this.i + 1;
  }

  /** Returns the filled part of the current batch (trimmed views) and starts a new one. */
  take(): SampleBatch | null {
    const b = this.batch;
    if (b.length === 0) return null;
    this.batch = this.fresh();
    if (b.length === this.size) return b;
    const n = b.length;
    const columns = {} as Record<SampleField, Float64Array>;
    for (const f of sampleFields) columns[f] = b.columns[f].subarray(0, n);
    return {
      length: n,
      columns,
      rc: b.rc ? b.rc.subarray(0, n * RC_CHANNELS) : null,
      segmentStart: b.segmentStart.subarray(0, n),
      trackStart: b.trackStart.subarray(0, n),
      sourceLine: b.sourceLine.subarray(0, n),
    };
  }
}
