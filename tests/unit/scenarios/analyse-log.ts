/**
 * Runs a practice log through the same code as `npm run analyse`: detectFormat → parseLog (the
 * real parsers, streaming text chunks) → SeriesCollector → analyseRun with the scenario's build
 * and plan (scripts/analyse.ts wires it the same way).
 */
import { analyseRun } from "@/lib/analysis/analyse-run";
import type { AnalysisEvent, BuildConfig, RoutePlanInput, RunSeries } from "@/lib/analysis/types";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseLog, type ParseLogResult } from "@/lib/parsers/parse-log";
import type { PracticeLog } from "@/scripts/simulator/practice-scenarios";

/** Chunks of 16 KB, as a file or storage stream would deliver them. */
async function* chunks(text: string) {
  for (let i = 0; i < text.length; i += 16 * 1024) yield text.slice(i, i + 16 * 1024);
}

/**
 * The summary is read loosely typed on purpose: the tests state the stored summary's contract
 * (README "The analysis"), as the debrief and the command-line analyser's JSON read it.
 */
export type Summary = Record<string, any>;

export interface AnalysedLog {
  format: string;
  samples: number;
  modeNames: string[];
  summary: Summary;
  events: AnalysisEvent[];
  /** Events of one kind, in time order. */
  of: (kind: AnalysisEvent["kind"]) => AnalysisEvent[];
}

/** The log parsed as ingest and the command-line analyser parse it. */
export async function parsePracticeLog(log: PracticeLog): Promise<{ series: RunSeries; parsed: ParseLogResult }> {
  const format = detectFormat(log.text.slice(0, 64 * 1024), log.fileName);
  const collector = new SeriesCollector();
  const parsed = await parseLog(format, chunks(log.text), { onBatch: (b) => collector.add(b) });
  return { series: collector.series(parsed.modeNames), parsed };
}

export async function analyseLog(log: PracticeLog, build: BuildConfig, plan?: RoutePlanInput): Promise<AnalysedLog> {
  const { series, parsed } = await parsePracticeLog(log);
  const format = parsed.format;
  const result = analyseRun(series, { build, plan });
  const events = result.events;
  return {
    format,
    samples: parsed.sampleCount,
    modeNames: parsed.modeNames,
    summary: result.summary as Summary,
    events,
    of: (kind) => events.filter((e) => e.kind === kind),
  };
}

/** Rows of a practice CSV as records of header → text. */
export function csvRows(text: string): Record<string, string>[] {
  const [head, ...lines] = text.trimEnd().split("\n");
  const keys = head.split(",");
  return lines.map((l) => Object.fromEntries(l.split(",").map((v, i) => [keys[i], v])));
}
