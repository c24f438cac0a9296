import Papa from "papaparse";
import { detectColumnMap, type DetectedColumnMap } from "./column-map-detect";
import { parseNumber } from "./csv-values";
import { ParseError } from "./types";

export const SNIFF_ROWS = 20;
const SNIFF_MAX_CHARS = 1 << 20;
const DELIMITERS = [",", ";", "\t", "|"];

type Newline = "\n" | "\r\n" | "\r";

export interface CsvSniff {
  delimiter: string;
  decimal: "." | ",";
  newline: Newline;
  /** Header names, trimmed. */
  headers: string[];
  /** The first data rows as read (at most 20). */
  rows: string[][];
  detected: DetectedColumnMap;
}

/**
 * The line break a text uses, from its first one ("\n" when it has none).
 * @example detectNewline("a,b\r\n1,2\r\n") // "\r\n"
 */
export function detectNewline(text: string): Newline {
  const i = text.search(/[\r\n]/);
  if (i < 0 || text[i] === "\n") return "\n";
  return text[i + 1] === "\n" ? "\r\n" : "\r";
}

/**
 * Refuses text that came from a binary file: NUL bytes, or many bytes that were not UTF-8.
 * @throws ParseError naming the line of the first NUL byte.
 * @example assertText("time,v\n0,1\n") // passes; assertText("PK\u0003\u0004\u0000") throws
 */
export function assertText(text: string): void {
  const nul = text.indexOf("\u0000");
  const bad = (text.match(/\uFFFD/g) ?? []).length;
  if (nul < 0 && !(bad > 8 && bad > text.length / 100)) return;
  const line = nul < 0 ? undefined : (text.slice(0, nul).match(/\r\n|\r|\n/g) ?? []).length + 1;
  throw new ParseError("The file holds binary data, not text; expected a CSV telemetry log", line, undefined, "text with one row per line");
}

const COMMA_DECIMAL = /^[+-]?\d+,\d+$/;
const DOT_DECIMAL = /^[+-]?\d*\.\d+$/;

function isNumeric(cell: string): boolean {
  return parseNumber(cell, ".") !== null || parseNumber(cell, ",") !== null;
}

function readRows(text: string, newline: Newline, delimiter: string): string[][] {
  return Papa.parse<string[]>(text, { delimiter, newline, skipEmptyLines: "greedy", preview: SNIFF_ROWS + 1 }).data;
}

/** Share of the data cells (header excluded) that read as numbers with either decimal mark. */
function numericShare(rows: string[][]): number {
  const cells = rows.slice(1).flat();
  return cells.length ? cells.filter((c) => isNumeric(c.trim())).length / cells.length : 0;
}

/**
 * papaparse's guess, unless another delimiter splits every row into the same number (≥ 2) of
 * fields and more of them read as numbers: "0,5;48,1" is two comma-decimal numbers, not three.
 */
function chooseDelimiter(text: string, newline: Newline): string {
  const guessed = Papa.parse<string[]>(text, { delimitersToGuess: DELIMITERS, newline, skipEmptyLines: "greedy", preview: SNIFF_ROWS + 1 }).meta.delimiter;
  let best = DELIMITERS.includes(guessed) ? guessed : ",";
  let bestShare = numericShare(readRows(text, newline, best));
  for (const d of DELIMITERS) {
    const rows = readRows(text, newline, d);
    const consistent = rows.length > 1 && rows[0].length >= 2 && rows.every((r) => r.length === rows[0].length);
    const share = numericShare(rows);
    if (consistent && share > bestShare) (best = d), (bestShare = share);
  }
  return best;
}

/**
 * Reads the head of a CSV log for the column-map form: detects the delimiter (comma, semicolon,
 * tab or pipe, with papaparse), the decimal mark ("12,5" in a semicolon file reads as ","), the
 * line break, the header and the first 20 data rows, and proposes a column map.
 * A BOM is dropped. Pass `truncated: true` when `head` was cut from a longer file, so its last,
 * possibly partial line is not read.
 * @throws ParseError for binary data, an empty file, no header row (only empty fields), a header
 *   with no data rows, or a first row of numbers instead of column names.
 * @example sniffCsv("time;alt\n0;12,5\n").decimal // ","
 */
export function sniffCsv(head: string, opts: { truncated?: boolean } = {}): CsvSniff {
  let text = head.startsWith("\uFEFF") ? head.slice(1) : head;
  if (text.length > SNIFF_MAX_CHARS) text = text.slice(0, SNIFF_MAX_CHARS);
  if (opts.truncated || text.length < head.length - 1) {
    const cut = Math.max(text.lastIndexOf("\n"), text.lastIndexOf("\r"));
    if (cut >= 0) text = text.slice(0, cut + 1);
  }
  assertText(text);
  if (!text.trim()) throw new ParseError("The file is empty", undefined, undefined, "a header row and data rows");
  const newline = detectNewline(text);
  const delimiter = chooseDelimiter(text, newline);
  const [headerRow, ...rows] = readRows(text, newline, delimiter);
  // Lines of nothing but delimiters, quotes or spaces are all skipped as empty: no header at all.
  if (!headerRow) throw new ParseError("The file has no header row, only empty fields", 1, undefined, "a header row of column names");
  const headers = headerRow.map((h) => h.trim());
  if (headers.every((h) => h !== "" && isNumeric(h))) {
    throw new ParseError("The first row holds numbers, not column names", 1, undefined, "a header row of column names");
  }
  if (!rows.length) {
    const line = (text.trimEnd().match(/\r\n|\r|\n/g) ?? []).length + 2;
    throw new ParseError("The file has a header row but no data rows", line, undefined, "data rows below the header");
  }
  const cells = rows.flat().map((c) => c.trim());
  const commaDecimals = cells.filter((c) => COMMA_DECIMAL.test(c)).length;
  const dotDecimals = cells.filter((c) => DOT_DECIMAL.test(c)).length;
  const decimal = commaDecimals > dotDecimals ? "," : ".";
  const detected = detectColumnMap(headers, rows, decimal);
  detected.map = { delimiter, ...detected.map };
  return { delimiter, decimal, newline, headers, rows, detected };
}
