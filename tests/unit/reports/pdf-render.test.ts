/**
 * The PDF debrief drawn from a debrief built in memory (our own simulator's log, analysed and
 * levelled by the server's code), read back with pdf-parse: the figures must be there as text.
 */
import { PDFParse } from "pdf-parse";
import { describe, expect, it } from "vitest";
import { eventLabel } from "@/components/debrief/event-words";
import { safetyTexts } from "@/components/ui/safety-texts";
import { formatDistance, formatSpan } from "@/lib/format/units";
import { MAX_EVENT_ROWS, renderDebriefPdf } from "@/lib/reports/pdf-debrief";
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
});
