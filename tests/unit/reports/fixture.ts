/**
 * A debrief built in memory from our own simulator's log (demo data): parsed, analysed and
 * turned into display levels with the server's code, without a database. For the PDF tests.
 */
import { demoCrew } from "@/db/demo-crew";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import type { BuildConfig } from "@/lib/analysis/types";
import type { Units } from "@/lib/format/units";
import { parseLog } from "@/lib/parsers/parse-log";
import type { DebriefReportInput } from "@/lib/reports/pdf-debrief";
import { chartFields } from "@/lib/reports/pdf-debrief";
import { readSeries, readTrack } from "@/lib/series/read";
import type { Debrief } from "@/lib/runs/debrief";
import { simulateRun, type SimOptions } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { chunksOf } from "../../helpers/byte-source";
import { build } from "../series/stored";

export const loop = demoCrew.routePlans[0].waypoints;

const mudlark: BuildConfig = { vehicleType: "ground", bandMhz: 868, rxSensitivityDbm: -112, cells: 4, failsafe: { action: "return-to-home", expectedWithinS: 1.5 } };

export async function reportInput(
  opts: {
    sim?: Partial<SimOptions>;
    units?: Units;
    title?: string;
    notes?: { body: string; authorName: string | null }[];
    events?: number;
    /** Another log than the simulated rover run (a bench test, a GPX track), with its build and plan. */
    log?: { format: "csv" | "gpx"; body: string; fileName: string; build: BuildConfig | undefined; withPlan: boolean };
  } = {},
): Promise<DebriefReportInput> {
  const csv = opts.log?.body ?? toCsv(simulateRun({ seed: 11, waypoints: loop, startSoc: 0.35, resistanceOhm: 0.06, ...opts.sim }));
  const c = new SeriesCollector();
  const parsed = await parseLog(opts.log?.format ?? "csv", chunksOf(csv), { onBatch: (b) => c.add(b) });
  const series = c.series(parsed.modeNames);
  const withPlan = opts.log?.withPlan ?? true;
  const plan = withPlan ? { waypoints: loop } : undefined;
  const a = analyseRun(series, { build: opts.log ? opts.log.build : mudlark, plan });
  const summary = { ...a.summary, fieldsPresent: parsed.fieldsPresent, hasRc: parsed.hasRc } as unknown as Record<string, unknown>;
  const stored = await build(series, a.perSample);
  const fields = chartFields(summary);
  const s = await readSeries(stored.source, stored.samples, stored.loaded, { fields, points: 1200 });
  const track = await readTrack(stored.source, stored.loaded);
  let events = a.events.map((e, i) => ({
    id: i + 1, kind: e.kind, startS: e.startS, endS: Number.isFinite(e.endS) ? e.endS : e.startS, lat: e.lat, lon: e.lon,
    distanceFromHomeM: e.distanceFromHomeM, peak: e.peak, threshold: e.threshold, detail: (e.detail as Record<string, unknown> | null) ?? null,
  }));
  // Many events (a long, noisy run) by repeating the run's own.
  if (opts.events) events = Array.from({ length: opts.events }, (_, i) => ({ ...events[i % events.length], id: i + 1 }));
  const durationS = series.tS[series.n - 1];
  const debrief = {
    run: {
      id: 42, crewId: 1, title: opts.title ?? "Mudlark flats loop", status: "ready", sampleCount: series.n, durationS, startedAt: parsed.startedAt ?? new Date("2026-11-14T10:00:00Z"),
      summary, upload: { id: 1, fileName: opts.log?.fileName ?? "mudlark-flats-loop.csv", sizeBytes: csv.length, sha256: "0", note: "Behind the dune the link faded." },
    },
    events,
    notes: (opts.notes ?? [{ body: "Moved the receiver antenna up the mast.", authorName: "Jonah Reyes" }]).map((n, i) => ({ id: i + 1, createdAt: new Date("2026-11-14T12:00:00Z"), ...n })),
    buildName: "Mudlark",
    pilotName: "Jonah Reyes",
    plan: withPlan ? { name: "Flats loop", waypoints: loop.map((w) => ({ name: w.name, lat: w.lat, lon: w.lon, radiusM: 2 })) } : null,
    dataVersion: "1",
    signOff: null,
    units: opts.units ?? "metric",
  } as unknown as Debrief;
  return { debrief, series: { version: "1", ...s }, track: { version: "1", ...track }, generatedAt: new Date("2026-11-15T08:00:00Z") };
}
