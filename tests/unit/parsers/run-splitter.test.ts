/**
 * The run splitter on our own synthetic batches: times, armed flags and track marks written here,
 * so every expected cut follows from the documented rule (lib/parsers/run-splitter.ts), not from a
 * parser or from how fast anything moves.
 */
import { describe, expect, it } from "vitest";
import { partStartedAt, RunSplitter, type RunPart, type RunPartStart } from "@/lib/parsers/run-splitter";
import { RC_CHANNELS, sampleFields, type SampleBatch, type SampleField } from "@/lib/parsers/types";

const GAP = 1800;

interface Log {
  tS: number[];
  armed?: number[];
  trackStart?: number[];
  rc?: boolean;
}

/** The log as parser batches of `size` samples (the last one shorter). */
function batches(log: Log, size: number): SampleBatch[] {
  const out: SampleBatch[] = [];
  const n = log.tS.length;
  for (let a = 0; a < n; a += size) {
    const len = Math.min(size, n - a);
    const columns = {} as Record<SampleField, Float64Array>;
    for (const f of sampleFields) columns[f] = new Float64Array(len).fill(NaN);
    const rc = log.rc ? new Uint16Array(len * RC_CHANNELS) : null;
    const segmentStart = new Uint8Array(len);
    const trackStart = new Uint8Array(len);
    const sourceLine = new Uint32Array(len);
    for (let i = 0; i < len; i++) {
      const g = a + i;
      columns.tS[i] = log.tS[g];
      columns.lat[i] = 50 + g * 1e-5; // carries the sample's index through the split
      if (log.armed) columns.armed[i] = log.armed[g];
      trackStart[i] = log.trackStart?.[g] ?? 0;
      segmentStart[i] = trackStart[i];
      sourceLine[i] = g + 2;
      if (rc) rc[i * RC_CHANNELS + 13] = 1000 + g;
    }
    out.push({ length: len, columns, rc, segmentStart, trackStart, sourceLine });
  }
  return out;
}

interface Collected {
  starts: RunPartStart[];
  parts: RunPart[];
  tS: number[][];
  index: number[][];
  segmentStart: number[][];
  rc: number[][];
}

async function split(log: Log, size = 4, opts: { gapS?: number; maxHeldSamples?: number; silenceS?: number } = {}): Promise<Collected> {
  const c: Collected = { starts: [], parts: [], tS: [], index: [], segmentStart: [], rc: [] };
  const splitter = new RunSplitter(
    {
      startPart: (p) => {
        c.starts.push(p);
        c.tS.push([]);
        c.index.push([]);
        c.segmentStart.push([]);
        c.rc.push([]);
      },
      batch: (part, b) => {
        expect(part).toBe(c.starts.length);
        for (let i = 0; i < b.length; i++) {
          c.tS[part - 1].push(b.columns.tS[i]);
          c.index[part - 1].push(Math.round((b.columns.lat[i] - 50) * 1e5));
          c.segmentStart[part - 1].push(b.segmentStart[i]);
          if (b.rc) c.rc[part - 1].push(b.rc[i * RC_CHANNELS + 13]);
        }
      },
      endPart: (p) => void c.parts.push(p),
    },
    { gapS: opts.gapS ?? GAP, maxHeldSamples: opts.maxHeldSamples, silenceS: opts.silenceS },
  );
  for (const b of batches(log, size)) await splitter.push(b);
  const parts = await splitter.finish();
  expect(parts).toEqual(c.parts);
  return c;
}

const range = (from: number, to: number, step = 1) => Array.from({ length: Math.floor((to - from) / step) + 1 }, (_, i) => from + i * step);
const ones = (n: number) => new Array<number>(n).fill(1);

/** Two GPX tracks: [0..a] then [b..b+len], the second marked as a track start. */
function twoTracks(secondStart: number, len = 5): Log {
  const tS = [...range(0, 5), ...range(secondStart, secondStart + len)];
  const trackStart = tS.map((_, i) => (i === 6 ? 1 : 0));
  return { tS, trackStart };
}

describe("RunSplitter", () => {
  it("passes a log with one recording through as one part, unchanged but for a segment start at its first sample", async () => {
    const c = await split(twoTracks(65), 3);
    expect(c.parts).toEqual([{ part: 1, offsetS: 0, cause: "first", firstLine: 2, sampleCount: 12 }]);
    expect(c.tS[0]).toEqual(twoTracks(65).tS);
    expect(c.segmentStart[0][0]).toBe(1);
    expect(c.segmentStart[0][6]).toBe(1); // the joined track keeps its own segment start
  });

  it("starts a new part at a track more than the gap after the last timed sample, its clock rebased to 0", async () => {
    const c = await split(twoTracks(7200));
    expect(c.parts.map((p) => [p.part, p.cause, p.offsetS, p.sampleCount, p.firstLine])).toEqual([
      [1, "first", 0, 6, 2],
      [2, "track", 7200, 6, 8],
    ]);
    expect(c.tS[1]).toEqual(range(0, 5));
    expect(c.index[1]).toEqual(range(6, 11));
    expect(c.segmentStart[1][0]).toBe(1);
  });

  it("keeps tracks exactly the gap apart together: only more than the gap splits", async () => {
    // Last timed sample of the first track is at 5 s.
    expect((await split(twoTracks(5 + GAP))).parts).toHaveLength(1);
    expect((await split(twoTracks(5 + GAP + 0.001))).parts).toHaveLength(2);
  });

  it("splits a track that lies far earlier in time than the one before it", async () => {
    const c = await split(twoTracks(-200_000_000, 3));
    expect(c.parts).toHaveLength(2);
    expect(c.parts[1].offsetS).toBe(-200_000_000);
    expect(c.tS[1]).toEqual([0, 1, 2, 3]);
  });

  it("decides a track whose first points have no time at its first timed point", async () => {
    const log: Log = { tS: [0, 1, 2, NaN, NaN, 9000, 9001], trackStart: [0, 0, 0, 1, 0, 0, 0] };
    for (const size of [1, 2, 4, 100]) {
      const c = await split(log, size);
      expect(c.parts.map((p) => [p.offsetS, p.sampleCount, p.firstLine])).toEqual([
        [0, 3, 2],
        [9000, 4, 5],
      ]);
      expect(c.index[1]).toEqual([3, 4, 5, 6]);
      expect(c.tS[1].slice(2)).toEqual([0, 1]);
    }
  });

  it("joins a track without any timed point to the part before it", async () => {
    const c = await split({ tS: [0, 1, NaN, NaN, NaN], trackStart: [0, 0, 1, 0, 0] });
    expect(c.parts).toHaveLength(1);
    expect(c.index[0]).toEqual([0, 1, 2, 3, 4]);
  });

  it("starts a new part at an arming more than the gap after the last armed sample when the log ran on, disarmed", async () => {
    // Armed 0–600 s, then disarmed logging every 10 s (no pause), armed again at 3000 s.
    const tS = range(0, 3600, 10);
    const armed = tS.map((t) => (t <= 600 || t >= 3000 ? 1 : 0));
    const c = await split({ tS, armed }, 16);
    expect(c.parts.map((p) => [p.cause, p.offsetS])).toEqual([
      ["first", 0],
      ["arming", 3000],
    ]);
    expect(c.tS[0].at(-1)).toBe(2990);
    expect(c.tS[1][0]).toBe(0);
    expect(c.tS[1].at(-1)).toBe(600);
  });

  it("starts the new part after the logger's pause, so the second run keeps its power-up and walk out", async () => {
    // Armed 0–600, disarmed to 660, logger off until 3000 (a battery change), disarmed to 3120, armed from 3120.
    const tS = [...range(0, 660, 10), ...range(3000, 3600, 10)];
    const armed = tS.map((t) => (t <= 600 || t >= 3120 ? 1 : 0));
    for (const size of [1, 5, 64, 1000]) {
      const c = await split({ tS, armed }, size);
      expect(c.parts.map((p) => [p.cause, p.offsetS, p.sampleCount])).toEqual([
        ["first", 0, 67],
        ["arming", 3000, 61],
      ]);
      expect(c.tS[0].at(-1)).toBe(660);
      expect(c.tS[1].slice(0, 3)).toEqual([0, 10, 20]);
      expect(c.index.flat()).toEqual(range(0, tS.length - 1));
    }
  });

  it("takes the longest pause when the logger was off more than once between the runs", async () => {
    const tS = [...range(0, 700, 10), ...range(1300, 1400, 10), ...range(3500, 3600, 10), ...range(3700, 4000, 10)];
    const armed = tS.map((t) => (t <= 600 || t >= 3800 ? 1 : 0));
    const c = await split({ tS, armed }, 7);
    expect(c.parts.map((p) => p.offsetS)).toEqual([0, 3500]);
  });

  it("keeps armed periods the gap or less apart in one part, pauses and all, in file order", async () => {
    const tS = [...range(0, 660, 10), ...range(1500, 2000, 10)];
    const armed = tS.map((t) => (t <= 600 || t >= 1700 ? 1 : 0));
    const c = await split({ tS, armed }, 9);
    expect(c.parts).toHaveLength(1);
    expect(c.tS[0]).toEqual(tS);
  });

  it("splits where the log fell silent while armed for more than the gap", async () => {
    const tS = [...range(0, 600, 10), ...range(4000, 4100, 10)];
    const c = await split({ tS, armed: ones(tS.length) }, 8);
    expect(c.parts.map((p) => [p.cause, p.offsetS, p.sampleCount])).toEqual([
      ["first", 0, 61],
      ["arming", 4000, 11],
    ]);
  });

  it("never splits at the log's first arming, however late it comes", async () => {
    const tS = range(0, 7200, 60);
    const armed = tS.map((t) => (t >= 7000 ? 1 : 0));
    expect((await split({ tS, armed })).parts).toHaveLength(1);
  });

  it("does not cut again at the first arming of a part that a far track started", async () => {
    const tS = [0, 10, 20, 10_000, 10_010, 10_020, 10_030];
    const armed = [1, 1, 0, 0, 0, 1, 1];
    const trackStart = [0, 0, 0, 1, 0, 0, 0];
    const c = await split({ tS, armed, trackStart }, 2);
    expect(c.parts.map((p) => [p.cause, p.offsetS, p.sampleCount])).toEqual([
      ["first", 0, 3],
      ["track", 10_000, 4],
    ]);
  });

  it("lets held samples join the current part once more than maxHeldSamples wait, and then cuts at the arming", async () => {
    const tS = [...range(0, 660, 10), ...range(3000, 3600, 10)];
    const armed = tS.map((t) => (t <= 600 || t >= 3120 ? 1 : 0));
    const c = await split({ tS, armed }, 5, { maxHeldSamples: 4 });
    expect(c.parts.map((p) => p.offsetS)).toEqual([0, 3120]);
    expect(c.index.flat()).toEqual(range(0, tS.length - 1));
  });

  it("slices RC channels with their samples", async () => {
    const c = await split({ ...twoTracks(7200), rc: true }, 4);
    expect(c.rc[0]).toEqual(range(1000, 1005));
    expect(c.rc[1]).toEqual(range(1006, 1011));
  });

  it("reads batches without writing to them", async () => {
    const log = twoTracks(7200);
    const input = batches(log, 4);
    const before = input.map((b) => [Array.from(b.columns.tS), Array.from(b.segmentStart)]);
    const splitter = new RunSplitter({ startPart: () => {}, batch: () => {}, endPart: () => {} }, { gapS: GAP });
    for (const b of input) await splitter.push(b);
    await splitter.finish();
    expect(input.map((b) => [Array.from(b.columns.tS), Array.from(b.segmentStart)])).toEqual(before);
  });

  it("gives no part for an empty stream, and refuses a gap that is not positive", async () => {
    const splitter = new RunSplitter({ startPart: () => {}, batch: () => {}, endPart: () => {} }, { gapS: GAP });
    expect(await splitter.finish()).toEqual([]);
    expect(() => new RunSplitter({ startPart: () => {}, batch: () => {}, endPart: () => {} }, { gapS: 0 })).toThrow(/gapS/);
    expect(() => new RunSplitter({ startPart: () => {}, batch: () => {}, endPart: () => {} }, { gapS: NaN })).toThrow(/gapS/);
  });

  it("gives every sample to exactly one part, in order, whatever the batch size", async () => {
    const tS = [...range(0, 300, 5), ...range(2500, 2600, 5), NaN, ...range(9000, 9100, 5)];
    const armed = tS.map((t) => (t <= 200 || (t >= 2550 && t <= 2600) ? 1 : 0));
    const trackStart = tS.map((_, i) => (i === 82 ? 1 : 0));
    const shapes = new Set<string>();
    for (const size of [1, 2, 3, 7, 13, 64, 500]) {
      const c = await split({ tS, armed, trackStart }, size);
      expect(c.index.flat()).toEqual(range(0, tS.length - 1));
      shapes.add(JSON.stringify(c.parts));
    }
    expect(shapes.size).toBe(1);
    expect(JSON.parse([...shapes][0]).map((p: RunPart) => p.cause)).toEqual(["first", "arming", "track"]);
  });
});

describe("partStartedAt", () => {
  it("adds the part's offset to the log's start, to the millisecond below, and has no start for an undated log", () => {
    expect(partStartedAt(new Date("2010-01-01T14:48:37.519Z"), 197_335_472.1891578)!.toISOString()).toBe("2016-04-03T14:13:09.708Z");
    expect(partStartedAt(new Date("2026-03-14T09:00:00.000Z"), -0.0004)!.toISOString()).toBe("2026-03-14T08:59:59.999Z");
    expect(partStartedAt(null, 10)).toBeNull();
    expect(partStartedAt(new Date(0), NaN)).toBeNull();
  });
});
