/**
 * One run's debrief as a PDF, made on the server with pdfkit: the same figures, events, notes and
 * sign-off as the debrief page, a vector track drawing and vector charts from the stored
 * whole-run levels, and the standing cautions. Text is real text in IBM Plex Sans (lib/reports/fonts,
 * OFL; see pdf-text.ts), so the document is searchable and copyable.
 */
import PDFDocument from "pdfkit";
import { linkChart } from "@/components/debrief/chart-panels";
import { eventDetail, eventLabel, eventPeak, eventTone, type DebriefEvent, type EventTone } from "@/components/debrief/event-words";
import { summaryFigures, type RunSummary } from "@/components/debrief/figure-list";
import { verdictLines } from "@/components/debrief/verdict-words";
import { homeTitle, missionStartTitle } from "@/components/map/map-words";
import { safetyTexts } from "@/components/ui/safety-texts";
import { BENCH_WORDS } from "@/lib/analysis/evidence";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/actor";
import { ConflictError } from "@/lib/errors";
import { formatClock, formatDistance, formatSpan, lengthConversion, type Units } from "@/lib/format/units";
import { loadDebrief, type Debrief } from "@/lib/runs/debrief";
import { getRunSeries, getRunTrack } from "@/lib/series/read-series";
import type { SeriesField, SeriesResponse, TrackResponse } from "@/lib/series/types";
import {
  boundsOf, cleanText, fitToBox, localProjection, niceTicks, pieces, reportFileName, scaleBar, stepDecimals, timeTicks, trackRanges, valueRange,
  type Box, type LatLon, type XY,
} from "./layout";
import { PdfText, type Weight } from "./pdf-text";

/** More rows than this would make a printed debrief a phone book; the page has them all. */
export const MAX_EVENT_ROWS = 300;
/** x positions asked of the stored levels per chart: more than a printed line can show. */
const CHART_POINTS = 1200;

const colour = {
  ink: "#14212b",
  soft: "#46555f",
  rule: "#d9d4c7",
  paper: "#f5f3ec",
  tide: "#0d5c63",
  tideLight: "#86c1bb",
  act: "#b42318",
  watch: "#a86a00",
  clear: "#2a7f62",
  signal: "#d97a07",
  signalTint: "#fdebd3",
};
const toneColour: Record<EventTone, string> = { act: colour.act, watch: colour.watch, info: colour.tide };

const verdictLook = {
  act: { colour: colour.act, tint: "#f8e5e3" },
  watch: { colour: colour.watch, tint: "#f8eddb" },
  clear: { colour: colour.clear, tint: "#e3f0ea" },
} as const;

export interface DebriefReportInput {
  debrief: Debrief;
  /** Whole-run levels of the chart fields, or null when none of them is in the log. */
  series: Omit<SeriesResponse, "runId"> | null;
  track: Omit<TrackResponse, "runId"> | null;
  generatedAt: Date;
}

type Summary = RunSummary & { fieldsPresent?: string[] };

const utc = (d: Date) => d.toISOString().replace("T", " ").slice(0, 16) + " UTC";

/** Chart fields this run's log carries: the judged link metric (a derived field when read from an RC channel), altitude, pack voltage. */
export function chartFields(summary: Summary): SeriesField[] {
  const present = summary.fieldsPresent ?? [];
  const link = summary.link ? linkChart(summary.link, present)?.field : undefined;
  return [...(link ? [link] : []), ...(["altM", "voltageV"] as const).filter((f) => present.includes(f))];
}

/**
 * The PDF for one run, after the same read check as the debrief page (observer or above in the
 * run's own crew; another crew's run is a 404). 409 while the run is not ready. Audited.
 */
export async function debriefPdf(actor: Actor, runId: number): Promise<{ body: Buffer; fileName: string }> {
  const debrief = await loadDebrief(actor, runId);
  if (debrief.run.status !== "ready") {
    throw new ConflictError(debrief.run.status === "failed" ? "This run could not be read, so it has no debrief to export" : `This run is ${debrief.run.status}; its debrief can be exported once it is ready`);
  }
  const fields = chartFields((debrief.run.summary ?? {}) as Summary);
  const [series, track] = await Promise.all([
    fields.length ? getRunSeries(actor, runId, { fields, points: CHART_POINTS }, null).then((c) => c.body) : null,
    getRunTrack(actor, runId, {}, null).then((c) => c.body),
  ]);
  const body = await renderDebriefPdf({ debrief, series, track, generatedAt: new Date() });
  await audit({ crewId: debrief.run.crewId, actorId: actor.user.id, action: "run.exported", targetType: "run", targetId: runId, detail: { format: "pdf" } });
  return { body, fileName: reportFileName(runId, debrief.run.title) };
}

/** Draws the debrief; pure apart from reading the font files. */
export function renderDebriefPdf(input: DebriefReportInput): Promise<Buffer> {
  const { debrief: d, generatedAt } = input;
  const run = d.run;
  const units: Units = d.units;
  const summary = (run.summary ?? {}) as Summary;
  const title = cleanText(run.title) || `Run ${run.id}`;

  const doc = new PDFDocument({
    size: "A4",
    margins: { top: 48, bottom: 54, left: 48, right: 48 },
    bufferPages: true,
    autoFirstPage: true,
    // No built-in font: pdfkit would read its AFM files, and every string here uses our own fonts.
    font: null as unknown as string,
    lang: "en-GB",
    displayTitle: true,
    info: { Title: `${title} — debrief`, Author: "Sortie", Subject: "Run debrief", Creator: "Sortie", CreationDate: generatedAt },
  });
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });

  const pt = new PdfText(doc);
  const use = (weight: Weight, size: number, fill = colour.ink) => pt.use(weight, size, fill);
  /** Flowing text at (x, y), or where the last text ended. */
  const write = (str: string, x: number | undefined, y: number | undefined, opts: PDFKit.Mixins.TextOptions & { multiline?: boolean } = {}) => pt.write(str, x, y, opts);

  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom;
  const need = (h: number) => {
    if (doc.y + h > bottom()) doc.addPage();
  };
  const gap = (h: number) => {
    doc.y += h;
  };
  /** A section heading, kept on one page with the first `keep` points of what follows. */
  const heading = (text: string, keep = 40) => {
    need(keep + 30);
    gap(10);
    use("semibold", 12.5, colour.ink);
    write(text, left, doc.y, { width });
    const y = doc.y + 2;
    doc.moveTo(left, y).lineTo(left + width, y).lineWidth(0.6).strokeColor(colour.rule).stroke();
    doc.y = y + 6;
  };

  use("sans", 10);

  // Title block.
  use("semibold", 8, colour.tide);
  write("SORTIE · RUN DEBRIEF", left, doc.y, { width });
  gap(4);
  use("bold", 20);
  write(title, left, doc.y, { width });
  const meta = [d.buildName && cleanText(d.buildName), d.pilotName && `pilot ${cleanText(d.pilotName)}`, d.plan && `plan “${cleanText(d.plan.name)}”`, run.startedAt && utc(run.startedAt)]
    .filter(Boolean)
    .join(" · ");
  use("sans", 10, colour.soft);
  gap(2);
  write(meta || "No build, pilot or plan recorded", left, doc.y, { width });
  if (run.upload.note) {
    use("sans", 9, colour.ink);
    gap(3);
    write(run.upload.note, left, doc.y, { width, multiline: true });
  }
  use("sans", 8, colour.soft);
  gap(3);
  write(`Log ${run.upload.fileName} · ${run.sampleCount.toLocaleString("en")} samples · ${formatSpan(run.durationS)} · figures in ${units} units`, left, doc.y, { width });
  gap(10);

  // A bench run says so first: what it leaves out, and the bench caution.
  const bench = summary.bench === true;
  if (bench) {
    const lines = [BENCH_WORDS.body, ...((summary.link?.lostCount ?? 0) > 0 ? [BENCH_WORDS.loss] : [])];
    use("semibold", 11);
    let h = pt.height(BENCH_WORDS.title, width - 24) + 4;
    use("sans", 9);
    for (const l of lines) h += pt.height(l, width - 24) + 2;
    h += pt.height(safetyTexts.bench, width - 24) + 8 + 16;
    need(h + 8);
    const y0 = doc.y;
    doc.rect(left, y0, width, h).lineWidth(0.8).strokeColor(colour.rule).stroke();
    use("semibold", 11, colour.ink);
    write(BENCH_WORDS.title, left + 12, y0 + 8, { width: width - 24 });
    gap(4);
    use("sans", 9, colour.ink);
    for (const l of lines) {
      write(l, left + 12, doc.y, { width: width - 24 });
      gap(2);
    }
    const cy = doc.y + 4;
    use("sans", 9);
    const ch = pt.height(safetyTexts.bench, width - 40) + 8;
    doc.rect(left + 8, cy, width - 16, ch).fill(colour.signalTint);
    doc.rect(left + 8, cy, 4, ch).fill(colour.signal);
    use("sans", 9, colour.ink);
    write(safetyTexts.bench, left + 20, cy + 4, { width: width - 40 });
    doc.x = left;
    doc.y = y0 + h + 8;
  }

  // Verdict and sign-off.
  const verdict = summary.verdict ?? null;
  if (verdict && verdict.level in verdictLook) {
    const look = verdictLook[verdict.level];
    const words = verdictLines(verdict);
    const pad = 10;
    const signW = 150;
    const textW = width - 2 * pad - 6 - signW - 12;
    // Reasons that fired, what held, what the log could not show (or, for an older summary, that it cannot say).
    const reasons = [
      ...words.reasons.map((r) => `•  ${r}`),
      ...(words.held ? [words.held] : []),
      ...words.notAssessed.map((n) => `–  ${n}`),
      ...(words.legacy ? [words.legacy] : []),
    ];
    use("semibold", 13);
    const titleH = pt.height(words.title, textW);
    use("sans", 9.5);
    const reasonsH = reasons.reduce((h, r) => h + pt.height(r, textW) + 2, 0);
    const signText = d.signOff ? `Signed off by ${cleanText(d.signOff.by)}\n${utc(d.signOff.at)}` : "Not signed off";
    const signH = pt.height(signText, signW, true) + 12;
    const h = Math.max(titleH + 4 + reasonsH, signH) + 2 * pad;
    need(h + 8);
    const y0 = doc.y;
    doc.rect(left, y0, width, h).fill(look.tint);
    doc.rect(left, y0, 6, h).fill(look.colour);
    use("semibold", 13, look.colour);
    write(words.title, left + 6 + pad, y0 + pad, { width: textW });
    gap(4);
    use("sans", 9.5);
    for (const r of reasons) {
      write(r, left + 6 + pad, doc.y, { width: textW });
      gap(2);
    }
    use("semibold", 8, colour.soft);
    write("SIGN-OFF", left + width - pad - signW, y0 + pad, { width: signW, align: "right" });
    use(d.signOff ? "medium" : "sans", 9.5, d.signOff ? colour.ink : colour.soft);
    write(signText, left + width - pad - signW, doc.y + 2, { width: signW, align: "right", multiline: true });
    doc.x = left;
    doc.y = y0 + h + 8;
  }

  // Summary figures, three to a row.
  heading("Summary figures");
  const figures = summaryFigures(summary, units);
  const cols = 3;
  const cg = 8;
  const cw = (width - (cols - 1) * cg) / cols;
  for (let i = 0; i < figures.length; i += cols) {
    const row = figures.slice(i, i + cols);
    const hs = row.map((fig) => {
      use("sans", 8);
      let h = pt.height(fig.label, cw - 16);
      use("medium", 12.5);
      h += pt.height(fig.value, cw - 16) + 2;
      use("sans", 7.5);
      for (const line of [fig.sub, ...(fig.detail ?? [])]) if (line) h += pt.height(line, cw - 16) + 2;
      return h + 14;
    });
    const h = Math.max(...hs);
    need(h + cg);
    const y0 = doc.y;
    row.forEach((fig, j) => {
      const x = left + j * (cw + cg);
      const border = fig.tone === "act" ? colour.act : fig.tone === "watch" ? colour.watch : colour.rule;
      const strong = fig.tone === "act" || fig.tone === "watch";
      // A part the log could not show: dashed, and its word in the soft colour.
      if (fig.tone === "muted") doc.dash(3, { space: 2 });
      doc.roundedRect(x, y0, cw, h, 4).lineWidth(strong ? 1.2 : 0.7).strokeColor(border).stroke();
      doc.undash();
      use("sans", 8, colour.soft);
      write(fig.label, x + 8, y0 + 7, { width: cw - 16 });
      use("medium", 12.5, fig.tone === "muted" ? colour.soft : colour.ink);
      write(fig.value, x + 8, doc.y + 1, { width: cw - 16 });
      for (const line of [fig.sub, ...(fig.detail ?? [])]) {
        if (!line) continue;
        use("sans", 7.5, colour.soft);
        write(line, x + 8, doc.y + 2, { width: cw - 16 });
      }
    });
    doc.x = left;
    doc.y = y0 + h + cg;
  }

  // Track drawing: a bench run has none to draw.
  const events = d.events as DebriefEvent[];
  if (!bench) {
    heading("Track", input.track?.t.length ? 310 : 20);
    drawTrack();
  }

  // Charts from the whole-run levels.
  heading("Charts", 110);
  drawCharts();

  // Events.
  heading(`Events (${events.length.toLocaleString("en")})`);
  drawEvents();

  // Notes and sign-off.
  heading(`Notes (${d.notes.length})`);
  if (d.notes.length === 0) {
    use("sans", 9.5, colour.soft);
    write("No notes.", left, doc.y, { width });
  }
  for (const n of d.notes) {
    use("sans", 9.5);
    const h = pt.height(n.body, width - 10, true);
    need(Math.min(h, 60) + 18);
    const y0 = doc.y;
    const page0 = doc.bufferedPageRange().count;
    use("semibold", 8.5, colour.soft);
    write(`${n.authorName ?? "a former member"} · ${utc(n.createdAt)}`, left + 10, y0, { width: width - 10 });
    use("sans", 9.5, colour.ink);
    write(n.body, left + 10, doc.y + 1, { width: width - 10, multiline: true });
    // The bar beside a note, drawn after the text: from where it starts, or from the top of the page it ends on.
    const yEnd = doc.y;
    const yStart = doc.bufferedPageRange().count === page0 ? y0 : doc.page.margins.top;
    if (yEnd > yStart) doc.rect(left, yStart, 3, yEnd - yStart).fill(colour.tideLight);
    doc.x = left;
    doc.y = yEnd + 8;
  }
  heading("Sign-off");
  use("sans", 9.5, d.signOff ? colour.ink : colour.soft);
  write(d.signOff ? `Signed off by ${d.signOff.by} on ${utc(d.signOff.at)}.` : "Not signed off. A lead of the crew signs debriefs off in Sortie.", left, doc.y, { width });

  // Standing cautions: always printed, a paper copy travels without the page around it.
  heading("Cautions");
  const cautions: string[] = [bench ? safetyTexts.bench : safetyTexts.failsafe, safetyTexts.battery];
  if (summary.range?.estimatedRangeM != null) cautions.push(safetyTexts.range);
  cautions.push(safetyTexts.general);
  for (const c of cautions) {
    use("sans", 9);
    const h = pt.height(c, width - 24) + 12;
    need(h + 6);
    const y0 = doc.y;
    doc.rect(left, y0, width, h).fill(colour.signalTint);
    doc.rect(left, y0, 4, h).fill(colour.signal);
    use("sans", 9, colour.ink);
    write(c, left + 14, y0 + 6, { width: width - 24 });
    doc.x = left;
    doc.y = y0 + h + 6;
  }

  // Footer on every page; the bottom margin is lifted meanwhile, else pdfkit would start a new page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const m = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    use("sans", 7.5, colour.soft);
    const y = doc.page.height - 34;
    pt.cell(`Sortie debrief · run ${run.id} · ${title}`, left, y, width - 160);
    pt.cell(`made ${utc(generatedAt)} · page ${i - range.start + 1} of ${range.count}`, left + width - 150, y, 150, "right");
    doc.page.margins.bottom = m;
  }
  doc.end();
  return done;

  function drawTrack() {
    const tr = input.track;
    const home: LatLon | null = summary.home ?? null;
    const start = summary.route?.start ?? null;
    const n = tr?.t.length ?? 0;
    if (!tr || n === 0) {
      use("sans", 9.5, colour.soft);
      write("The log has no positions, so there is no track to draw.", left, doc.y, { width });
      return;
    }
    const boxH = 280;
    need(boxH + 40);
    const box: Box = { x: left, y: doc.y, w: width, h: boxH };
    const ref: LatLon = home ?? { lat: tr.lat[0], lon: tr.lon[0] };
    const project = localProjection(ref);
    const pts: XY[] = Array.from({ length: n }, (_, i) => project({ lat: tr.lat[i], lon: tr.lon[i] }));
    const wps = (d.plan?.waypoints ?? []).map((w) => ({ ...w, p: project(w) }));
    const bounds = boundsOf([...pts, ...wps.map((w) => w.p), ...(home ? [project(home)] : []), ...(start ? [project(start)] : [])])!;
    const fit = fitToBox(bounds, box, 22);
    const at = (p: XY) => fit.toPage(p);

    doc.save();
    doc.rect(box.x, box.y, box.w, box.h).fill(colour.paper);
    doc.rect(box.x, box.y, box.w, box.h).clip();

    // The route plan: legs dashed, acceptance circles to scale, names beside them.
    if (wps.length) {
      doc.lineWidth(1).strokeColor(colour.soft).dash(4, { space: 3 });
      wps.forEach((w, i) => (i === 0 ? doc.moveTo(at(w.p).x, at(w.p).y) : doc.lineTo(at(w.p).x, at(w.p).y)));
      doc.stroke().undash();
      for (const w of wps) {
        const c = at(w.p);
        doc.circle(c.x, c.y, Math.max(2.5, w.radiusM * fit.scale)).lineWidth(0.8).strokeColor(colour.soft).stroke();
      }
    }

    // The track, piece by piece (a reception gap is a gap), then the stretches below the fade threshold on top.
    const fade = summary.link?.fadeThreshold ?? null;
    doc.lineWidth(1.3).strokeColor(colour.tide).lineJoin("round").lineCap("round");
    for (const [a, b] of trackRanges(n, tr.breaks)) {
      const p0 = at(pts[a]);
      doc.moveTo(p0.x, p0.y);
      if (b - a === 1) doc.lineTo(p0.x + 0.1, p0.y);
      for (let i = a + 1; i < b; i++) {
        const p = at(pts[i]);
        doc.lineTo(p.x, p.y);
      }
      doc.stroke();
    }
    if (fade != null && tr.metric) {
      doc.lineWidth(3).strokeColor(colour.watch).opacity(0.85);
      for (const [a, b] of trackRanges(n, tr.breaks)) {
        for (let i = a; i < b; i++) {
          const v = tr.link[i];
          if (v == null || v >= fade) continue;
          const p = at(pts[i]);
          const q = at(pts[i + 1 < b ? i + 1 : i]);
          doc.moveTo(p.x, p.y).lineTo(q.x === p.x && q.y === p.y ? q.x + 0.1 : q.x, q.y);
        }
      }
      doc.stroke().opacity(1);
    }

    // Waypoint names after the lines, so they stay readable.
    use("sans", 7, colour.ink);
    for (const w of wps) {
      const c = at(w.p);
      pt.cell(w.name, c.x + Math.max(3, w.radiusM * fit.scale) + 2, c.y - 4, 140);
    }

    // Event marks by tone: square = act, triangle = watch, circle = information.
    for (const e of events) {
      if (e.lat == null || e.lon == null) continue;
      mark(at(project({ lat: e.lat, lon: e.lon })), eventTone(e));
    }
    if (start) {
      const c = at(project(start));
      flag(c);
    }
    if (home) {
      const c = at(project(home));
      doc.circle(c.x, c.y, 4.5).lineWidth(1.6).strokeColor(colour.ink).stroke();
      doc.circle(c.x, c.y, 1.4).fill(colour.ink);
      // A plan usually starts at home with a waypoint of that name: one label there is enough.
      const named = wps.some((w) => Math.hypot(at(w.p).x - c.x, at(w.p).y - c.y) < 12);
      if (!named) {
        use("semibold", 7.5, colour.ink);
        pt.cell("Home", c.x + 6, c.y + 2);
      }
    }

    // North arrow and scale bar.
    const nx = box.x + box.w - 18;
    const ny = box.y + 12;
    doc.moveTo(nx, ny).lineTo(nx + 5, ny + 12).lineTo(nx, ny + 9).lineTo(nx - 5, ny + 12).closePath().fill(colour.ink);
    use("semibold", 7.5, colour.ink);
    pt.cell("N", nx - 3, ny + 13);
    const bar = scaleBar((box.w * 0.25) / fit.scale, units);
    if (bar) {
      const len = bar.metres * fit.scale;
      const bx = box.x + 12;
      const by = box.y + box.h - 14;
      doc.lineWidth(1.4).strokeColor(colour.ink).moveTo(bx, by).lineTo(bx + len, by).stroke();
      doc.moveTo(bx, by - 3).lineTo(bx, by + 3).moveTo(bx + len, by - 3).lineTo(bx + len, by + 3).stroke();
      use("sans", 7.5, colour.ink);
      pt.cell(bar.label, bx + len + 5, by - 4);
    }
    doc.restore();
    doc.rect(box.x, box.y, box.w, box.h).lineWidth(0.7).strokeColor(colour.rule).stroke();

    // Legend, wrapped onto more lines when it does not fit one.
    doc.y = box.y + box.h + 6;
    let x = left;
    let ly = doc.y + 4;
    const item = (w0: number, draw: (x: number) => unknown, label: string) => {
      use("sans", 7.5, colour.soft);
      const w = w0 + 4 + pt.widthOf(label);
      if (x > left && x + w > left + width) {
        x = left;
        ly += 12;
      }
      draw(x);
      use("sans", 7.5, colour.soft);
      pt.cell(label, x + w0 + 4, ly - 3.5);
      x += w + 12;
    };
    item(16, (x0) => doc.lineWidth(1.3).strokeColor(colour.tide).moveTo(x0, ly).lineTo(x0 + 16, ly).stroke(), "track");
    if (fade != null && tr.metric) item(16, (x0) => doc.lineWidth(3).strokeColor(colour.watch).moveTo(x0, ly).lineTo(x0 + 16, ly).stroke(), `link below the fade threshold (${fade}${tr.metric ? ` ${tr.metric.unit}` : ""})`);
    if (wps.length) item(16, (x0) => doc.lineWidth(1).strokeColor(colour.soft).dash(4, { space: 3 }).moveTo(x0, ly).lineTo(x0 + 16, ly).stroke().undash(), "route plan and waypoint circles");
    item(8, (x0) => mark({ x: x0 + 4, y: ly }, "act"), "act");
    item(8, (x0) => mark({ x: x0 + 4, y: ly }, "watch"), "watch");
    item(8, (x0) => mark({ x: x0 + 4, y: ly }, "info"), "event");
    if (home) item(9, (x0) => (doc.circle(x0 + 4.5, ly, 4.5).lineWidth(1.6).strokeColor(colour.ink).stroke(), doc.circle(x0 + 4.5, ly, 1.4).fill(colour.ink)), homeTitle(summary.home ?? {}));
    if (start) item(10, (x0) => flag({ x: x0 + 2, y: ly + 4 }), missionStartTitle(start));
    doc.x = left;
    doc.y = ly + 10;
  }

  /** The mission start: a small flag whose pole's foot is on the spot. */
  function flag(c: XY) {
    doc.lineWidth(1.2).strokeColor(colour.signal).moveTo(c.x, c.y).lineTo(c.x, c.y - 11).stroke();
    doc.moveTo(c.x + 0.5, c.y - 11).lineTo(c.x + 8, c.y - 11).lineTo(c.x + 6, c.y - 8.5).lineTo(c.x + 8, c.y - 6).lineTo(c.x + 0.5, c.y - 6).closePath().fill(colour.signal);
  }

  function mark(c: XY, tone: EventTone) {
    const col = toneColour[tone];
    if (tone === "act") doc.rect(c.x - 3.2, c.y - 3.2, 6.4, 6.4).fillAndStroke(col, "#ffffff");
    else if (tone === "watch") doc.moveTo(c.x, c.y - 4).lineTo(c.x + 4, c.y + 3).lineTo(c.x - 4, c.y + 3).closePath().fillAndStroke(col, "#ffffff");
    else doc.circle(c.x, c.y, 2.4).fillAndStroke(col, "#ffffff");
    doc.lineWidth(0.6);
  }

  function drawCharts() {
    const s = input.series;
    const duration = run.durationS ?? summary.timelineS ?? summary.durationS ?? s?.to ?? 0;
    const link = summary.link;
    const judged = link ? linkChart(link, summary.fieldsPresent ?? []) : null;
    const len = lengthConversion(units);
    const panels: { field: SeriesField; title: string; unit: string; convert?: (v: number) => number; threshold?: { value: number; label: string } }[] = [];
    if (judged) {
      panels.push({
        field: judged.field,
        title: judged.title,
        unit: link?.unit ?? "",
        threshold: link?.fadeThreshold != null ? { value: link.fadeThreshold, label: `fade threshold ${link.fadeThreshold} ${link.unit ?? ""}`.trim() } : undefined,
      });
    }
    panels.push({ field: "altM", title: "Altitude", unit: len.unit, convert: len.convert });
    // The pack's low-voltage line: the per-cell limit the analysis used, times the cells it counted.
    const cells = summary.power?.cells ?? null;
    const lowCellV = (summary as { thresholds?: { lowCellV?: number } }).thresholds?.lowCellV ?? null;
    panels.push({
      field: "voltageV",
      title: "Battery voltage",
      unit: "V",
      threshold: cells && lowCellV ? { value: cells * lowCellV, label: `low-voltage limit ${(cells * lowCellV).toFixed(1)} V (${lowCellV.toFixed(2)} V × ${cells} cells)` } : undefined,
    });
    const shown = panels.filter((p) => s?.values[p.field]?.some((v) => v != null));
    if (!s || shown.length === 0) {
      use("sans", 9.5, colour.soft);
      write("The log carries none of the charted quantities (link metric, altitude, voltage).", left, doc.y, { width });
      return;
    }
    const lost = events.filter((e) => e.kind === "link-lost" && e.endS > e.startS);
    for (const p of shown) {
      const raw = s.values[p.field]!;
      const vals = p.convert ? raw.map((v) => (v == null ? null : p.convert!(v))) : raw;
      const panelH = 108;
      need(panelH + 10);
      const y0 = doc.y;
      use("semibold", 9.5, colour.ink);
      pt.cell(`${p.title}${p.unit ? ` (${p.unit})` : ""}`, left, y0, width);
      const plot: Box = { x: left + 38, y: y0 + 15, w: width - 44, h: panelH - 34 };
      const yr = valueRange(vals, [p.threshold?.value])!;
      const yTicks = niceTicks(yr.min, yr.max, 4);
      const sx = (t: number) => plot.x + (duration > 0 ? (t / duration) * plot.w : 0);
      const sy = (v: number) => plot.y + plot.h - ((v - yr.min) / (yr.max - yr.min)) * plot.h;

      doc.rect(plot.x, plot.y, plot.w, plot.h).lineWidth(0.6).strokeColor(colour.rule).stroke();
      use("sans", 6.8, colour.soft);
      const dec = stepDecimals(yTicks.step);
      for (const v of yTicks.values) {
        const y = sy(v);
        doc.moveTo(plot.x, y).lineTo(plot.x + plot.w, y).lineWidth(0.3).strokeColor(colour.rule).stroke();
        pt.cell(v.toFixed(dec), left, y - 3.5, 34, "right");
      }
      for (const t of timeTicks(0, duration, 8)) {
        const x = sx(t);
        doc.moveTo(x, plot.y + plot.h).lineTo(x, plot.y + plot.h + 3).lineWidth(0.6).strokeColor(colour.soft).stroke();
        pt.cell(formatClock(t), x - 20, plot.y + plot.h + 5, 40, "center");
      }

      doc.save();
      doc.rect(plot.x, plot.y, plot.w, plot.h).clip();
      // Link losses shaded on every chart, so the reader sees what the battery and height did meanwhile.
      for (const e of lost) doc.rect(sx(e.startS), plot.y, Math.max(0.8, sx(e.endS) - sx(e.startS)), plot.h).fillOpacity(0.14).fill(colour.act).fillOpacity(1);
      if (p.threshold) {
        const y = sy(p.threshold.value);
        doc.moveTo(plot.x, y).lineTo(plot.x + plot.w, y).lineWidth(0.9).strokeColor(colour.watch).dash(3, { space: 2 }).stroke().undash();
      }
      doc.lineWidth(0.9).strokeColor(colour.tide).lineJoin("round");
      for (const piece of pieces(s.t, vals)) {
        if (piece.length === 1) {
          doc.circle(sx(piece[0].t), sy(piece[0].v), 0.8).fill(colour.tide);
          continue;
        }
        doc.moveTo(sx(piece[0].t), sy(piece[0].v));
        for (let i = 1; i < piece.length; i++) doc.lineTo(sx(piece[i].t), sy(piece[i].v));
        doc.stroke();
      }
      doc.restore();
      if (p.threshold) {
        use("sans", 6.8, colour.watch);
        // On a light backing, so the line under it cannot hide a letter.
        const ly = Math.max(plot.y + 2, sy(p.threshold.value) - 9);
        const lw = Math.min(246, pt.widthOf(p.threshold.label));
        doc.rect(plot.x + plot.w - 4 - lw - 2, ly - 1, lw + 4, 9).fillOpacity(0.85).fill("#ffffff").fillOpacity(1);
        use("sans", 6.8, colour.watch);
        pt.cell(p.threshold.label, plot.x + plot.w - 250, ly, 246, "right");
      }
      doc.x = left;
      doc.y = y0 + panelH;
    }
    use("sans", 7.5, colour.soft);
    write(
      `Time from the first sample (m:ss). Each chart is drawn from the run's stored whole-run envelope (minimum and maximum per interval); gaps in reception are left as gaps.${lost.length ? " Shaded: link lost." : ""}`,
      left,
      doc.y,
      { width },
    );
  }

  function drawEvents() {
    if (events.length === 0) {
      use("sans", 9.5, colour.soft);
      write("Nothing fired: no fades, losses, failsafe actions, route or battery events in this run.", left, doc.y, { width });
      return;
    }
    const linkUnit = summary.link?.unit ?? null;
    // A bench run has no positions: its "Worst" column takes the room of "From home".
    const fromHomeW = bench ? 0 : width - 168 - 50 - 62 - 156;
    const cols = [
      { label: "Event", w: 168, align: "left" as const },
      { label: "At", w: 50, align: "left" as const },
      { label: "Lasted", w: 62, align: "right" as const },
      { label: "Worst", w: width - 168 - 50 - 62 - fromHomeW, align: "left" as const },
      ...(bench ? [] : [{ label: "From home", w: fromHomeW, align: "right" as const }]),
    ];
    const rowH = 13;
    const header = () => {
      const y = doc.y;
      doc.rect(left, y, width, rowH + 2).fill("#eef6f5");
      use("semibold", 8, colour.soft);
      let x = left;
      for (const c of cols) {
        pt.cell(c.label, x + 4, y + 3.5, c.w - 8, c.align);
        x += c.w;
      }
      doc.y = y + rowH + 2;
    };
    need(rowH * 3);
    header();
    const rows = events.slice(0, MAX_EVENT_ROWS);
    rows.forEach((e, i) => {
      // A failsafe's commanded and flown halves go on a second line across the row.
      const detail = eventDetail(e);
      use("sans", 7.5);
      const detailH = detail ? pt.height(detail, width - 20) + 2 : 0;
      if (doc.y + rowH + detailH > bottom()) {
        doc.addPage();
        header();
      }
      const y = doc.y;
      if (i % 2 === 1) doc.rect(left, y, width, rowH + detailH).fill("#faf8f3");
      const tone = eventTone(e);
      const cells = [
        eventLabel(e),
        formatClock(e.startS),
        e.endS > e.startS ? formatSpan(e.endS - e.startS) : "—",
        eventPeak(e, units, linkUnit),
        ...(bench ? [] : [formatDistance(e.distanceFromHomeM, units)]),
      ];
      let x = left;
      cells.forEach((text, j) => {
        const c = cols[j];
        if (j === 0) {
          mark({ x: x + 8, y: y + rowH / 2 + 1 }, tone);
          use("medium", 8.3, colour.ink);
          pt.cell(text, x + 16, y + 3, c.w - 20);
        } else {
          use("sans", 8.3, colour.ink);
          pt.cell(text, x + 4, y + 3, c.w - 8, c.align);
        }
        x += c.w;
      });
      if (detail) {
        use("sans", 7.5, colour.soft);
        write(detail, left + 16, y + rowH - 1, { width: width - 20 });
      }
      doc.x = left;
      doc.y = y + rowH + detailH;
    });
    doc.moveTo(left, doc.y).lineTo(left + width, doc.y).lineWidth(0.6).strokeColor(colour.rule).stroke();
    doc.x = left;
    if (events.length > rows.length) {
      gap(4);
      use("sans", 9, colour.soft);
      write(`… and ${(events.length - rows.length).toLocaleString("en")} more events, listed in full on the debrief page in Sortie.`, left, doc.y, { width });
    }
  }
}
