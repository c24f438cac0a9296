import { ParseError, type ByteSource } from "./types";

const BOM = "\uFEFF";
const DEFAULT_MAX_LINE_CHARS = 1_000_000;

/**
 * Turns a mixed stream of byte and text chunks into text pieces. Bytes are UTF-8 decoded with
 * `stream: true`, so a multi-byte character split across two chunks comes out whole; a UTF-8 BOM
 * at the very start is dropped (TextDecoder drops it for bytes; text chunks are checked here).
 */
async function* textPieces(source: ByteSource): AsyncGenerator<{ text: string; bytes: number }> {
  const decoder = new TextDecoder("utf-8");
  let first = true;
  const emit = (text: string) => {
    if (first && text.length > 0) {
      first = false;
      if (text.startsWith(BOM)) text = text.slice(1);
    }
    return text;
  };
  for await (const chunk of source) {
    if (typeof chunk === "string") {
      // Flush bytes still held by the decoder so the order of the input is kept.
      const held = decoder.decode();
      if (held) yield { text: emit(held), bytes: 0 };
      yield { text: emit(chunk), bytes: utf8Length(chunk) };
    } else {
      yield { text: emit(decoder.decode(chunk, { stream: true })), bytes: chunk.byteLength };
    }
  }
  const rest = decoder.decode();
  if (rest) yield { text: emit(rest), bytes: 0 };
}

/** Byte length of `s` once UTF-8 encoded, without allocating the encoding. */
function utf8Length(s: string): number {
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < s.length) {
      n += 4; // surrogate pair = one 4-byte character
      i++;
    } else n += 3;
  }
  return n;
}

function formatSize(bytes: number): string {
  const mb = bytes / (1024 * 1024);
  if (mb >= 1) return `${Number.isInteger(mb) ? mb : mb.toFixed(1)} MB`;
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${bytes} bytes`;
}

/**
 * Reads a whole source into one string (UTF-8, BOM removed), refusing inputs above a size limit.
 * Used for formats that need the whole document at once (GPX is parsed into a DOM).
 *
 * @param source byte or text chunks
 * @param maxBytes largest accepted input, in bytes (UTF-8)
 * @param label format name used in the size message, "GPX" unless given
 * @returns the decoded text
 * @throws {ParseError} when the input is larger than `maxBytes` (reading stops at that point)
 * @example
 * await readAllText(chunks("\uFEFF<gpx/>"), 1024); // => "<gpx/>"
 */
export async function readAllText(source: ByteSource, maxBytes: number, label = "GPX"): Promise<string> {
  const parts: string[] = [];
  let total = 0;
  for await (const { text, bytes } of textPieces(source)) {
    total += bytes;
    if (total > maxBytes) {
      throw new ParseError(
        `${label} files larger than ${formatSize(maxBytes)} are not supported; split the log or export a shorter time range`,
        undefined,
        undefined,
        `at most ${formatSize(maxBytes)}`,
      );
    }
    parts.push(text);
  }
  return parts.join("");
}

/**
 * Yields the lines of a source one at a time, streaming: only the current partial line is held.
 * Line ends CRLF, LF and a lone CR are all accepted (a CR at the end of a chunk waits for the next
 * chunk to see whether an LF follows). A final line without a line end is yielded too; a line end
 * at the very end does not produce an extra empty line. Line numbers are 1-based.
 *
 * @param source byte or text chunks (UTF-8)
 * @param opts.maxLineChars longest accepted line in characters (default 1,000,000), a guard
 *   against binary input without line ends
 * @throws {ParseError} when one line is longer than `maxLineChars`
 * @example
 * for await (const { text, line } of lines(chunks("a\r\nb"))) console.log(line, text); // 1 "a", 2 "b"
 */
export async function* lines(
  source: ByteSource,
  opts: { maxLineChars?: number } = {},
): AsyncGenerator<{ text: string; line: number }> {
  const maxLineChars = opts.maxLineChars ?? DEFAULT_MAX_LINE_CHARS;
  let pending = "";
  let scanned = 0; // characters of `pending` already known to hold no line end
  let line = 0;
  for await (const { text } of textPieces(source)) {
    pending += text;
    let start = 0;
    let i = scanned;
    for (;;) {
      while (i < pending.length && pending[i] !== "\n" && pending[i] !== "\r") i++;
      // A CR as the last character may be the first half of a CRLF split across chunks.
      if (i >= pending.length || (pending[i] === "\r" && i === pending.length - 1)) break;
      yield { text: pending.slice(start, i), line: ++line };
      start = pending[i] === "\r" && pending[i + 1] === "\n" ? i + 2 : i + 1;
      i = start;
    }
    pending = pending.slice(start);
    scanned = i - start;
    if (scanned > maxLineChars) {
      throw new ParseError(`Line ${line + 1} is longer than ${maxLineChars} characters; this does not look like a text log`, line + 1);
    }
  }
  // A trailing CR ends a (possibly empty) line; otherwise only a non-empty rest is a line.
  if (pending.endsWith("\r")) yield { text: pending.slice(0, -1), line: ++line };
  else if (pending.length > 0) yield { text: pending, line: ++line };
}
