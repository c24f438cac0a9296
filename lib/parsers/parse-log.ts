import type { ColumnMap } from "./column-map";
import { parseCsv } from "./csv";
import { parseGpx } from "./gpx";
import { parseNmea } from "./nmea";
import type { BatchSink, ByteSource, LogFormat, ParseSummary } from "./types";

export interface ParseLogResult extends ParseSummary {
  /** The CSV column map actually used (detected or given); undefined for GPX and NMEA. */
  columnMap?: ColumnMap;
  /** CSV headers the map did not place. */
  unplaced?: string[];
}

/**
 * Parses a log of a known format into batches.
 * @throws ParseError for input that cannot be read, naming the line and column.
 */
export async function parseLog(
  format: LogFormat,
  source: ByteSource,
  opts: { onBatch: BatchSink; columnMap?: ColumnMap; batchSize?: number },
): Promise<ParseLogResult> {
  switch (format) {
    case "csv":
      return parseCsv(source, { columnMap: opts.columnMap, onBatch: opts.onBatch, batchSize: opts.batchSize });
    case "gpx":
      return parseGpx(source, { onBatch: opts.onBatch, batchSize: opts.batchSize });
    case "nmea":
      return parseNmea(source, { onBatch: opts.onBatch, batchSize: opts.batchSize });
  }
}
