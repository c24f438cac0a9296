/**
 * Issue 12 through the real pipeline: a bench failsafe test (no GPS; RSSI on a spare RC channel;
 * the return-to-home channel at its failsafe value 0.4 s after the transmitter goes off) uploaded
 * to a build whose link sheet names those channels, and a GPX track with positions only. The
 * stored summary, the run page, the PDF and the share page must all say what the log could show
 * and what it could not. Logs come from our own generators (scripts/simulator); expected times
 * come from the bench scenario's own timeline, not from the analysis code.
 */
import { PDFParse } from "pdf-parse";
import { beforeAll, describe, expect, it } from "vitest";
import { safetyTexts } from "@/components/ui/safety-texts";
import { demoCrew } from "@/db/demo-crew";
import { BENCH_WORDS } from "@/lib/analysis/evidence";
import { benchTestCsv, simulateBenchTest } from "@/scripts/simulator/bench-test";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toGpx } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

// The bench scenario's timeline: transmitter off at 20 s for 10 s, receiver hold 0.4 s, 10 samples/s.
const bench = { seed: 97, rssiChannel: 14, rthChannel: 8, rthFailsafeUs: 1900, txOffAtS: 20, txOffForS: 10, holdS: 0.4 };
const SAMPLE_S = 0.1;
const benchCsv = benchTestCsv(simulateBenchTest(bench), bench);
const gpx = toGpx(simulateRun({ seed: 41, waypoints: demoCrew.routePlans[0].waypoints }), new Date("2026-11-20T09:00:00Z"), "Evidence GPX");

/** The demo quad's link sheet: arm on 5, return to home on 8 (failsafe 1900 µs), RSSI on 14. */
const heron = demoCrew.builds.find((b) => b.name === "Heron")!;
const sheet = Array.from({ length: 18 }, (_, i) => {
  const c = heron.linkSheet.find((x) => x.channel === i + 1);
  return { channel: i + 1, function: c?.function ?? "unused", switchLabel: c?.switchLabel ?? null, positions: c?.positions ?? null, engageMinUs: c?.engageMinUs ?? null, engageMaxUs: c?.engageMaxUs ?? null, failsafeUs: c?.failsafeUs ?? null };
});

interface Summary {
  bench: boolean;
  link: { metric: string | null; source: { kind: string; channel?: number } | null };
  failsafe: { result: string; commanded: { by: string; channel: number | null; latencyS: number } | null; flown: { state: string } | null };
  verdict: { level: string; reasons: string[]; held: string[]; notAssessed: { what: string; why: string }[] };
}

/** Page HTML as a reader sees its text: React's entity escapes undone. */
const pageText = (html: string) => html.replace(/&#x27;/g, "'").replace(/&quot;/g, '"').replace(/&amp;/g, "&").replace(/<!-- -->/g, "");

async function pdfText(body: ArrayBuffer) {
  const parser = new PDFParse({ data: new Uint8Array(body) });
  try {
    return (await parser.getText()).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

describe("a bench test and a GPX-only log, from upload to debrief, PDF and share page", () => {
  const c = new Client();
  let benchRun: number;
  let gpxRun: number;
  let benchSummary: Summary;
  let gpxSummary: Summary;
  const shared: Record<string, string> = {};

  beforeAll(async () => {
    const lead = await newLead("evidence");
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const created = await c.post("/api/builds", { crewId: lead.crewId, name: "Bench quad", vehicleType: "multirotor", batteryCells: 4, failsafeAction: "return-to-home", failsafeWithinS: 1 });
    expect(created.status, await created.clone().text()).toBe(201);
    const buildId = ((await created.json()) as { id: number }).id;
    const put = await c.request(`/api/builds/${buildId}/link-sheet`, { method: "PUT", json: { channels: sheet, failsafeAction: "return-to-home", failsafeWithinS: 1 } });
    expect(put.status, await put.clone().text()).toBe(200);

    const b = await uploadLog(c, "bench-quad-failsafe.csv", benchCsv, { buildId });
    const g = await uploadLog(c, "evidence-track.gpx", gpx, { contentType: "application/gpx+xml" });
    benchRun = b.runId;
    gpxRun = g.runId;
    for (const id of [benchRun, gpxRun]) {
      const run = await settledRun(c, id, 60_000);
      expect(run.status, run.error ?? "").toBe("ready");
    }
    const summaryOf = async (id: number) => ((await (await c.get(`/api/runs/${id}`)).json()) as { run: { summary: Summary } }).run.summary;
    benchSummary = await summaryOf(benchRun);
    gpxSummary = await summaryOf(gpxRun);
    for (const id of [benchRun, gpxRun]) {
      const res = await c.post(`/api/runs/${id}/share-links`, { expiresInDays: 7 });
      expect(res.status).toBe(201);
      shared[id] = new URL(((await res.json()) as { url: string }).url).pathname;
    }
  }, 120_000);

  it("stores the bench test's summary: bench, RSSI from channel 14, commanded on channel 8 after the hold, flown not logged", () => {
    expect(benchSummary.bench).toBe(true);
    expect(benchSummary.link.metric).toBe("rssi-pct");
    expect(benchSummary.link.source).toEqual({ kind: "rc-channel", channel: 14 });
    expect(benchSummary.failsafe.commanded?.by).toBe("rc-channel");
    expect(benchSummary.failsafe.commanded?.channel).toBe(8);
    // The receiver's hold time from the scenario, within one sample.
    expect(Math.abs(benchSummary.failsafe.commanded!.latencyS - bench.holdS)).toBeLessThanOrEqual(SAMPLE_S + 1e-9);
    expect(benchSummary.failsafe.flown).toEqual({ state: "not-logged" });
    expect(benchSummary.failsafe.result).toBe("pass");
    // On the bench the loss is the test: the link is not judged, and a passing failsafe leaves the run clear.
    expect(benchSummary.verdict.notAssessed.map((n) => n.what).sort()).toEqual(["gps", "link", "route"]);
    expect(benchSummary.verdict.level).toBe("clear");
  });

  it("stores the GPX track's summary: no link metric, so link and failsafe are not assessed", () => {
    expect(gpxSummary.bench).toBe(false);
    expect(gpxSummary.link.metric).toBeNull();
    expect(gpxSummary.failsafe.commanded).toBeNull();
    expect(gpxSummary.verdict.notAssessed.map((n) => n.what).sort()).toEqual(["battery", "failsafe", "link", "route"]);
    expect(gpxSummary.verdict.held).not.toContain("link");
  });

  it("shows the bench layout on the run page: bench words and caution, the channel, commanded and flown, no map", async () => {
    const res = await c.get(`/runs/${benchRun}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    const text = pageText(html);
    expect(text).toContain(BENCH_WORDS.title);
    expect(text).toContain(safetyTexts.bench);
    expect(text).toContain("Not assessed: GPS — the log has no usable GPS fix");
    expect(text).toContain("Not assessed: route — no route plan is attached to the run");
    expect(text).toContain("RSSI from channel 14");
    expect(text).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
    expect(text).toContain("flown: not logged (no mode column, no track)");
    expect(html).not.toContain('data-testid="track-map"');
    expect(text).not.toContain("Farthest from home");
    expect(text).not.toContain("No rule fired");
  });

  it("says on the GPX run page what the log cannot show", async () => {
    const text = pageText(await (await c.get(`/runs/${gpxRun}`)).text());
    expect(text).toContain("Not assessed: link — the log has no link metric");
    expect(text).toContain("Not assessed: failsafe —");
    expect(text).toContain("Not assessed: battery — the log has no battery voltage");
    expect(text).toContain("home: the first good fix (the log shows no arming)");
    expect(text).not.toContain("No rule fired");
    expect(text).not.toContain("the link held");
  });

  it("prints the same words in the PDFs", async () => {
    const benchPdf = await pdfText(await (await c.get(`/api/runs/${benchRun}/report.pdf`)).arrayBuffer());
    expect(benchPdf).toContain(BENCH_WORDS.title);
    expect(benchPdf).toContain(safetyTexts.bench);
    expect(benchPdf).toContain("Not assessed: GPS — the log has no usable GPS fix");
    expect(benchPdf).toContain("RSSI from channel 14 — the link metric judged");
    expect(benchPdf).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
    expect(benchPdf).not.toContain("Farthest from home");
    const gpxPdf = await pdfText(await (await c.get(`/api/runs/${gpxRun}/report.pdf`)).arrayBuffer());
    expect(gpxPdf).toContain("Not assessed: link — the log has no link metric");
    expect(gpxPdf).not.toContain("No rule fired");
  });

  it("shows the same words on the share pages, signed out", async () => {
    const anon = new Client();
    const benchShare = pageText(await (await anon.get(shared[benchRun])).text());
    expect(benchShare).toContain(BENCH_WORDS.title);
    expect(benchShare).toContain(safetyTexts.bench);
    expect(benchShare).toContain("Not assessed: GPS — the log has no usable GPS fix");
    expect(benchShare).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
    const gpxShare = pageText(await (await anon.get(shared[gpxRun])).text());
    expect(gpxShare).toContain("Not assessed: link — the log has no link metric");
    expect(gpxShare).not.toContain("No rule fired");
  });
});
