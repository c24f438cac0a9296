/**
 * Real GPX files from five GPX libraries' test folders, analysed as `npm run analyse` analyses them
 * (lib/offline/analyse-log-file.ts), against the values each library's own tests assert:
 * `stated` in ../shared/reference/real/expected.json, with the file and line of each assertion
 * (SOURCES.md §2: dougfales/gpx tests/*.rb, tkrajina/gpxgo gpx/gpx_test.go, jenetics/jpx
 * GPXTest.java, Sibyx/phpGPX tests/LoadFileTest.php, tkrajina/gpxpy test.py).
 *
 * Tolerances. The libraries measure on a sphere (haversine, R = 6371 km; gpxgo an equirectangular
 * 111,120 m per degree under 0.2°); Sortie measures geodesics on the WGS84 ellipsoid
 * (geographiclib). The two differ by up to ≈ 0.5 % in length depending on latitude and heading
 * (WGS84's radius of curvature runs 6,335–6,400 km against the sphere's 6,371 km), so lengths are
 * compared within 0.5 %. Durations are differences of the file's own timestamps and must match to
 * the second (phpGPX truncates fractions: within 1 s there). Where Sortie's answer deliberately
 * differs from the library's, DELIBERATE names it and says why, and the test checks Sortie's own
 * value instead.
 *
 * Files are read in place from ../shared/reference/real (never copied into the project); without
 * that folder the suite is reported as skipped.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { analyseLogFile, type LogFileDocument } from "@/lib/offline/analyse-log-file";

const REAL = path.resolve(process.cwd(), "../shared/reference/real");
const present = fs.existsSync(path.join(REAL, "expected.json"));
const absent = present ? "" : " — skipped: ../shared/reference/real (the public test data) is not in this workplace";

interface Stated {
  key: string;
  value: unknown;
  where: string;
}
interface Entry {
  file: string;
  kind: string;
  stated: Stated[];
  computed: { lengthGeodesicWGS84M?: number; trackPointsTotal?: number };
}
const entries: Entry[] = present ? (JSON.parse(fs.readFileSync(path.join(REAL, "expected.json"), "utf8")).entries as Entry[]).filter((e) => e.kind === "gpx") : [];
const entry = (file: string) => entries.find((e) => e.file === file)!;
const stated = (file: string, key: string) => {
  const s = entry(file).stated.find((x) => x.key === key);
  if (!s) throw new Error(`${file} states no ${key}`);
  return s.value;
};

/** Sphere vs WGS84 geodesic, see the header. */
const LENGTH_TOLERANCE = 0.005;
const within = (actual: number | null | undefined, expected: number, rel: number) => {
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected) / expected).toBeLessThanOrEqual(rel);
};

const cache = new Map<string, Promise<LogFileDocument[]>>();
const analyse = (file: string) => {
  if (!cache.has(file)) cache.set(file, analyseLogFile(path.join(REAL, file)));
  return cache.get(file)!;
};
const totalSamples = (docs: LogFileDocument[]) => docs.reduce((n, d) => n + d.samples, 0);

/**
 * Where Sortie does not give the library's answer on purpose. Each names the library's value and
 * why Sortie's differs; the tests below check Sortie's value.
 */
const DELIBERATE = {
  "gpx/one_segment_mixed_times.gpx":
    "the library's durationS 0.0 comes from four out-of-order times among 588 points; Sortie treats those times as unusable (fewer than half the points are timed) and reports no duration at all, 'not available', rather than 0",
  "gpx/big.gpx":
    "the library's moving time 57,645 s sums every segment's span; Sortie's leaves out the steps it judged position jumps (a handful of fixes implying over 98 m/s, three times this car's median pace), so it is a few seconds shorter and the distance and mean speed follow",
  "gpx/tracks.gpx":
    "the library asserts only counts; its per-file length would bridge three tracks and include a 12,495 km step from stale fixes dated 2003: Sortie makes three runs, leaves the stale fixes and pauses over 30 min out of the distance, and never counts a teleport",
} as const;

describe.skipIf(!present)(`real GPX files against their libraries' stated values${absent}`, () => {
  it("covers the ten files SOURCES.md §2 lists", () => {
    expect(entries.map((e) => e.file).sort()).toEqual(
      [
        "gpx/Gpx-full-sample.gpx", "gpx/Mojstrovka.gpx", "gpx/big.gpx", "gpx/file.gpx", "gpx/one_segment.gpx",
        "gpx/one_segment_mixed_times.gpx", "gpx/one_track.gpx", "gpx/timezero.gpx", "gpx/tracks.gpx", "gpx/with_empty_tracks.gpx",
      ].sort(),
    );
  });

  it.each(entries.filter((e) => e.stated.some((s) => s.key === "trackPoints")).map((e) => e.file))("reads every point the library counts in %s", async (file) => {
    expect(totalSamples(await analyse(file))).toBe(stated(file, "trackPoints"));
  });

  // dougfales/gpx tests/gpx_file_test.rb:67-80 (one_track.gpx): 3.0724966849262554 km, 15237 s, moving 3036 s, 3.6432767 km/h.
  it("one_track.gpx: distance, duration, moving time and mean speed as gpx_file_test.rb:77-80 asserts", async () => {
    const [d] = await analyse("gpx/one_track.gpx");
    within(d.summary.distanceM, (stated("gpx/one_track.gpx", "distanceKm") as number) * 1000, LENGTH_TOLERANCE);
    expect(d.summary.durationS).toBe(stated("gpx/one_track.gpx", "durationS"));
    expect(d.summary.track.movingS).toBe(stated("gpx/one_track.gpx", "movingDurationS"));
    within(d.summary.track.meanSpeedMps! * 3.6, stated("gpx/one_track.gpx", "averageSpeedKmh") as number, 0.01); // speeds are rounded to 0.01 m/s
  });

  // dougfales/gpx tests/segment_test.rb:18-24 (one_segment.gpx): 189 points, 6.98803 km, 4466 s.
  it("one_segment.gpx: distance and duration as segment_test.rb:23-24 asserts", async () => {
    const [d] = await analyse("gpx/one_segment.gpx");
    within(d.summary.distanceM, (stated("gpx/one_segment.gpx", "distanceKm") as number) * 1000, LENGTH_TOLERANCE);
    expect(d.summary.durationS).toBe(stated("gpx/one_segment.gpx", "durationS"));
    expect(d.startedAt?.getTime()).toBe((stated("gpx/one_segment.gpx", "earliestPointUnixTime") as number) * 1000);
  });

  // dougfales/gpx tests/segment_test.rb:114-118: 588 points, 40.763726054 km; the duration: DELIBERATE.
  it("one_segment_mixed_times.gpx: the length from the geometry, and no duration (never negative)", async () => {
    const [d] = await analyse("gpx/one_segment_mixed_times.gpx");
    within(d.summary.distanceM, (stated("gpx/one_segment_mixed_times.gpx", "distanceKm") as number) * 1000, LENGTH_TOLERANCE);
    expect(DELIBERATE["gpx/one_segment_mixed_times.gpx"]).toContain("not available");
    expect(d.summary.durationS).toBeNull();
    expect(d.summary.timing.usable).toBe(false);
    expect(d.warnings.find((w) => w.code === "no-times")?.message).toMatch(/^Only 4 of 588 points have a time/);
    expect(d.startedAt).toBeNull();
    expect(d.events.filter((e) => e.kind === "position-jump")).toEqual([]);
  });

  // dougfales/gpx tests/gpx_file_test.rb:44-49 (with_empty_tracks.gpx): 21 s, moving 21 s, 6.674 km/h.
  it("with_empty_tracks.gpx: empty segments ignored; duration, moving time and speed as gpx_file_test.rb:47-49 asserts", async () => {
    const docs = await analyse("gpx/with_empty_tracks.gpx");
    expect(docs).toHaveLength(1);
    const [d] = docs;
    expect(d.summary.durationS).toBe(stated("gpx/with_empty_tracks.gpx", "durationS"));
    expect(d.summary.track.movingS).toBe(stated("gpx/with_empty_tracks.gpx", "movingDurationS"));
    within(d.summary.track.meanSpeedMps! * 3.6, stated("gpx/with_empty_tracks.gpx", "averageSpeedKmh") as number, LENGTH_TOLERANCE + 0.005); // + rounding to 0.01 m/s
  });

  // dougfales/gpx tests/gpx_file_test.rb:25-29 (big.gpx): 7968 points, 105508 s, moving 57645 s, 99.607 km/h.
  it("big.gpx: a car at highway pace is not a string of jumps; ≈ 1,595 km at ≈ 99.6 km/h as gpx_file_test.rb:27-29 asserts", async () => {
    const [d] = await analyse("gpx/big.gpx");
    const moving = stated("gpx/big.gpx", "movingDurationS") as number;
    const kmh = stated("gpx/big.gpx", "averageSpeedKmh") as number;
    expect(d.summary.durationS).toBe(stated("gpx/big.gpx", "durationS"));
    // The bound follows the log's own pace (≈ 3 × its 32.6 m/s median), not the ground default of 30 m/s.
    expect(d.summary.track.jumpBoundFrom).toBe("log-steps");
    expect(d.summary.track.jumpBoundMps).toBeGreaterThan(90);
    const jumps = d.events.filter((e) => e.kind === "position-jump");
    expect(jumps.length).toBeLessThan(20); // was 2,334 with a fixed 30 m/s bound
    // DELIBERATE: the jump steps are left out, a few seconds of 57,645 s.
    expect(DELIBERATE["gpx/big.gpx"]).toContain("moving time");
    within(d.summary.track.movingS, moving, 0.002);
    within(d.summary.distanceM, ((kmh * moving) / 3600) * 1000, LENGTH_TOLERANCE);
    within(d.summary.track.meanSpeedMps! * 3.6, kmh, LENGTH_TOLERANCE);
  });

  // tkrajina/gpxgo gpx/gpx_test.go:527,657 (file.gpx): Length2D 56.776 m, duration 64 s.
  it("file.gpx: length and duration as gpx_test.go:527 and :657 assert", async () => {
    const [d] = await analyse("gpx/file.gpx");
    within(d.summary.distanceM, stated("gpx/file.gpx", "segment0Length2dM") as number, LENGTH_TOLERANCE);
    expect(d.summary.durationS).toBe(stated("gpx/file.gpx", "gpxDurationS"));
    expect(d.startedAt?.toISOString()).toBe(new Date(stated("gpx/file.gpx", "firstPointTime") as string).toISOString());
  });

  // jenetics/jpx GPXTest.java:303-345 (Gpx-full-sample.gpx): 2747 points; the first at 55.753572, 37.808250, 3 satellites.
  it("Gpx-full-sample.gpx: home waits for a good fix, not the first point's 3 satellites (GPXTest.java:313-345)", async () => {
    const [d] = await analyse("gpx/Gpx-full-sample.gpx");
    const first = stated("gpx/Gpx-full-sample.gpx", "firstPoint") as { lat: number; lon: number; sat: number };
    expect(first.sat).toBeLessThan(6);
    expect(d.summary.home?.source).toBe("first-good-fix");
    expect(d.summary.home!.sats).toBeGreaterThanOrEqual(6);
    expect(d.summary.home!.hdop).toBeLessThanOrEqual(2.5);
    expect([d.summary.home!.lat, d.summary.home!.lon]).not.toEqual([first.lat, first.lon]);
  });

  // Sibyx/phpGPX tests/LoadFileTest.php:78-215 (timezero.gpx): two tracks six years apart, 2.314 m / 9 s and 7.063 m / 3 s.
  it("timezero.gpx: two tracks six years apart are two runs with LoadFileTest.php's lengths and durations", async () => {
    const docs = await analyse("gpx/timezero.gpx");
    expect(docs).toHaveLength(2);
    for (const [i, d] of docs.entries()) {
      within(d.summary.distanceM, stated("gpx/timezero.gpx", `track${i}DistanceM`) as number, 0.05); // lengths are rounded to 0.1 m
      // phpGPX truncates fractional seconds (9.04 s → 9.0): within 1 s.
      expect(Math.abs(d.summary.durationS! - (stated("gpx/timezero.gpx", `track${i}DurationS`) as number))).toBeLessThan(1);
      const [start] = stated("gpx/timezero.gpx", `track${i}StartedFinished`) as string[];
      expect(Math.abs(d.startedAt!.getTime() - Date.parse(start))).toBeLessThan(1000);
    }
  });

  // dougfales/gpx tests/track_file_test.rb:17-30 (tracks.gpx): 3 tracks of 389, 299 and 861 points.
  it("tracks.gpx: three tracks are three runs; stale fixes and teleports never enter a distance", async () => {
    const docs = await analyse("gpx/tracks.gpx");
    expect(docs).toHaveLength(stated("gpx/tracks.gpx", "tracks") as number);
    const sizes = (stated("gpx/tracks.gpx", "track2SegmentSizes") as number[]).reduce((a, b) => a + b, 0);
    expect(docs.map((d) => d.samples)).toEqual([
      (stated("gpx/tracks.gpx", "track0") as { points: number }).points,
      (stated("gpx/tracks.gpx", "track1") as { points: number }).points,
      sizes,
    ]);
    expect(DELIBERATE["gpx/tracks.gpx"]).toContain("teleport");
    for (const d of docs.slice(1)) {
      // The stale 2003 fixes in Taiwan are set aside: home is in North America, and no figure spans an ocean.
      expect(d.summary.track.staleFixes).toBeGreaterThanOrEqual(3);
      expect(d.summary.home!.lon).toBeLessThan(-60);
      expect(d.summary.distanceM!).toBeLessThan(100_000);
      expect(d.summary.durationS!).toBeGreaterThan(0);
      expect(d.summary.durationS!).toBeLessThan(30 * 86_400);
    }
    // Track 0 has no stale lead: its length is its segment's, less the steps over pauses longer than 30 min.
    expect(docs[0].summary.track.staleFixes).toBe(0);
    expect(docs[0].summary.distanceM!).toBeLessThan(31_091);
  });

  // tkrajina/gpxpy test.py:449-451 (Mojstrovka.gpx): every point stamped 1901-12-13T20:45:52.207…, the −2^31 s placeholder.
  it("Mojstrovka.gpx: a placeholder time on every point gives no clock, but the track keeps its length and map", async () => {
    const [d] = await analyse("gpx/Mojstrovka.gpx");
    expect(stated("gpx/Mojstrovka.gpx", "firstPointTime")).toMatch(/^1901-12-13/);
    expect(d.summary.timing.usable).toBe(false);
    expect(d.warnings.find((w) => w.code === "no-times")?.message).toMatch(/one placeholder time \(1901-12-13T20:45:52/);
    expect(d.summary.durationS).toBeNull();
    expect(d.summary.maxSpeedMps).toBeNull();
    expect(d.startedAt).toBeNull();
    // No length is stated by the library; the cross-check is expected.json's computed WGS84 geodesic (geographiclib 2.0).
    within(d.summary.distanceM, entry("gpx/Mojstrovka.gpx").computed.lengthGeodesicWGS84M!, 0.001);
    expect(d.summary.home).not.toBeNull();
  });

  it("no GPX file gives a negative or non-finite duration", async () => {
    for (const e of entries) for (const d of await analyse(e.file)) if (d.summary.durationS !== null) expect(d.summary.durationS).toBeGreaterThanOrEqual(0);
  });

  it("gives every run of every file a home on one of its fixes", async () => {
    for (const e of entries) for (const d of await analyse(e.file)) expect(d.summary.home, e.file).not.toBeNull();
  });
}, 300_000);
