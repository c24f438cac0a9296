import { ParseError } from "./types";

/** A log line longer than this is not telemetry (and would make memory grow without bound). */
export const MAX_LINE_CHARS = 1 << 20;
/** Text handed to the CSV reader at a time, so a source that yields one huge chunk stays bounded. */
const BLOCK_CHARS = 64 * 1024;

/**
 * Cuts streamed CSV text into blocks that end exactly after a record, so each block can be read
 * on its own. Follows papaparse's quoting: a quote opens a field only at its start, "" inside is
 * a quote, and a quote closes the field only before the delimiter or line break (spaces between
 * allowed), so a line break inside a quoted field never splits a block.
 * @example new RecordSplitter(",", "\n").push('a,b\n1,"x\ny"\n2') // ['a,b\n1,"x\ny"\n'], "2" waits for more
 */
export class RecordSplitter {
  private buf = "";
  private pos = 0;
  private inQuotes = false;
  private atFieldStart = true;
  private lineLength = 0;
  private prev = "";
  /** Offset in `buf` just after the last complete record. */
  private lastEnd = 0;
  /** 1-based physical line the scan is on, and the line the pending record started on. */
  private line = 1;
  private recordLine = 1;

  constructor(
    private readonly delimiter: string,
    private readonly newline: "\n" | "\r\n" | "\r",
  ) {}

  /**
   * Adds text and returns the blocks of complete records it finishes (possibly none).
   * @throws ParseError when a line exceeds 1 MB or a quoted field stays open for more than 1 MB.
   */
  push(text: string): string[] {
    this.buf += text;
    if (!this.inQuotes && this.newline !== "\r") {
      const plain = this.pushPlain();
      if (plain) return plain;
    }
    const blocks: string[] = [];
    let cut = 0;
    const n = this.buf.length;
    let i = this.pos;
    while (i < n) {
      const c = this.buf[i];
      let step = 1;
      let ends = false;
      if (this.inQuotes) {
        if (c === '"') {
          if (i + 1 >= n) break;
          if (this.buf[i + 1] === '"') step = 2;
          else {
            let j = i + 1;
            while (j < n && this.buf[j] !== this.delimiter && (this.buf[j] === " " || this.buf[j] === "\t")) j++;
            if (j >= n) break;
            const d = this.buf[j];
            if (d === this.delimiter || d === "\r" || d === "\n") this.inQuotes = false;
          }
        }
      } else if (c === '"' && this.atFieldStart) {
        this.inQuotes = true;
        this.atFieldStart = false;
      } else if (c === this.delimiter) {
        this.atFieldStart = true;
      } else if (c === "\r" || c === "\n") {
        if (this.newline !== "\r\n") ends = c === this.newline;
        else if (c === "\r") {
          if (i + 1 >= n) break;
          if (this.buf[i + 1] === "\n") (step = 2), (ends = true);
        }
        // A break that is not the file's line break is data, as papaparse reads it.
        this.atFieldStart = ends;
      } else {
        this.atFieldStart = false;
      }
      for (let k = i; k < i + step; k++) this.count(this.buf[k]);
      i += step;
      if (ends) {
        this.recordLine = this.line;
        if (i - cut >= BLOCK_CHARS) {
          blocks.push(this.buf.slice(cut, i));
          cut = i;
        }
        this.lastEnd = i;
      }
      if (i - this.lastEnd > MAX_LINE_CHARS) {
        if (this.inQuotes) throw new ParseError("A quoted field is not closed within 1 MB", this.recordLine, undefined, 'a closing quote (")');
        throw new ParseError("This row is longer than 1 MB; this is not a CSV telemetry log", this.recordLine, undefined, "rows of at most 1 MB");
      }
    }
    if (this.lastEnd > cut) blocks.push(this.buf.slice(cut, this.lastEnd));
    const keep = Math.max(cut, this.lastEnd);
    this.buf = this.buf.slice(keep);
    this.pos = i - keep;
    this.lastEnd -= keep;
    return blocks;
  }

  /**
   * Fast path for text without quotes and with only the file's own line breaks (the usual case
   * for telemetry): records end at line breaks, found with indexOf instead of a per-character
   * scan. Returns null when the pending text needs the full scan.
   */
  private pushPlain(): string[] | null {
    const buf = this.buf;
    const from = this.lastEnd;
    if (buf.indexOf('"', from) !== -1) return null;
    const crlf = this.newline === "\r\n";
    if (!crlf && buf.indexOf("\r", from) !== -1) return null;
    const blocks: string[] = [];
    let cut = 0;
    let lineStart = from;
    let lastEnd = from;
    let crCount = 0;
    let lines = 0;
    if (crlf) for (let k = buf.indexOf("\r", from); k !== -1; k = buf.indexOf("\r", k + 1)) crCount++;
    for (let k = buf.indexOf("\n", from); k !== -1; k = buf.indexOf("\n", k + 1)) {
      if (crlf && buf.charCodeAt(k - 1) !== 13) return null;
      if (k - lineStart - (crlf ? 1 : 0) > MAX_LINE_CHARS) return null; // let the full scan report it
      lines++;
      lineStart = k + 1;
      lastEnd = k + 1;
      if (lastEnd - cut >= BLOCK_CHARS) {
        blocks.push(buf.slice(cut, lastEnd));
        cut = lastEnd;
      }
    }
    if (crlf && crCount !== lines + (buf.endsWith("\r") ? 1 : 0)) return null;
    if (buf.length - lastEnd > MAX_LINE_CHARS) {
      throw new ParseError("This line is longer than 1 MB; this is not a CSV telemetry log", this.line + lines, undefined, "lines of at most 1 MB");
    }
    if (lastEnd > cut) blocks.push(buf.slice(cut, lastEnd));
    if (lines > 0) {
      this.line += lines;
      this.recordLine = this.line;
      this.lineLength = 0;
      this.prev = "\n";
      this.atFieldStart = true;
    }
    this.buf = buf.slice(lastEnd);
    this.pos = 0;
    this.lastEnd = 0;
    return blocks;
  }

  /** Counts physical lines (CRLF, LF or CR) and refuses an overlong one. */
  private count(c: string): void {
    if (c === "\n" || c === "\r") {
      if (!(c === "\n" && this.prev === "\r")) this.line++;
      this.lineLength = 0;
    } else if (++this.lineLength > MAX_LINE_CHARS) {
      throw new ParseError("This line is longer than 1 MB; this is not a CSV telemetry log", this.line, undefined, "lines of at most 1 MB");
    }
    this.prev = c;
  }

  /** The text after the last complete record (the last record when the file has no final line break). */
  end(): string {
    const rest = this.buf;
    this.buf = "";
    this.pos = 0;
    this.lastEnd = 0;
    return rest;
  }
}

/**
 * How many physical lines a parsed record spans beyond its first (line breaks inside quoted fields).
 * @example extraLines(["a", "x\r\ny"]) // 1
 */
export function extraLines(row: string[]): number {
  let n = 0;
  for (const f of row) {
    if (f.indexOf("\n") < 0 && f.indexOf("\r") < 0) continue;
    n += (f.match(/\r\n|\r|\n/g) ?? []).length;
  }
  return n;
}
