import { sliceBatch } from "./batch-slice";
import type { SampleBatch } from "./types";

/**
 * Cuts one log's batch stream into runs while it streams (DESIGN.md §10 "A file holding several
 * separate runs is several runs"). Pure: no I/O, the input batches are never written to.
 *
 * A new part starts
 * - at a track start (`batch.trackStart[i] === 1`, a GPX <trk> after the first) whose first timed
 *   sample lies more than `gapS` from the current part's last timed sample, in either direction
 *   (tracks are not always in time order);
 * - at an arming (armed = 1) more than `gapS` after the current part's last armed sample (the
 *   vehicle disarmed, or the log silent, in between). When the logging paused for more than
 *   `silenceS` in that disarmed stretch (the logger was off: a battery change), the part starts
 *   after the longest such pause instead, so the walk out and the power-up before the second
 *   arming belong to the second run rather than lengthening the first.
 *
 * A sample is timed when its `tS` is finite. Each part's `tS` is rebased to its own clock:
 * part tS = file tS − `offsetS`, where `offsetS` is 0 for part 1 (the parser's clock already starts
 * there) and the file time of the first timed sample of every later part, so a part's absolute
 * start is the parser's `startedAt` + `offsetS`. The first sample of every part is a segment start.
 *
 * Undecided samples (an untimed beginning of a track, a disarmed stretch after a pause) are held
 * until the decision, at most `maxHeldSamples` of them; beyond that they join the current part.
 * Cost: O(samples); memory: the held samples only.
 */

export type PartCause = "first" | "track" | "arming";

export interface RunPartStart {
  /** 1-based part number, in file order. */
  part: number;
  /** File seconds (the parser's `tS`) at this part's time 0: part tS = file tS − offsetS. */
  offsetS: number;
  /** Why the part starts: the log's start, a GPX track far in time, or an arming after a long pause. */
  cause: PartCause;
  /** Source line (or point number) of the part's first sample. */
  firstLine: number;
}

export interface RunPart extends RunPartStart {
  sampleCount: number;
}

export interface RunPartSink {
  startPart(part: RunPartStart): void | Promise<void>;
  /** A batch of the given part, already rebased; owned by the sink only for the duration of the call's promise. */
  batch(part: number, batch: SampleBatch): void | Promise<void>;
  endPart(part: RunPart): void | Promise<void>;
}

export interface RunSplitterOptions {
  /** Recordings further apart than this (s) are separate runs: thresholds.runSplitGapS. */
  gapS: number;
  /** A step between consecutive samples longer than this (s) is the logger switched off. Default 60. */
  silenceS?: number;
  /** Undecided samples held at most (default 131,072: about 25 MB of batches); beyond, they join the current part. */
  maxHeldSamples?: number;
}

interface Pending {
  kind: "track" | "silence";
  /** Held views, in order. */
  held: SampleBatch[];
  count: number;
  /** For a silence: its length (s); a longer one later moves the candidate. */
  stepS: number;
  /** For a track: the current part's last timed sample before it. */
  refT: number;
}

/**
 * The absolute start of a part: the log's own start (the parser's `startedAt`, at file tS = 0)
 * plus the part's offset on the log's clock, to the millisecond below; null for an undated log.
 * @example partStartedAt(new Date("2010-01-01T14:48:37.519Z"), 3.5) // => 2010-01-01T14:48:41.019Z
 */
export function partStartedAt(logStartedAt: Date | null, offsetS: number): Date | null {
  if (!logStartedAt || !Number.isFinite(offsetS)) return null;
  return new Date(Math.floor(logStartedAt.getTime() + offsetS * 1000));
}

export class RunSplitter {
  private readonly gapS: number;
  private readonly silenceS: number;
  private readonly maxHeld: number;
  private readonly done: RunPart[] = [];
  private current: RunPart | null = null;
  /** The current part has had no sample emitted yet (its first one becomes a segment start). */
  private fresh = false;
  private lastTimedT = NaN;
  private lastArmedT = NaN;
  /** tS of the previous sample in file order (NaN when untimed). */
  private prevT = NaN;
  private pending: Pending | null = null;
  private finished = false;

  constructor(
    private readonly sink: RunPartSink,
    opts: RunSplitterOptions,
  ) {
    if (!(opts.gapS > 0)) throw new Error("RunSplitter requires gapS > 0 seconds");
    this.gapS = opts.gapS;
    this.silenceS = Math.min(opts.silenceS ?? 60, opts.gapS);
    this.maxHeld = opts.maxHeldSamples ?? 131_072;
  }

  /** Parts ended so far (all of them after `finish()`). */
  get parts(): readonly RunPart[] {
    return this.done;
  }

  /** Feeds the next parser batch; resolves once every part it completes has gone to the sink. */
  async push(b: SampleBatch): Promise<void> {
    if (this.finished) throw new Error("RunSplitter.push after finish");
    const { tS, armed } = b.columns;
    const { trackStart, sourceLine } = b;
    // Samples [from, i) go where the state before sample i sends them: held while a decision is
    // pending, else to the current part. Every change of that state is preceded by flush(i).
    let from = 0;
    const flush = async (i: number) => {
      if (i > from) {
        const v = sliceBatch(b, from, i);
        if (this.pending) this.hold(v);
        else await this.emit(v);
      }
      from = i;
    };
    for (let i = 0; i < b.length; i++) {
      const t = tS[i];
      const timed = Number.isFinite(t);
      const step = timed && Number.isFinite(this.prevT) ? t - this.prevT : NaN;
      this.prevT = timed ? t : NaN;
      if (this.pending && this.pending.count + (i - from) >= this.maxHeld) {
        await flush(i);
        await this.join();
      }

      if (!this.current) {
        await this.startPart({ part: 1, offsetS: 0, cause: "first", firstLine: sourceLine[i] });
      } else if (trackStart[i] === 1) {
        await flush(i);
        if (this.pending) await this.join();
        if (!timed) {
          // Decided at the track's first timed sample.
          this.pending = { kind: "track", held: [], count: 0, stepS: 0, refT: this.lastTimedT };
          continue;
        }
        if (Math.abs(t - this.lastTimedT) > this.gapS) await this.cut("track", t, sourceLine[i]);
        else this.checkPause(step);
      } else if (this.pending?.kind === "track") {
        if (!timed) continue;
        await flush(i);
        if (Math.abs(t - this.pending.refT) > this.gapS) await this.cutAtHeld("track", t);
        else await this.join();
      } else if (Number.isFinite(this.lastArmedT) && step > this.silenceS) {
        // The logger paused after the vehicle was armed: a new run starts here if an arming follows.
        await flush(i);
        if (this.pending && step >= this.pending.stepS) await this.join();
        this.pending ??= { kind: "silence", held: [], count: 0, stepS: step, refT: NaN };
      }

      if (armed[i] === 1 && this.current) {
        const splits = timed && Number.isFinite(this.lastArmedT) && t - this.lastArmedT > this.gapS;
        if (splits || this.pending) await flush(i);
        if (splits && this.pending && this.pending.count > 0) await this.cutAtHeld("arming", this.firstHeldT(t));
        else if (splits) {
          this.pending = null;
          await this.cut("arming", t, sourceLine[i]);
        } else if (this.pending) await this.join();
      }
      // Held samples are noted when they are placed (join or cut).
      if (!this.pending && timed) {
        this.lastTimedT = t;
        if (armed[i] === 1) this.lastArmedT = t;
      }
    }
    await flush(b.length);
  }

  /** A joined track start may still begin a pause (kept separate so the branches above stay flat). */
  private checkPause(step: number): void {
    if (Number.isFinite(this.lastArmedT) && step > this.silenceS) this.pending = { kind: "silence", held: [], count: 0, stepS: step, refT: NaN };
  }

  /** Ends the stream: held samples join the current part, the last part ends. */
  async finish(): Promise<RunPart[]> {
    if (this.finished) return this.done;
    if (this.pending) await this.join();
    if (this.current) await this.endCurrent();
    this.finished = true;
    return this.done;
  }

  private hold(v: SampleBatch): void {
    this.pending!.held.push(v);
    this.pending!.count += v.length;
  }

  /** File time of the first timed held sample (a pause's first sample is timed by construction). */
  private firstHeldT(otherwise: number): number {
    for (const h of this.pending!.held) for (let i = 0; i < h.length; i++) if (Number.isFinite(h.columns.tS[i])) return h.columns.tS[i];
    return otherwise;
  }

  /** The held samples were the current part's after all. */
  private async join(): Promise<void> {
    const p = this.pending!;
    this.pending = null;
    for (const h of p.held) {
      this.noteTimes(h);
      await this.emit(h);
    }
  }

  /** A new part starts with the held samples, its clock at file time `offsetS`. */
  private async cutAtHeld(cause: PartCause, offsetS: number): Promise<void> {
    const p = this.pending!;
    this.pending = null;
    await this.endCurrent();
    await this.startPart({ part: this.done.length + 1, offsetS, cause, firstLine: p.held[0]?.sourceLine[0] ?? 0 });
    for (const h of p.held) {
      this.noteTimes(h);
      await this.emit(h);
    }
  }

  /** A new part starts at the sample being read (emitted by the caller's next flush). */
  private async cut(cause: PartCause, offsetS: number, firstLine: number): Promise<void> {
    await this.endCurrent();
    await this.startPart({ part: this.done.length + 1, offsetS, cause, firstLine });
  }

  private noteTimes(h: SampleBatch): void {
    for (let i = 0; i < h.length; i++) {
      const t = h.columns.tS[i];
      if (!Number.isFinite(t)) continue;
      this.lastTimedT = t;
      if (h.columns.armed[i] === 1) this.lastArmedT = t;
    }
  }

  private async startPart(start: RunPartStart): Promise<void> {
    this.current = { ...start, sampleCount: 0 };
    this.fresh = true;
    this.lastTimedT = NaN;
    this.lastArmedT = NaN;
    await this.sink.startPart(start);
  }

  private async endCurrent(): Promise<void> {
    const c = this.current!;
    this.done.push(c);
    this.current = null;
    await this.sink.endPart(c);
  }

  /** Hands samples of the current part to the sink, rebased to its clock. */
  private async emit(v: SampleBatch): Promise<void> {
    if (v.length === 0) return;
    const c = this.current!;
    let out = v;
    if (c.offsetS !== 0) {
      const tS = new Float64Array(v.length);
      for (let i = 0; i < v.length; i++) tS[i] = v.columns.tS[i] - c.offsetS;
      out = { ...out, columns: { ...out.columns, tS } };
    }
    if (this.fresh && out.segmentStart[0] !== 1) {
      const seg = out.segmentStart.slice();
      seg[0] = 1;
      out = { ...out, segmentStart: seg };
    }
    this.fresh = false;
    c.sampleCount += v.length;
    await this.sink.batch(c.part, out);
  }
}
