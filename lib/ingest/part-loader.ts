import type { MySql2Database } from "drizzle-orm/mysql2";
import type { PoolConnection } from "mysql2/promise";
import type { schema } from "@/db/client";
import { runs, type Run } from "@/db/schema";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import type { RunPart, RunPartSink, RunPartStart } from "@/lib/parsers/run-splitter";
import { RC_CHANNELS, sampleFields, type SampleBatch, type SampleField } from "@/lib/parsers/types";
import { startSampleLoad } from "./load-samples";
import type { TsvEncoder } from "./tsv-worker";

/** One part of the file as loaded: its run row, samples in MariaDB, series in memory. */
export interface LoadedPart {
  runId: number;
  part: RunPart;
  /** The row as it was before this read; null for a part this read created. */
  previous: Run | null;
  collector: SeriesCollector;
  /** Fields that carry a value in this part (a file's parts need not carry the same ones). */
  fieldsPresent: Set<SampleField>;
  hasRc: boolean;
}

/**
 * The run splitter's sink inside the ingest transaction: each part's samples go into its own run
 * row with one LOAD DATA after the other on the transaction's connection, and into its own
 * series for the analysis. Part n reuses the upload's existing run with that part number (so its
 * notes and share links stay), else a new run row is inserted in the transaction, copying part 1's
 * build, route plan, pilot, title and column map.
 */
export class PartLoader implements RunPartSink {
  readonly loaded: LoadedPart[] = [];
  private load: ReturnType<typeof startSampleLoad> | null = null;
  private current: LoadedPart | null = null;
  private partStartBytes = 0;

  constructor(
    private readonly conn: PoolConnection,
    private readonly tx: MySql2Database<typeof schema>,
    private readonly existing: Run[],
    private readonly first: Run,
    private readonly encoder: TsvEncoder,
    /** Bytes of the object read so far, and its size: to size each part's series once. */
    private readonly bytes: () => number,
    private readonly sizeBytes: number,
    /** Throws to stop the read (e.g. the claim was lost). */
    private readonly check: () => void = () => {},
  ) {}

  async startPart(start: RunPartStart): Promise<void> {
    const previous = this.existing.find((r) => r.part === start.part) ?? null;
    const runId = previous?.id ?? (await this.insertPart(start.part));
    this.current = { runId, part: { ...start, sampleCount: 0 }, previous, collector: new SeriesCollector(), fieldsPresent: new Set(), hasRc: false };
    this.partStartBytes = this.bytes();
    this.load = startSampleLoad(this.conn, runId, this.encoder);
  }

  async batch(_part: number, b: SampleBatch): Promise<void> {
    this.check();
    const c = this.current!;
    // From the part's first batch and its share of the bytes, size its series once.
    const read = this.bytes() - this.partStartBytes;
    if (c.collector.length === 0 && b.length && read > 0) c.collector.reserve((b.length * (this.sizeBytes - this.partStartBytes) * 1.1) / read, b.rc !== null);
    c.collector.add(b);
    notePresent(c, b);
    await this.load!.write(b);
  }

  async endPart(part: RunPart): Promise<void> {
    const stored = await this.load!.finish();
    this.load = null;
    if (stored !== part.sampleCount) throw new Error(`stored ${stored} samples of part ${part.part}, parsed ${part.sampleCount}`);
    this.current!.part = part;
    this.loaded.push(this.current!);
    this.current = null;
  }

  /** After a failure: ends the statement in flight cleanly (the caller rolls back). */
  async abort(): Promise<void> {
    await this.load?.abort();
    this.load = null;
  }

  private async insertPart(part: number): Promise<number> {
    const f = this.first;
    const [{ id }] = await this.tx
      .insert(runs)
      .values({
        crewId: f.crewId,
        uploadId: f.uploadId,
        part,
        buildId: f.buildId,
        routePlanId: f.routePlanId,
        pilotId: f.pilotId,
        title: f.title,
        status: "parsing",
        columnMap: f.columnMap,
      })
      .$returningId();
    return id;
  }
}

function notePresent(c: LoadedPart, b: SampleBatch): void {
  for (const f of sampleFields) {
    if (c.fieldsPresent.has(f)) continue;
    const col = b.columns[f];
    for (let i = 0; i < b.length; i++) {
      if (col[i] === col[i]) {
        c.fieldsPresent.add(f);
        break;
      }
    }
  }
  if (!c.hasRc && b.rc) {
    const n = b.length * RC_CHANNELS;
    for (let i = 0; i < n; i++) {
      if (b.rc[i] !== 0) {
        c.hasRc = true;
        break;
      }
    }
  }
}
