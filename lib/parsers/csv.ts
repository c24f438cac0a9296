import Papa from "papaparse";
import { BatchBuilder, DEFAULT_BATCH_SIZE } from "./batch-builder";
import { columnMapSchema, type ColumnMap } from "./column-map";
import { extraLines, MAX_LINE_CHARS, RecordSplitter } from "./csv-records";
import { CsvRowReader } from "./csv-rows";
import { assertText, detectNewline, sniffCsv } from "./csv-sniff";
import { ParseError, sampleFields, type BatchSink, type ByteSource, type ParseSummary } from "./types";

/** How much of the file decides the delimiter, decimal mark and column map. */
export const SNIFF_CHARS = 64 * 1024;

export interface CsvParseResult extends ParseSummary {
  /** The column map actually used, with its delimiter and decimal mark filled in. */
  columnMap: ColumnMap;
  /** Headers of the file that no field reads. */
  unplaced: string[];
}

export interface CsvParseOptions {
  /** The map to use; without it one is detected from the first 64 KB. */
  columnMap?: ColumnMap;
  /** Awaited for each batch before more input is read. */
  onBatch: BatchSink;
  batchSize?: number;
}

/** Decodes a byte source into text pieces (UTF-8, streaming, BOM dropped). */
async function* decode(source: ByteSource): AsyncGenerator<string> {
  const decoder = new TextDecoder("utf-8");
  let first = true;
  for await (const chunk of source) {
    // A text chunk after bytes: flush what the decoder holds first, so the order is kept.
    const held = typeof chunk === "string" ? decoder.decode() : "";
    let text = typeof chunk === "string" ? held + chunk : decoder.decode(chunk, { stream: true });
    if (first && text) {
      if (typeof chunk === "string" && text.startsWith("\uFEFF")) text = text.slice(1);
      first = false;
    }
    if (text) yield text;
  }
  const rest = decoder.decode();
  if (rest) yield rest;
}

/** Reads text until the head is long enough to sniff (or the file ends). */
async function readHead(it: AsyncIterator<string>): Promise<{ head: string; done: boolean }> {
  let head = "";
  for (;;) {
    // The first line alone over 1 MB (also when its line break came in the same chunk): the sniffer
    // looks at 64 KB only and would report "no data rows" instead.
    if (head.length > MAX_LINE_CHARS && !/[\r\n]/.test(head.slice(0, MAX_LINE_CHARS + 1))) {
      throw new ParseError("This line is longer than 1 MB; this is not a CSV telemetry log", 1, undefined, "lines of at most 1 MB");
    }
    if (head.length >= SNIFF_CHARS && /[\r\n]/.test(head)) return { head, done: false };
    const r = await it.next();
    if (r.done) return { head, done: true };
    head += r.value;
  }
}

/** A map handed in from outside is checked here too, so its problems read as parse errors. */
function checkGivenMap(map: ColumnMap): void {
  if (!map.columns.some((c) => c.field === "time")) {
    throw new ParseError("The column map has no time column; map one column to Time", 1, undefined, "a time column");
  }
  const r = columnMapSchema.safeParse(map);
  if (!r.success) throw new ParseError(`The column map is not usable: ${r.error.issues[0].message}`, undefined, undefined, "a valid column map");
}

/**
 * Parses a CSV telemetry log into sample batches, streaming: text is decoded chunk by chunk, cut
 * into whole records and read with papaparse, and `onBatch` is awaited before more input is
 * pulled, so a slow consumer holds memory at one batch plus one block of text.
 * Without `columnMap`, the first 64 KB decide delimiter, decimal mark and map (see sniffCsv).
 * Values are converted to the units of types.ts (tS in seconds from the first row, m, m/s, dBm
 * or %, A …); `sourceLine` is the 1-based file line, the header being line 1.
 * @throws ParseError (naming line, column and what was expected) for: binary or empty input, no
 *   time column in the map, an unreadable time in the first data row, no data rows, more than
 *   half of the rows with the wrong number of fields, a line over 1 MB.
 * @example
 *   async function* source() { yield "time_s,alt_m\n0,12\n1,13\n"; }
 *   const r = await parseCsv(source(), { onBatch: (b) => store(b) });
 *   // r.sampleCount === 2; the batch has tS [0, 1] and altM [12, 13]
 */
export async function parseCsv(source: ByteSource, opts: CsvParseOptions): Promise<CsvParseResult> {
  const it = decode(source)[Symbol.asyncIterator]();
  try {
    return await parseText(it, opts);
  } finally {
    await it.return?.(undefined); // on an early error too, so the source (a storage stream) is closed
  }
}

async function parseText(it: AsyncIterator<string>, opts: CsvParseOptions): Promise<CsvParseResult> {
  const { head, done } = await readHead(it);
  assertText(head.slice(0, SNIFF_CHARS));
  if (!head.trim()) throw new ParseError("The file is empty", undefined, undefined, "a header row and data rows");
  const given = opts.columnMap;
  if (given) checkGivenMap(given);
  const sniff = !given || !given.delimiter || !given.decimal ? sniffCsv(head, { truncated: !done }) : null;
  const map: ColumnMap = given
    ? { ...given, delimiter: given.delimiter ?? sniff!.delimiter, decimal: given.decimal ?? sniff!.decimal }
    : sniff!.detected.map;
  const delimiter = map.delimiter!;
  const decimal = map.decimal ?? ".";
  const newline = sniff?.newline ?? detectNewline(head);

  const withRc = map.columns.some((c) => /^rc\d+$/.test(c.field));
  const builder = new BatchBuilder(withRc, opts.batchSize ?? DEFAULT_BATCH_SIZE);
  const splitter = new RecordSplitter(delimiter, newline);
  let reader: CsvRowReader | null = null;
  let headers: string[] = [];
  let line = 1;

  const readBlock = async (block: string, final: boolean) => {
    const rows = Papa.parse<string[]>(block, { delimiter, newline, quoteChar: '"', skipEmptyLines: false }).data;
    // papaparse returns an empty last row for the line break that ends the block.
    if (!final && rows.length && rows[rows.length - 1].length === 1 && rows[rows.length - 1][0] === "") rows.pop();
    // Without quotes no field can hold a line break of the file's own kind; a stray CR or LF of
    // the other kind still counts as a line, as RecordSplitter counts it.
    const plain = block.indexOf('"') < 0 && (newline === "\r\n" ? false : block.indexOf(newline === "\n" ? "\r" : "\n") < 0);
    for (const row of rows) {
      const at = line;
      line += plain ? 1 : 1 + extraLines(row);
      if (!reader) {
        if (row.length === 1 && row[0].trim() === "") continue;
        headers = row.map((h) => h.trim());
        reader = new CsvRowReader(headers, map, decimal, builder);
        continue;
      }
      reader.row(row, at);
      if (builder.full) await opts.onBatch(builder.take()!);
    }
  };

  for (const block of splitter.push(head)) await readBlock(block, false);
  if (!done) {
    for (let r = await it.next(); !r.done; r = await it.next()) {
      for (const block of splitter.push(r.value)) await readBlock(block, false);
    }
  }
  const rest = splitter.end();
  if (rest) await readBlock(rest, true);

  const rd = reader as CsvRowReader | null;
  if (!rd || rd.rows === 0) {
    throw new ParseError("The file has a header row but no data rows", line, undefined, "data rows below the header");
  }
  if (rd.ragged * 2 > rd.rows) {
    throw new ParseError(
      `${rd.ragged} of ${rd.rows} rows have a different number of fields than the header (${headers.length}); the delimiter is probably not ${JSON.stringify(delimiter)}`,
      rd.firstRaggedLine,
      undefined,
      `${headers.length} fields per row`,
    );
  }
  rd.finish();
  const last = builder.take();
  if (last) await opts.onBatch(last);

  const placed = new Set(map.columns.filter((c) => c.field !== "ignore").map((c) => c.header.trim()));
  return {
    format: "csv",
    sampleCount: rd.samples,
    startedAt: rd.startedAt,
    modeNames: rd.modeNames,
    warnings: rd.warnings.list(),
    fieldsPresent: sampleFields.filter((f) => builder.present.has(f)),
    hasRc: builder.hasRc,
    columnMap: map,
    unplaced: headers.filter((h, i) => !placed.has(h) || headers.indexOf(h) !== i),
  };
}
