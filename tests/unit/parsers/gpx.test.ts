import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { XMLParser } from "fast-xml-parser";
import { afterAll, afterEach, describe, expect, it, vi } from "vitest";
import { GPX_REFERENCE_DIR, parseErrorOfAsync } from "@/tests/helpers/parse-errors";
import { parseGpx, type GpxParseOptions } from "@/lib/parsers/gpx";
import { ParseError, type ParseSummary } from "@/lib/parsers/types";
import { byteChunks, collectSamples } from "@/tests/helpers/byte-source";

const GPX_DIR = GPX_REFERENCE_DIR;
const readRef = (file: string) => fs.readFileSync(path.join(GPX_DIR, file), "utf8");

async function run(text: string, opts: Partial<GpxParseOptions> = {}, chunk = 4096) {
  const { onBatch, samples } = collectSamples();
  const summary = await parseGpx(byteChunks(text, chunk), { onBatch, ...opts });
  return { summary, s: samples.columns, samples };
}
const warning = (summary: ParseSummary, code: string) => summary.warnings.find((w) => w.code === code);
const errorOf = parseErrorOfAsync;

/**
 * Independent reading of the track with fast-xml-parser (a plain XML parser, neither xmldom nor
 * togeojson): points in document order, non-empty segments, and the tS each point must get by the
 * documented rule (seconds since the first time; an untimed point repeats the previous tS).
 */
function independent(xml: string) {
  const parser = new XMLParser({
    ignoreAttributes: false,
    attributeNamePrefix: "@",
    removeNSPrefix: true,
    parseTagValue: false,
    parseAttributeValue: false,
    isArray: (name) => ["trk", "trkseg", "trkpt"].includes(name),
  });
  const list = (x: unknown): Record<string, unknown>[] => (Array.isArray(x) ? x.filter((v) => typeof v === "object") : []);
  const gpx = parser.parse(xml).gpx;
  const points: { lat: number; lon: number; time: number; ele: boolean }[] = [];
  let segments = 0;
  for (const trk of list(gpx.trk)) {
    for (const seg of list(trk.trkseg)) {
      const pts = list(seg.trkpt);
      if (pts.length > 0) segments++;
      for (const p of pts) {
        const time = typeof p.time === "string" && p.time.trim() !== "" ? Date.parse(p.time) : NaN;
        const ele = typeof p.ele === "string" && p.ele.trim() !== "";
        points.push({ lat: Number(p["@lat"]), lon: Number(p["@lon"]), time, ele });
      }
    }
  }
  const timed = points.filter((p) => !Number.isNaN(p.time));
  // The documented rule for usable times: at least half the points timed, and (with 3 or more)
  // not one placeholder stamp — the median step between timed points above zero.
  const steps = timed.slice(1).map((p, i) => Math.abs(p.time - timed[i].time)).sort((a, b) => a - b);
  const usable = timed.length >= points.length / 2 && !(timed.length >= 3 && steps[Math.floor(steps.length / 2)] === 0);
  const t0 = usable ? (timed[0]?.time ?? NaN) : NaN;
  let prev = 0;
  const tS = points.map((p, i) => (!usable ? i : Number.isNaN(p.time) ? prev : (prev = (p.time - t0) / 1000)));
  return { points, segments, timed: timed.length, usable, t0, tS, withEle: points.filter((p) => p.ele).length };
}

// Each reference file with the repository whose test suite it comes from (see SOURCES.md there).
const TRACK_FILES = [
  { file: "georust-gpx_garmin-activity.gpx", source: "georust/gpx tests/fixtures/garmin-activity.gpx" },
  { file: "georust-gpx_garmin_with_extensions.gpx", source: "georust/gpx tests/fixtures/garmin_with_extensions.gpx" },
  { file: "georust-gpx_with_accuracy.gpx", source: "georust/gpx tests/fixtures/with_accuracy.gpx" },
  { file: "gpxpy_around-visnjan-with-car.gpx", source: "tkrajina/gpxpy test_files/around-visnjan-with-car.gpx" },
  { file: "gpxpy_cerknicko-jezero.gpx", source: "tkrajina/gpxpy test_files/cerknicko-jezero.gpx (GPX 1.0)" },
  { file: "gpxpy_cerknicko-without-times.gpx", source: "tkrajina/gpxpy test_files/cerknicko-without-times.gpx" },
  { file: "gpxpy_korita-zbevnica.gpx", source: "tkrajina/gpxpy test_files/korita-zbevnica.gpx" },
  { file: "gpxpy_track-with-less-sec-time.gpx", source: "tkrajina/gpxpy test_files/track-with-less-sec-time.gpx" },
  { file: "togeojson_empty_ele.gpx", source: "mapbox/togeojson test/data/empty_ele.gpx" },
  { file: "togeojson_missing_hr.gpx", source: "mapbox/togeojson test/data/missing_hr.gpx" },
];

describe("parseGpx", () => {
  it("covers every reference file: 10 tracks here plus the two without track points below", () => {
    const all = fs.readdirSync(GPX_DIR).filter((f) => f.endsWith(".gpx")).sort();
    const covered = [...TRACK_FILES.map((t) => t.file), "gpxpy_route.gpx", "togeojson_empty_trk.gpx"].sort();
    expect(all).toEqual(covered);
  });

  it.each(TRACK_FILES)("agrees with an independent fast-xml-parser count for $file ($source)", async ({ file }) => {
    const xml = readRef(file);
    const ref = independent(xml);
    const { summary, s, samples } = await run(xml);
    expect(summary.format).toBe("gpx");
    expect(summary.sampleCount).toBe(ref.points.length);
    expect(samples.length).toBe(ref.points.length);
    expect(1 + samples.segmentStart.reduce((a, b) => a + b, 0)).toBe(ref.segments);
    expect(samples.segmentStart[0]).toBe(0);
    expect(s.lat[0]).toBe(ref.points[0].lat);
    expect(s.lon[0]).toBe(ref.points[0].lon);
    expect(s.lat.at(-1)).toBe(ref.points.at(-1)!.lat);
    expect(summary.startedAt?.getTime() ?? NaN).toBe(ref.t0);
    s.tS.forEach((t, i) => expect(t).toBeCloseTo(ref.tS[i], 6));
    expect(s.altM.filter((v) => !Number.isNaN(v)).length).toBe(ref.withEle);
    expect(samples.sourceLine).toEqual(ref.points.map((_, i) => i + 1));
    const missing = ref.usable ? ref.points.length - ref.timed : 0;
    expect(warning(summary, "missing-time")?.count).toBe(missing === 0 ? undefined : missing);
    expect(warning(summary, "no-times") !== undefined).toBe(!ref.usable);
  });

  it("keeps fractional seconds and a +01:00 offset (gpxpy track-with-less-sec-time.gpx)", async () => {
    const { summary, s } = await run(readRef("gpxpy_track-with-less-sec-time.gpx"), {}, 7);
    expect(summary.startedAt?.toISOString()).toBe("2015-12-11T14:43:13.000Z");
    expect(s.tS[1]).toBeCloseTo(0.994, 9);
    expect(s.lat[0]).toBe(57.011456); // lon is written before lat in this file
  });

  it("reads fix, sat, hdop and ele and flags an unknown fix (georust with_accuracy.gpx)", async () => {
    const { summary, s } = await run(readRef("georust-gpx_with_accuracy.gpx"));
    expect(s.fixType).toEqual([2, 3, NaN]); // dgps → 2, 3d → 3, "something_not_in_the_spec" → empty
    expect(s.sats).toEqual([4, 5, NaN]);
    expect(s.hdop).toEqual([5, 3.6, NaN]);
    expect(s.altM).toEqual([50.3, 0, NaN]); // <ele>0.0</ele> is a real 0, not missing
    expect(warning(summary, "bad-value")).toMatchObject({ column: "fix", count: 1 });
    expect(summary.fieldsPresent).toEqual(expect.arrayContaining(["tS", "lat", "lon", "altM", "sats", "hdop", "fixType"]));
  });

  it("gives an untimed track the tS of the last time and counts it (gpxpy korita-zbevnica.gpx)", async () => {
    // Track 1 is empty, track 2 (358 points) has no times, tracks 3 and 4 are timed.
    const { summary, s, samples } = await run(readRef("gpxpy_korita-zbevnica.gpx"));
    expect(s.tS.slice(0, 358).every((t) => t === 0)).toBe(true);
    expect(warning(summary, "missing-time")).toMatchObject({ count: 358 });
    expect(summary.startedAt?.toISOString()).toBe("2010-10-03T09:36:30.000Z");
    expect([358, 358 + 176].every((i) => samples.segmentStart[i] === 1)).toBe(true);
  });

  it("splits segments at each <trkseg> and never across them (togeojson missing_hr.gpx)", async () => {
    const { samples } = await run(readRef("togeojson_missing_hr.gpx"));
    const starts = samples.segmentStart.flatMap((v, i) => (v ? [i] : []));
    expect(starts).toEqual([3, 13]); // segments of 3 + 10 + 3 points
  });

  it("reads identical points with the same time and empty <ele> (togeojson empty_ele.gpx)", async () => {
    const { summary, s } = await run(readRef("togeojson_empty_ele.gpx"));
    expect(s.tS).toEqual([0, 0]);
    expect(s.altM).toEqual([NaN, NaN]);
    expect(summary.warnings).toEqual([]);
    expect(summary.fieldsPresent).not.toContain("altM");
  });

  it("rejects a route-only file with the route-plan hint (gpxpy route.gpx)", async () => {
    const err = await errorOf(run(readRef("gpxpy_route.gpx")));
    expect(err).toBeInstanceOf(ParseError);
    expect(err.message).toBe("The GPX file has no track points; a GPX route or waypoint list can be added as a route plan instead");
  });

  it("reads a route as samples one second apart when fallbackToRoute is set (gpxpy route.gpx)", async () => {
    const { summary, s } = await run(readRef("gpxpy_route.gpx"), { fallbackToRoute: true });
    expect(summary.sampleCount).toBe(55);
    expect(s.tS.slice(0, 3)).toEqual([0, 1, 2]);
    expect(summary.startedAt).toBeNull();
    expect(warning(summary, "no-times")?.message).toBe("The track has no timestamps: time-based figures are not available; samples are numbered one second apart");
  });

  it("treats a placeholder time on every point, or times on under half the points, as no clock (our own small tracks)", async () => {
    const pt = (i: number, time?: string) => `<trkpt lat="46.${4300 + i}" lon="13.7482">${time ? `<time>${time}</time>` : ""}</trkpt>`;
    const gpx = (pts: string[]) => `<?xml version="1.0"?><gpx version="1.1" creator="t" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>${pts.join("")}</trkseg></trk></gpx>`;
    const placeholder = await run(gpx([0, 1, 2, 3].map((i) => pt(i, "1901-12-13T20:45:52.2073437Z"))));
    expect(placeholder.s.tS).toEqual([0, 1, 2, 3]);
    expect(placeholder.summary.startedAt).toBeNull();
    expect(warning(placeholder.summary, "no-times")?.message).toMatch(/^The points carry one placeholder time \(1901-12-13T20:45:52\.207Z\)/);
    const few = await run(gpx([pt(0, "2016-11-21T12:18:50Z"), pt(1), pt(2), pt(3, "2016-11-08T10:00:00Z"), pt(4), pt(5)]));
    expect(few.s.tS).toEqual([0, 1, 2, 3, 4, 5]);
    expect(warning(few.summary, "no-times")?.message).toMatch(/^Only 2 of 6 points have a time/);
    expect(warning(few.summary, "time-backwards")).toBeUndefined();
    const half = await run(gpx([pt(0, "2016-11-21T12:00:00Z"), pt(1), pt(2, "2016-11-21T12:00:02Z"), pt(3)]));
    expect(half.s.tS).toEqual([0, 0, 2, 2]);
    expect(warning(half.summary, "no-times")).toBeUndefined();
  });

  it("rejects a track whose only segment is empty (togeojson empty_trk.gpx)", async () => {
    const err = await errorOf(run(readRef("togeojson_empty_trk.gpx")));
    expect(err.message).toBe("The GPX file contains no track points");
  });

  it("emits batches of batchSize in order with the same samples as one batch (georust garmin-activity.gpx)", async () => {
    const xml = readRef("georust-gpx_garmin-activity.gpx");
    const whole = await run(xml);
    const batched = await run(xml, { batchSize: 100 });
    expect(batched.samples.batches).toBe(10); // 988 points
    expect(batched.s).toEqual(whole.s);
  });

  it("gives the same result for 7-byte chunks as for one chunk (gpxpy around-visnjan-with-car.gpx)", async () => {
    const xml = readRef("gpxpy_around-visnjan-with-car.gpx"); // the whole file is one line
    expect((await run(xml, {}, 7)).s).toEqual((await run(xml, {}, xml.length)).s);
  });

  it("reads GPX 1.0 <speed> (m/s) and <course>, and maps every GPX fix value", async () => {
    const pts = ["none", "2d", "3d", "dgps", "pps"]
      .map((fix, i) => `<trkpt lat="1" lon="${i}"><time>2020-01-01T00:00:0${i}Z</time><speed>${i + 0.5}</speed><course>${i * 90}</course><fix>${fix}</fix></trkpt>`)
      .join("");
    const { s } = await run(`<gpx version="1.0" xmlns="http://www.topografix.com/GPX/1/0"><trk><trkseg>${pts}</trkseg></trk></gpx>`);
    expect(s.fixType).toEqual([0, 2, 3, 2, 3]);
    expect(s.speedMps).toEqual([0.5, 1.5, 2.5, 3.5, 4.5]);
    expect(s.headingDeg).toEqual([0, 90, 180, 270, 0]); // 360° is 0°
  });

  it("numbers samples by index and warns 'no-times' when no point has a time", async () => {
    const pts = '<trkpt lat="1" lon="1"/><trkpt lat="1" lon="2"/><trkpt lat="1" lon="3"/>';
    const { summary, s } = await run(`<gpx><trk><trkseg>${pts}</trkseg></trk></gpx>`);
    expect(s.tS).toEqual([0, 1, 2]);
    expect(summary.startedAt).toBeNull();
    expect(warning(summary, "no-times")?.message).toBe("The track has no timestamps: time-based figures are not available; samples are numbered one second apart");
  });

  it("keeps a point whose time goes backwards and warns once per occurrence", async () => {
    const times = ["00:00:10", "00:00:05", "00:00:20", "00:00:01"];
    const pts = times.map((t) => `<trkpt lat="1" lon="1"><time>2020-01-01T${t}Z</time></trkpt>`).join("");
    const { summary, s } = await run(`<gpx><trk><trkseg>${pts}</trkseg></trk></gpx>`);
    expect(s.tS).toEqual([0, -5, 10, -9]);
    expect(warning(summary, "time-backwards")).toMatchObject({ count: 2 });
  });

  it("skips points with missing, non-numeric or out-of-range coordinates and starts the segment at the next valid one", async () => {
    const seg1 = '<trkseg><trkpt lat="1" lon="1"/></trkseg>';
    const seg2 = '<trkseg><trkpt lat="91" lon="1"/><trkpt lat="1" lon="-181"/><trkpt lat="abc" lon="1"/><trkpt lat="1"/><trkpt lat="-90" lon="180"/></trkseg>';
    const { summary, s, samples } = await run(`<gpx><trk>${seg1}${seg2}</trk></gpx>`);
    expect(s.lat).toEqual([1, -90]);
    expect(samples.segmentStart).toEqual([0, 1]);
    expect(samples.sourceLine).toEqual([1, 6]);
    expect(warning(summary, "out-of-range")).toMatchObject({ count: 4 });
  });

  it("starts a new segment at each <trk>", async () => {
    const trk = (lon: number) => `<trk><trkseg><trkpt lat="1" lon="${lon}"><time>2020-01-01T00:00:0${lon}Z</time></trkpt><trkpt lat="1" lon="${lon + 1}"/></trkseg></trk>`;
    const { samples } = await run(`<gpx>${trk(1)}${trk(5)}</gpx>`);
    expect(samples.segmentStart).toEqual([0, 0, 1, 0]);
    expect(samples.trackStart).toEqual([0, 0, 1, 0]);
  });

  it("marks a new recording only at a <trk>, not at each <trkseg>, and skips empty segments", async () => {
    const pt = (lon: number) => `<trkpt lat="1" lon="${lon}"/>`;
    const xml = `<gpx><trk><trkseg>${pt(1)}</trkseg><trkseg>${pt(2)}</trkseg></trk><trk><trkseg></trkseg><trkseg>${pt(3)}${pt(4)}</trkseg></trk></gpx>`;
    const { samples } = await run(xml);
    expect(samples.segmentStart).toEqual([0, 1, 1, 0]);
    expect(samples.trackStart).toEqual([0, 0, 1, 0]);
  });

  it("reads a time without a zone as UTC, not as the machine's local time", async () => {
    const saved = process.env.TZ;
    process.env.TZ = "America/New_York"; // Node re-reads TZ when it is assigned
    try {
      const { summary } = await run('<gpx><trk><trkseg><trkpt lat="1" lon="1"><time>2020-01-01T00:00:01</time></trkpt></trkseg></trk></gpx>');
      expect(summary.startedAt?.toISOString()).toBe("2020-01-01T00:00:01.000Z");
    } finally {
      if (saved === undefined) delete process.env.TZ;
      else process.env.TZ = saved;
    }
  });

  it("ignores look-alike elements inside <extensions> and from other namespaces", async () => {
    const pt = '<trkpt lat="1" lon="1"><extensions><x:ele>999</x:ele><x:time>2020-01-01T00:00:00Z</x:time></extensions><x:sat>7</x:sat></trkpt>';
    const { summary, s } = await run(`<gpx xmlns="http://www.topografix.com/GPX/1/1" xmlns:x="urn:x"><trk><trkseg>${pt}</trkseg></trk></gpx>`);
    expect(s.altM).toEqual([NaN]);
    expect(s.sats).toEqual([NaN]);
    expect(warning(summary, "no-times")).toBeDefined();
  });

  it("reads a document whose GPX elements carry a namespace prefix", async () => {
    const xml = '<g:gpx xmlns:g="http://www.topografix.com/GPX/1/1"><g:trk><g:trkseg><g:trkpt lat="2" lon="3"><g:ele>4</g:ele></g:trkpt></g:trkseg></g:trk></g:gpx>';
    expect((await run(xml)).s.altM).toEqual([4]);
  });

  it("throws a ParseError with xmldom's line and column for malformed XML", async () => {
    const xml = '<?xml version="1.0"?>\n<gpx>\n<trk><trkseg>\n<trkpt lat="1" lon="2"></trkseg></trk></gpx>';
    const err = await errorOf(run(xml));
    expect(err).toBeInstanceOf(ParseError);
    expect(err.line).toBe(4);
    expect(err.column).toBe(20);
    expect(err.describe()).toMatch(/^line 4, .*not well-formed XML: Opening and ending tag mismatch/);
  });

  it("throws for a document that ends inside an element", async () => {
    const err = await errorOf(run('<gpx><trk><trkseg><trkpt lat="1" lon="2">'));
    expect(err.message).toMatch(/not well-formed XML/);
  });

  it("throws for text after the closing </gpx>", async () => {
    const err = await errorOf(run('<gpx><trk><trkseg><trkpt lat="1" lon="2"/></trkseg></trk></gpx>\ntrailing junk'));
    expect(err.message).toMatch(/not well-formed XML: Extra content/);
    expect(err.line).toBeGreaterThan(0); // xmldom places it where the root element ended
  });

  it("rejects a root element other than <gpx>", async () => {
    const err = await errorOf(run('<kml xmlns="http://www.opengis.net/kml/2.2"><Document/></kml>'));
    expect(err).toBeInstanceOf(ParseError);
    expect(err.expected).toBe("a <gpx> root element");
    expect(err.message).toContain("<kml>");
  });

  it("refuses input above maxBytes before parsing it", async () => {
    const err = await errorOf(run(readRef("gpxpy_route.gpx"), { maxBytes: 1000 }));
    expect(err.message).toMatch(/^GPX files larger than/);
  });
});

describe("parseGpx with hostile input", () => {
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), "sortie-xxe-"));
  const secretFile = path.join(tmp, "secret.txt");
  fs.writeFileSync(secretFile, "4242.5");
  afterEach(() => vi.restoreAllMocks());
  afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

  it("expands neither an internal entity nor an external SYSTEM entity (XXE), reads no file and prints nothing", async () => {
    const readSpy = vi.spyOn(fs, "readFileSync");
    const openSpy = vi.spyOn(fs, "openSync");
    const consoleSpies = (["error", "warn", "log"] as const).map((m) => vi.spyOn(console, m).mockImplementation(() => {}));
    const xml = `<?xml version="1.0"?>
<!DOCTYPE gpx [
  <!ENTITY height "1234">
  <!ENTITY xxe SYSTEM "file://${secretFile}">
]>
<gpx><trk><trkseg>
<trkpt lat="1" lon="2"><ele>&height;</ele></trkpt>
<trkpt lat="1" lon="3"><ele>&xxe;</ele><sat>&xxe;</sat></trkpt>
</trkseg></trk></gpx>`;
    const { summary, s } = await run(xml);
    expect(s.altM).toEqual([NaN, NaN]);
    expect(s.sats).toEqual([NaN, NaN]);
    expect(warning(summary, "dtd-ignored")?.message).toMatch(/DTD .*ignored and 3 entity reference/);
    expect(JSON.stringify(summary)).not.toContain("4242");
    expect(readSpy.mock.calls.some((c) => String(c[0]).includes("secret"))).toBe(false);
    expect(openSpy.mock.calls.some((c) => String(c[0]).includes("secret"))).toBe(false);
    for (const spy of consoleSpies) expect(spy).not.toHaveBeenCalled();
  });

  it("reads a billion-laughs document without expanding it", async () => {
    const levels = ['<!ENTITY lol0 "lol">'];
    for (let i = 1; i <= 9; i++) levels.push(`<!ENTITY lol${i} "${`&lol${i - 1};`.repeat(10)}">`);
    const xml = `<?xml version="1.0"?><!DOCTYPE gpx [${levels.join("")}]><gpx><trk><name>&lol9;</name><trkseg><trkpt lat="5" lon="6"><ele>&lol9;</ele></trkpt><trkpt lat="5" lon="7"/></trkseg></trk></gpx>`;
    const { summary, s } = await run(xml);
    expect(summary.sampleCount).toBe(2);
    expect(s.lon).toEqual([6, 7]);
    expect(s.altM).toEqual([NaN, NaN]);
    expect(warning(summary, "dtd-ignored")).toBeDefined();
  });

  it("warns 'dtd-ignored' for a DOCTYPE even when no entity is used", async () => {
    const { summary } = await run('<!DOCTYPE gpx SYSTEM "http://example.invalid/gpx.dtd"><gpx><trk><trkseg><trkpt lat="1" lon="1"/></trkseg></trk></gpx>');
    expect(warning(summary, "dtd-ignored")).toBeDefined();
  });

  it("prints nothing to the console for malformed XML", async () => {
    const spy = vi.spyOn(console, "error").mockImplementation(() => {});
    await errorOf(run("<gpx><trk></gpx>"));
    expect(spy).not.toHaveBeenCalled();
  });
});
