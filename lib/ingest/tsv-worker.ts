import { Worker } from "node:worker_threads";
import { RC_CHANNELS, type SampleBatch } from "@/lib/parsers/types";
import { encodeRows } from "./encode-rows";
import { TSV_KINDS, batchArrays, batchToTsv } from "./sample-tsv";

// The worker runs encodeRows from its own source text: no bundler or file path involved.
// __name: some transpilers (esbuild's keepNames, used by tsx) wrap inner functions in it.
const workerSource = `
const { parentPort } = require("node:worker_threads");
const __name = (f) => f;
const encodeRows = ${encodeRows.toString()};
parentPort.on("message", (m) => {
  const out = encodeRows(m.runId, m.firstSeq, m.n, m.arrays, m.kinds, m.rc, m.rcChannels);
  parentPort.postMessage({ id: m.id, out }, [out.buffer]);
});`;

/**
 * Encodes batches to TSV on a worker thread, so parsing (this thread) and encoding overlap on a
 * 2-core machine while MariaDB reads the stream. Results come back in submission order. Falls back
 * to encoding here when a worker cannot be started.
 */
export class TsvEncoder {
  private worker: Worker | null = null;
  private nextId = 0;
  private pending = new Map<number, { resolve: (b: Buffer) => void; reject: (e: Error) => void }>();

  constructor(private readonly runId: number) {
    try {
      this.worker = new Worker(workerSource, { eval: true });
      this.worker.on("message", (m: { id: number; out: Uint8Array }) => {
        const p = this.pending.get(m.id);
        this.pending.delete(m.id);
        p?.resolve(Buffer.from(m.out.buffer, m.out.byteOffset, m.out.byteLength));
      });
      this.worker.on("error", (e) => this.failAll(e));
      // An exit without an error (e.g. out of memory) must not leave encodes waiting for ever.
      this.worker.on("exit", () => this.failAll(new Error("the TSV encoder thread stopped")));
      this.worker.unref();
    } catch {
      this.worker = null;
    }
  }

  private failAll(e: Error): void {
    if (!this.worker) return;
    for (const p of this.pending.values()) p.reject(e);
    this.pending.clear();
    this.worker = null;
  }

  /**
   * Hands copies of the batch's arrays to the worker (the copies are transferred; the batch stays
   * usable). `runId` defaults to the encoder's: one encoder serves every part of a file.
   */
  encode(firstSeq: number, batch: SampleBatch, runId = this.runId): Promise<Buffer> {
    if (!this.worker) return Promise.resolve(batchToTsv(runId, firstSeq, batch));
    const id = this.nextId++;
    const arrays = batchArrays(batch).map((a) => a.slice(0, batch.length));
    const rc = batch.rc ? batch.rc.slice(0, batch.length * RC_CHANNELS) : null;
    const transfer = [...arrays.map((a) => a.buffer), ...(rc ? [rc.buffer] : [])];
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker!.postMessage({ id, runId, firstSeq, n: batch.length, arrays, kinds: TSV_KINDS, rc, rcChannels: RC_CHANNELS }, transfer);
    });
  }

  /** True while batches are encoded on the worker thread (false after a fallback). */
  get onWorker(): boolean {
    return this.worker !== null;
  }

  async close(): Promise<void> {
    const w = this.worker;
    this.worker = null;
    await w?.terminate();
  }
}
