/**
 * Real NMEA 0183 captures from ten receivers (the GPSD project's regression suite, BSD-2-Clause),
 * analysed as `npm run analyse` analyses them, against the decode GPSD's own regression test states
 * for each file: `stated_by_gpsd_chk` in ../shared/reference/real/expected.json, read off
 * `test/daemon/<name>.log.chk` of github.com/ntpsec/gpsd at 46977faa8f94eb036ca68c24a3fc0d233732e707
 * (SOURCES.md §1; the .chk line of each first and last fix is in expected.json as `chkLine`).
 *
 * How the counts map. GPSD's "fix times" are the distinct `time` values of its TPV reports with
 * mode ≥ 2 (a 2D or 3D fix) and a position. Sortie's fixes are the samples (one per fix epoch) with a
 * position and a fix type other than 0 — the same notion: a time at which the receiver stated a
 * position fix. The analysis later drops fixes it cannot use (fewer than 5 satellites, position
 * jumps); that is not a decoding matter and is not compared here. Where the two decoders disagree on
 * a time, DELIBERATE below names the time, the log line and why; everything else must match
 * exactly, and the test also reads the .chk itself so each difference is checked, not only counted.
 *
 * Files are read in place from ../shared/reference/real (never copied into the project); without
 * that folder the suite is reported as skipped.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { geodesicDistance } from "@/lib/analysis/geodesy";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import { peek } from "@/lib/ingest/byte-source";
import { detectFormat } from "@/lib/parsers/detect-format";
import { decodeNmeaSentence } from "@/lib/parsers/nmea-sentence";
import { parseLog } from "@/lib/parsers/parse-log";

const REAL = path.resolve(process.cwd(), "../shared/reference/real");
const present = fs.existsSync(path.join(REAL, "expected.json"));
/** The one-line reason a skipped suite gives. */
const absent = present ? "" : " — skipped: ../shared/reference/real (the public test data) is not in this workplace";

interface GpsdFix {
  chkLine: number;
  time: string;
  lat: number;
  lon: number;
}
interface Entry {
  file: string;
  kind: string;
  expectedOutputFile: string;
  stated_by_gpsd_chk: { acceptedSentencesEchoed: number; distinctFixTimes: number; firstFix: GpsdFix; lastFix: GpsdFix };
}
const entries: Entry[] = present ? (JSON.parse(fs.readFileSync(path.join(REAL, "expected.json"), "utf8")).entries as Entry[]).filter((e) => e.kind === "nmea0183") : [];

/** A fix as Sortie reports it: time = startedAt + tS, to the millisecond. */
interface Fix {
  time: string;
  lat: number;
  lon: number;
}
/** Where Sortie deliberately differs from GPSD, with the exact value it gives instead and why. */
interface Deliberate {
  onlySortie?: { time: string; why: string }[];
  onlyGpsd?: { time: string; why: string }[];
  first?: Fix & { why: string };
  last?: Fix & { why: string };
  /** Largest distance between the two decoders' positions at the same time, m, and why it is not ~0. */
  positionToleranceM?: { m: number; why: string };
}

// Sortie dates a GGA written before the log's first RMC from that later RMC (one continuous
// timeline); GPSD has no date yet when it reads it and reports the fix without a time.
const NO_DATE_YET = "a GGA before the first dated sentence: GPSD reports its fix without a time, Sortie dates it from the RMC that follows";

const DELIBERATE: Record<string, Deliberate> = {
  "nmea/bundg_zeus_9.log": {
    onlySortie: [
      { time: "2018-08-20T09:47:36.000Z", why: `log line 25, ${NO_DATE_YET} (line 33)` },
      {
        time: "2018-08-20T09:48:16.000Z",
        why: "log lines 1353 (RMC) and 1380 (GGA): the receiver writes the next GLL (line 1382) already stamped 09:48:17, which closes GPSD's cycle before it reports 09:48:16",
      },
    ],
    onlyGpsd: [{ time: "2018-08-20T09:50:04.000Z", why: "log line 5007 is a GLL, the only sentence of that second; Sortie builds samples from GGA and RMC (README, Log formats)" }],
    first: { time: "2018-08-20T09:47:36.000Z", lat: 52 + 51.0094 / 60, lon: 5 + 18.8172 / 60, why: `GGA of log line 25, ${NO_DATE_YET}` },
    last: { time: "2018-08-20T09:50:03.000Z", lat: 52 + 50.8736 / 60, lon: 5 + 18.5095 / 60, why: "RMC of log line 4979; GPSD's last (09:50:04) is GLL-only" },
    positionToleranceM: {
      m: 5,
      why: "this chartplotter writes a second's GGA, GLL and RMC with different positions (RMC up to a second behind, GLL 0.0001′ ≈ 0.2 m off, SOURCES.md §1); Sortie takes GGA's, GPSD reports the last it read; the boat makes ≈ 2.9 m/s; measured at most 3.1 m",
    },
  },
  "nmea/gp-320fw-2019-04-07-coldboot.log": {
    onlySortie: [{ time: "2019-04-07T00:03:43.030Z", why: `log line 22, ${NO_DATE_YET} (line 29); GPSD's report of it is .chk line 3` }],
    first: { time: "2019-04-07T00:03:43.030Z", lat: 48 + 8.9993 / 60, lon: 11 + 35.0798 / 60, why: `GGA of log line 22, ${NO_DATE_YET}` },
  },
  "nmea/haicom-305N.log": {
    onlySortie: [
      {
        time: "2007-04-08T09:53:04.802Z",
        why: "log lines 37 (GGA quality 1 with 0 satellites, HDOP 17) and 42 (RMC status A): GPSD's reports of this epoch (.chk lines 51, 54 and 59) carry no time; Sortie keeps the fix the receiver states, and the analysis then leaves it out for having fewer than 5 satellites",
      },
    ],
    first: { time: "2007-04-08T09:53:04.802Z", lat: -(27 + 12.652 / 60), lon: 153 + 3.1397 / 60, why: "the epoch above" },
  },
  "nmea/quectel-l76k-nmea.log": {
    onlySortie: [
      {
        time: "2026-08-05T05:53:04.000Z",
        why: "log line 2291, the capture's last GGA: GPSD reports each epoch of this receiver once its RMC and ZDA arrive (e.g. .chk line 3320 after the RMC and ZDA of 05:53:03.800), and the capture ends before they do; the GGA states a 14-satellite fix",
      },
    ],
    last: { time: "2026-08-05T05:53:04.000Z", lat: 47 + 39.7187 / 60, lon: -(122 + 19.58353 / 60), why: "the epoch above" },
  },
};

// GPSD prints positions with 9 decimals (1e-9° ≤ 0.11 mm); both decoders read the same ddmm.mmmm
// text, so where they take the same sentence they agree to that rounding.
const SAME_SENTENCE_M = 0.001;

/** GPSD's fix times: TPV reports with mode ≥ 2, a time and a position, first report of each time. */
function gpsdFixes(chkFile: string): Map<string, GpsdFix> {
  const out = new Map<string, GpsdFix>();
  fs.readFileSync(chkFile, "utf8")
    .split("\n")
    .forEach((l, i) => {
      if (!l.startsWith('{"class":"TPV"')) return;
      const r = JSON.parse(l);
      if (r.mode >= 2 && r.time && Number.isFinite(r.lat) && Number.isFinite(r.lon) && !out.has(r.time)) out.set(r.time, { chkLine: i + 1, time: r.time, lat: r.lat, lon: r.lon });
    });
  return out;
}

/**
 * Every sentence of the log as a reader of NMEA 0183 sees it: each `$` or `!` starts one, up to the
 * next; `#` lines are the capture's comments; a line without either is no sentence at all.
 */
function sentencesOf(logFile: string): { pieces: string[]; otherLines: number } {
  const pieces: string[] = [];
  let otherLines = 0;
  const edges = /^[\s\x00-\x1f\x7f]+|[\s\x00-\x1f\x7f]+$/g;
  for (const raw of fs.readFileSync(logFile, "utf8").split(/\r\n|\r|\n/)) {
    const line = raw.replace(edges, "");
    if (line === "" || line.startsWith("#")) continue;
    const found = line.match(/[$!][^$!]*/g);
    if (found) pieces.push(...found.map((p) => p.replace(edges, "")));
    else otherLines++;
  }
  return { pieces, otherLines };
}

/** detectFormat → parseLog → SeriesCollector → analyseRun, as scripts/analyse.ts does; once per file. */
const analysed = new Map<string, ReturnType<typeof analyseOnce>>();
const analyse = (file: string) => {
  if (!analysed.has(file)) analysed.set(file, analyseOnce(file));
  return analysed.get(file)!;
};

async function analyseOnce(file: string) {
  const { head, source } = await peek(fs.createReadStream(file));
  const format = detectFormat(head, file);
  const collector = new SeriesCollector();
  const parsed = await parseLog(format, source, { onBatch: (b) => collector.add(b) });
  const series = collector.series(parsed.modeNames);
  const { summary } = analyseRun(series);
  const at = (i: number) => new Date(parsed.startedAt!.getTime() + Math.round(series.tS[i] * 1000)).toISOString();
  const times = Array.from({ length: series.n }, (_, i) => at(i));
  const fixes: Fix[] = [];
  for (let i = 0; i < series.n; i++) {
    if (!Number.isFinite(series.lat[i]) || !Number.isFinite(series.lon[i]) || series.fixType[i] === 0) continue;
    fixes.push({ time: at(i), lat: series.lat[i], lon: series.lon[i] });
  }
  return { format, parsed, summary, fixes, times };
}

const metres = (a: { lat: number; lon: number }, b: { lat: number; lon: number }) => geodesicDistance(a.lat, a.lon, b.lat, b.lon);

describe.skipIf(!present)(`real NMEA 0183 captures against GPSD's stated decode${absent}`, () => {
  it("covers the ten captures SOURCES.md §1 lists", () => {
    expect(entries).toHaveLength(10);
    for (const k of Object.keys(DELIBERATE)) expect(entries.map((e) => e.file)).toContain(k);
  });

  describe.each(entries.map((e) => [e.file, e] as const))("%s", (file, e) => {
    const d = DELIBERATE[file] ?? {};
    const stated = e.stated_by_gpsd_chk;

    it("has GPSD's fix times, except the deliberate differences, at GPSD's positions", async () => {
      const { format, parsed, fixes } = await analyse(path.join(REAL, file));
      expect(format).toBe("nmea");
      expect(parsed.startedAt).not.toBeNull();
      const gpsd = gpsdFixes(path.join(REAL, e.expectedOutputFile));
      expect(gpsd.size).toBe(stated.distinctFixTimes); // our reading of the .chk = the stated count
      const ours = new Map(fixes.map((f) => [f.time, f]));
      expect(ours.size).toBe(fixes.length); // one sample per fix epoch: no time twice
      expect([...ours.keys()].filter((t) => !gpsd.has(t)).sort()).toEqual((d.onlySortie ?? []).map((x) => x.time).sort());
      expect([...gpsd.keys()].filter((t) => !ours.has(t)).sort()).toEqual((d.onlyGpsd ?? []).map((x) => x.time).sort());
      expect(fixes.length).toBe(stated.distinctFixTimes + (d.onlySortie?.length ?? 0) - (d.onlyGpsd?.length ?? 0));
      const tolerance = d.positionToleranceM?.m ?? SAME_SENTENCE_M;
      for (const [t, g] of gpsd) if (ours.has(t)) expect(metres(ours.get(t)!, g), `${t} (.chk line ${g.chkLine})`).toBeLessThanOrEqual(tolerance);
    });

    it("skips as damage exactly the sentences GPSD did not accept, all counted in one warning", async () => {
      // The .chk echoes every sentence GPSD accepted (SOURCES.md §1, regress-driver line 13).
      const echoed = fs.readFileSync(path.join(REAL, e.expectedOutputFile), "utf8").split("\n").filter((l) => /^[$!]/.test(l)).map((l) => l.trim());
      expect(echoed).toHaveLength(stated.acceptedSentencesEchoed);
      const accepted = new Set(echoed);
      const { pieces, otherLines } = sentencesOf(path.join(REAL, file));
      const damaged = pieces.filter((p) => ["truncated", "bad-checksum", "unparsed"].includes(decodeNmeaSentence(p).kind));
      for (const p of pieces) expect(accepted.has(p), p).toBe(!damaged.includes(p));
      const { parsed } = await analyse(path.join(REAL, file));
      const junk = parsed.warnings.filter((w) => w.code === "skipped-junk");
      expect(junk.length).toBeLessThanOrEqual(1);
      expect(junk[0]?.count ?? 0).toBe(damaged.length + otherLines);
    });

    it("makes one sample per epoch: no two samples share a time", async () => {
      const { times } = await analyse(path.join(REAL, file));
      expect(new Set(times).size).toBe(times.length);
    });

    it("starts and ends where GPSD does (or where DELIBERATE says), dated by startedAt + tS", async () => {
      const { parsed, fixes } = await analyse(path.join(REAL, file));
      const first = d.first ?? stated.firstFix;
      const last = d.last ?? stated.lastFix;
      expect(fixes[0].time).toBe(first.time); // both read the time text to the millisecond
      expect(fixes.at(-1)!.time).toBe(last.time);
      expect(metres(fixes[0], first)).toBeLessThanOrEqual(d.positionToleranceM?.m ?? SAME_SENTENCE_M);
      expect(metres(fixes.at(-1)!, last)).toBeLessThanOrEqual(d.positionToleranceM?.m ?? SAME_SENTENCE_M);
      // The run starts at its first sample, which may precede the first fix (epochs without a fix).
      expect(parsed.startedAt!.getTime()).toBeLessThanOrEqual(Date.parse(first.time));
      expect(parsed.startedAt!.toISOString().slice(0, 10)).toBe(first.time.slice(0, 10));
    });

    it("goes through the analysis with a home on a fix, except where no fix is usable", async () => {
      const { summary } = await analyse(path.join(REAL, file));
      if (file.endsWith("coldboot.log")) {
        // Its only fixes have 4 satellites; the analysis uses fixes with at least 5 (thresholds
        // minSats), so the run is analysed as one without a usable fix (a bench run).
        expect(summary.bench).toBe(true);
        expect(summary.home).toBeNull();
      } else {
        expect(summary.bench).toBe(false);
        expect(summary.home).not.toBeNull();
      }
    });
  });
});

describe.skipIf(!present)(`ch-4711: GP, GL and GN sentences of one epoch${absent}`, () => {
  it("are 14 samples, 7 with a fix and 7 after the receiver lost lock", async () => {
    // SOURCES.md §1: GGA and RMC come as GN, GL or GP pairs, and "7 GGA have no fix" (quality 0, RMC
    // status V) after the header's "loses satellite lock near the end". Each pair is one sample;
    // the 7 without a fix stay samples, so the analysis can show the fix being lost.
    const { parsed, fixes } = await analyse(path.join(REAL, "nmea/ch-4711.log"));
    expect(parsed.sampleCount).toBe(14);
    expect(fixes).toHaveLength(7);
  });
});

describe.skipIf(!present)(`npm run analyse on every real NMEA capture${absent}`, () => {
  const tsx = path.resolve("node_modules/.bin/tsx");
  // Without the data one placeholder case stands in, reported as skipped with the suite's reason.
  it.each(present ? entries.map((e) => e.file) : ["(no capture)"])(
    "exits 0 with a JSON document for %s",
    (file) => {
      // Generous: tsx compiles the script on each start, and the suite runs files in parallel.
      const r = spawnSync(tsx, ["scripts/analyse.ts", path.join(REAL, file), "--json"], { encoding: "utf8", timeout: 120_000 });
      expect(r.status, r.stderr).toBe(0);
      const doc = JSON.parse(r.stdout);
      expect(doc.format).toBe("nmea");
      expect(doc.samples).toBeGreaterThan(0);
    },
    150_000,
  );
});
