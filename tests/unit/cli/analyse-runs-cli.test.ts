/**
 * `npm run analyse` on files holding several separate runs: `{"runs": [ … ]}`, one document per
 * run, each shaped as a single run's. Our own two-run logs (tests/helpers/multi-run-logs.ts), and
 * timezero.gpx from ../shared/reference/real (never copied into the project), whose two tracks lie
 * six years apart.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { twoArmedPeriodsCsv, twoTrackGpx } from "@/tests/helpers/multi-run-logs";

const tsx = path.resolve("node_modules/.bin/tsx");
const analyse = (file: string) => spawnSync(tsx, ["scripts/analyse.ts", file, "--json"], { encoding: "utf8", timeout: 60_000 });
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sortie-cli-runs-"));
const REAL = path.resolve(process.cwd(), "../shared/reference/real");
const TIMEZERO = path.join(REAL, "gpx/timezero.gpx");

interface RunDoc {
  format: string;
  samples: number;
  startedAt: string | null;
  warnings: unknown[];
  summary: { durationS: number; distanceM: number; verdict: { level: string } };
  events: unknown[];
}

function runsOf(file: string): RunDoc[] {
  const r = analyse(file);
  expect(r.status, r.stderr).toBe(0);
  const doc = JSON.parse(r.stdout) as { runs?: RunDoc[] };
  expect(Object.keys(doc)).toEqual(["runs"]);
  return doc.runs!;
}

describe("npm run analyse on a file holding several runs", () => {
  it.each([twoTrackGpx(), twoArmedPeriodsCsv()])("prints {runs: […]} for $fileName, each run with its own samples, start and duration", (log) => {
    const file = path.join(dir, log.fileName);
    fs.writeFileSync(file, log.body);
    const runs = runsOf(file);
    expect(runs.map((r) => [r.samples, r.startedAt, r.summary.durationS])).toEqual(log.runs.map((r) => [r.samples, r.startedAt, r.durationS]));
    for (const r of runs) {
      // Each document is shaped as a single run's.
      expect(Object.keys(r)).toEqual(expect.arrayContaining(["format", "samples", "startedAt", "warnings", "summary", "events"]));
      expect(r.summary.distanceM).toBeGreaterThan(50);
    }
  });

  it("prints the single document, without a runs list, for a file holding one run", () => {
    const log = twoTrackGpx();
    // The same two tracks one minute apart (the second moved from 12:00 to 09:03) are one run:
    // the gap is 30 min by default.
    const file = path.join(dir, "one-sortie.gpx");
    fs.writeFileSync(file, log.body.replace(/T12:00:/g, "T09:03:").replace(/T12:01:/g, "T09:04:"));
    const r = analyse(file);
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.runs).toBeUndefined();
    expect(doc.samples).toBe(210);
  });
});

describe.skipIf(!fs.existsSync(TIMEZERO))(`timezero.gpx as two runs (needs ${TIMEZERO}; skipped when the shared reference folder is absent)`, () => {
  it("cuts the two tracks six years apart into two runs of 9 s and 3 s", () => {
    const runs = runsOf(TIMEZERO);
    expect(runs).toHaveLength(2);
    // Sibyx/phpGPX tests/LoadFileTest.php:112 and :215 state 9.0 s and 3.0 s; the library truncates
    // fractional seconds before subtracting, which moves a difference by less than 1 s either way.
    expect(Math.abs(runs[0].summary.durationS - 9)).toBeLessThan(1);
    expect(Math.abs(runs[1].summary.durationS - 3)).toBeLessThan(1);
    // The raw timestamps (expected.json computed.tracks[].segments[].firstToLastTimeS): 9.043927 and
    // 2.967235 s; the summary rounds to the millisecond.
    expect(runs[0].summary.durationS).toBeCloseTo(9.044, 3);
    expect(runs[1].summary.durationS).toBeCloseTo(2.967, 3);
    // Each run starts at its own track's first point (LoadFileTest.php:102; expected.json firstTimedPoint),
    // to the millisecond below.
    expect(runs.map((r) => r.startedAt)).toEqual(["2010-01-01T14:48:37.519Z", "2016-04-03T14:13:09.708Z"]);
    expect(runs.map((r) => r.samples)).toEqual([3, 3]);
  });
});
