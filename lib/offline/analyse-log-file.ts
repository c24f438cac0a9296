/**
 * One log file parsed and analysed with the server's own code and no database: the command-line
 * analyser and the tests against real recordings share it.
 */
import fs from "node:fs";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import type { BuildConfig, RoutePlanInput, Thresholds } from "@/lib/analysis/types";
import { peek } from "@/lib/ingest/byte-source";
import type { ColumnMap } from "@/lib/parsers/column-map";
import { detectFormat } from "@/lib/parsers/detect-format";
import { parseLog } from "@/lib/parsers/parse-log";
import { partStartedAt, RunSplitter } from "@/lib/parsers/run-splitter";
import { timesUsable } from "@/lib/parsers/warnings";

export interface AnalyseLogFileOptions {
  build?: BuildConfig;
  plan?: RoutePlanInput;
  columnMap?: ColumnMap;
  /** Defaults for the build's vehicle type (ground without a build) when absent. */
  thresholds?: Thresholds;
}

/**
 * Parses `file`, cuts it into its runs while it streams (as the server does, lib/parsers/run-splitter.ts)
 * and analyses each run. A log without samples still gets one (empty) document.
 * @returns one document per run, in file order: format, samples, startedAt, warnings, the CSV column
 *   map when CSV, summary and events
 * @throws {ParseError} for input the parser refuses
 */
export async function analyseLogFile(file: string, opts: AnalyseLogFileOptions = {}) {
  const { build, plan, columnMap } = opts;
  const { head, source } = await peek(fs.createReadStream(file));
  const format = detectFormat(head, file);
  const thresholds = opts.thresholds ?? defaultThresholds(build?.vehicleType ?? "ground");
  const collectors: SeriesCollector[] = [];
  const splitter = new RunSplitter(
    { startPart: () => void collectors.push(new SeriesCollector()), batch: (_part, b) => collectors[collectors.length - 1].add(b), endPart: () => {} },
    { gapS: thresholds.runSplitGapS },
  );
  const parsed = await parseLog(format, source, { columnMap, onBatch: (b) => splitter.push(b) });
  const found = await splitter.finish();
  const parts = found.length ? found : [{ part: 1, offsetS: 0, sampleCount: 0 }];
  if (collectors.length === 0) collectors.push(new SeriesCollector());
  const timed = timesUsable(parsed.warnings);
  return parts.map((part, i) => {
    const result = analyseRun(collectors[i].series(parsed.modeNames), { build, plan, thresholds, timesUsable: timed });
    return {
      format,
      samples: part.sampleCount,
      startedAt: partStartedAt(parsed.startedAt, part.offsetS),
      warnings: parsed.warnings,
      ...(format === "csv" ? { columnMap: parsed.columnMap, unplacedColumns: parsed.unplaced ?? [] } : {}),
      summary: result.summary,
      events: result.events,
    };
  });
}

export type LogFileDocument = Awaited<ReturnType<typeof analyseLogFile>>[number];
