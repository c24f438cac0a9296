/**
 * The PDF debrief drawn from a debrief built in memory (our own simulator's log, analysed and
 * levelled by the server's code), read back with pdf-parse: the figures must be there as text.
 */
import { PDFParse } from "pdf-parse";
import { describe, expect, it } from "vitest";
import { eventLabel } from "@/components/debrief/event-words";
import { safetyTexts } from "@/components/ui/safety-texts";
import { demoCrew } from "@/db/demo-crew";
import { BENCH_WORDS, CLEAR_FOR_ASSESSED_WORDS, LEGACY_CLEAR_WORDS } from "@/lib/analysis/evidence";
import type { BuildConfig } from "@/lib/analysis/types";
import { formatDistance, formatSpan } from "@/lib/format/units";
import { MAX_EVENT_ROWS, renderDebriefPdf } from "@/lib/reports/pdf-debrief";
import { demoLogs } from "@/scripts/simulator/demo-runs";
import { reportInput } from "./fixture";

async function textOf(pdf: Buffer) {
  const parser = new PDFParse({ data: new Uint8Array(pdf) });
  try {
    const t = await parser.getText();
    // pdf.js puts line breaks where lines wrap; compare with single spaces.
    return { text: t.text.replace(/\s+/g, " "), pages: t.total };
  } finally {
    await parser.destroy();
  }
}

describe("renderDebriefPdf", () => {
  it("writes the run's own figures, events, notes and cautions as text", async () => {
    const input = await reportInput();
    const pdf = await renderDebriefPdf(input);
    // ISO 32000-1 §7.5.2: a PDF file begins with the header %PDF-1.n.
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const { text, pages } = await textOf(pdf);
    expect(pages).toBeGreaterThanOrEqual(1);
    const s = input.debrief.run.summary as { durationS: number; distanceM: number; verdict: { level: string; reasons: string[] } };
    expect(text).toContain("Mudlark flats loop");
    expect(s.verdict.level).toBe("act");
    expect(text).toContain("Act before the next run");
    for (const r of s.verdict.reasons) expect(text).toContain(r);
    expect(text).toContain(formatSpan(s.durationS));
    expect(text).toContain(formatDistance(s.distanceM, "metric"));
    expect(text).toContain(eventLabel({ kind: "link-lost", detail: null }));
    expect(text).toContain("Moved the receiver antenna up the mast.");
    expect(text).toContain("Not signed off");
    expect(text).toContain(safetyTexts.failsafe);
    expect(text).toContain(safetyTexts.general);
    expect(text).toContain("Link quality — the link metric judged (%)");
    expect(text).toContain("fade threshold 70 %");
  });

  it("uses the reader's units", async () => {
    const input = await reportInput({ units: "imperial" });
    const { text } = await textOf(await renderDebriefPdf(input));
    const s = input.debrief.run.summary as { distanceM: number };
    expect(text).toContain(formatDistance(s.distanceM, "imperial"));
    expect(text).toContain("Altitude (ft)");
  });

  it("caps the events table and says how many more there are", async () => {
    const input = await reportInput({ events: MAX_EVENT_ROWS + 57 });
    const { text, pages } = await textOf(await renderDebriefPdf(input));
    expect(text).toContain("… and 57 more events");
    expect(pages).toBeGreaterThan(3);
  });

  it("prints user text literally, without control characters, in Latin, Latin Extended and Cyrillic", async () => {
    const input = await reportInput({
      title: "Run <script>alert(1)</script>\u0007 at Łódź",
      notes: [{ body: "first line\u0000\nsecond\u202E line", authorName: "Ана Петрова" }],
    });
    const { text } = await textOf(await renderDebriefPdf(input));
    expect(text).toContain("Run <script>alert(1)</script> at Łódź");
    expect(text).toContain("Ана Петрова");
    expect(text).toContain("first line second line");
    expect(text).not.toMatch(/[\u0000-\u0008\u202E]/);
  });

  it("lays out a bench failsafe test: link and failsafe only, no track, the bench caution first", async () => {
    const input = await reportInput({ title: "Heron bench failsafe", log: { format: "csv", body: benchLog.body, fileName: benchLog.fileName, build: heronBuild, withPlan: false } });
    const s = input.debrief.run.summary as { bench: boolean; verdict: { reasons: string[] } };
    expect(s.bench).toBe(true);
    const { text } = await textOf(await renderDebriefPdf(input));
    expect(text).toContain(BENCH_WORDS.title);
    expect(text).toContain(safetyTexts.bench);
    // The bench caution comes before the verdict; the loss is the test, so a failsafe that passed leaves it clear.
    expect(text.indexOf(CLEAR_FOR_ASSESSED_WORDS)).toBeGreaterThan(-1);
    expect(text.indexOf(safetyTexts.bench)).toBeLessThan(text.indexOf(CLEAR_FOR_ASSESSED_WORDS));
    expect(text).toContain("Not assessed: link — a bench test");
    for (const r of s.verdict.reasons) expect(text).toContain(r);
    expect(text).toContain("Not assessed: GPS — the log has no usable GPS fix (a bench test, or indoors)");
    expect(text).toContain("RSSI from channel 14 — the link metric judged (%)");
    expect(text).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
    expect(text).toContain("flown: not logged (no mode column, no track)");
    for (const absent of ["Distance travelled", "Farthest from home", "Range estimate", "Track", "From home", "No rule fired"]) expect(text).not.toContain(absent);
  });

  it("says what a GPX track could not show", async () => {
    const input = await reportInput({ title: "Sandpiper flats loop", log: { format: "gpx", body: gpxLog.body, fileName: gpxLog.fileName, build: undefined, withPlan: true } });
    const { text } = await textOf(await renderDebriefPdf(input));
    expect(text).toContain("Not assessed: link — the log has no link metric");
    expect(text).toContain("Not assessed: failsafe —");
    expect(text).toContain("Not assessed: battery — the log has no battery voltage");
    expect(text).toContain("home: the first good fix (the log shows no arming)");
    expect(text).toContain("Home: the first good fix (the log shows no arming)");
    expect(text).toMatch(/Mission start at \d+:\d\d, at the vehicle's first movement/);
    expect(text).not.toContain("No rule fired");
    expect(text).not.toContain("the link held");
  });

  it("draws an older summary's verdict without held or not-assessed lists", async () => {
    const input = await reportInput();
    const s = input.debrief.run.summary as Record<string, unknown>;
    input.debrief.run.summary = { ...s, verdict: { level: "clear", reasons: [] } } as never;
    const { text } = await textOf(await renderDebriefPdf(input));
    expect(text).toContain(LEGACY_CLEAR_WORDS);
  });
});

const logs = demoLogs();
const benchLog = logs.find((l) => l.fileName === "heron-bench-failsafe.csv")!;
const gpxLog = logs.find((l) => l.fileName.endsWith(".gpx"))!;
const heron = demoCrew.builds.find((b) => b.name === "Heron")!;
const heronBuild: BuildConfig = {
  vehicleType: heron.vehicleType,
  cells: heron.batteryCells,
  failsafe: { action: heron.failsafeAction, expectedWithinS: heron.failsafeWithinS },
  channels: heron.linkSheet.map((c) => ({ channel: c.channel, function: c.function, failsafeUs: c.failsafeUs, engageMinUs: c.engageMinUs, engageMaxUs: c.engageMaxUs })),
};

