import { nmeaChecksumOk } from "./nmea-sentence";
import { ParseError, type LogFormat } from "./types";

/** How much of the head is looked at; callers pass about the first 64 KB of the file. */
const HEAD_CHARS = 64 * 1024;
/** Lines sampled for NMEA and CSV evidence. */
const SAMPLE_LINES = 200;
/** Share of control / replacement characters above which the input counts as binary. */
const MAX_BINARY_SHARE = 0.05;

/** `$GPGGA,` `$GNRMC,` `!AIVDM,` (talker + sentence id) and proprietary `$PUBX,` `$PMTK001,` `$PGRME,`. */
const NMEA_LINE = /^[$!](?:[A-Z][A-Z0-9][A-Z]{3}|P[A-Z0-9]{3,})[,*]/;
/** A whole sentence with its checksum anywhere in a line: `$` or `!`, an address, fields, `*hh`. */
const NMEA_SENTENCE = /[$!](?:[A-Z][A-Z0-9][A-Z]{3}|P[A-Z0-9]{3,}),[^$!*\r\n]*\*[0-9A-Fa-f]{2}/g;
/** Checksum-valid sentences needed to read a head with binary junk or NUL bytes as NMEA. */
const MIN_SENTENCES_AMID_JUNK = 3;
const NMEA_EXTENSIONS = /\.(nmea|nma|gps|ubx|txt|log)$/i;
const GPX_EXTENSIONS = /\.gpx$/i;
const DELIMITERS = [",", ";", "\t", "|"];

/**
 * Decides the format of a log from its first bytes of text; the file name's extension only breaks
 * ties (an NMEA log with many junk lines, an XML file whose root is beyond the head).
 *
 * Rules, in order: binary data (NUL bytes, or more than 5 % control characters) → "nmea" when it
 * holds at least three checksum-valid NMEA 0183 sentences (a receiver's capture with a cold start's
 * NUL padding, binary protocol frames or partial lines; the parser skips the junk), else refused;
 * XML whose root element is `<gpx>` (any prefix) → "gpx" (XML with another root throws; XML whose
 * root lies beyond the head → "gpx", for the GPX parser to judge); at least half of the sampled
 * non-blank, non-`#` lines are NMEA 0183 sentences (`$` or `!`, a talker and a sentence id) → "nmea"
 * (a tenth is enough when the extension is .nmea/.txt/.log and similar); any line with at least two
 * fields split by `,` `;` tab or `|` → "csv".
 *
 * @param head start of the file as text (about 64 KB; a leading BOM is ignored)
 * @param fileName optional original file name, used as a tie-breaker only
 * @returns "gpx", "nmea" or "csv"
 * @throws {ParseError} "The file is empty" for empty or whitespace-only input
 * @throws {ParseError} "This does not look like a text log (CSV, GPX or NMEA 0183)" for binary data
 *   (NUL bytes or more than 5 % non-printable characters) without NMEA sentences, or text without delimiters
 * @throws {ParseError} "This is an XML file with a <kml> root element, not GPX; …" for other XML
 * @example
 * detectFormat("$GPGGA,123519,4807.038,N,01131.000,E,1,08,0.9,545.4,M,46.9,M,,*47\r\n"); // => "nmea"
 */
export function detectFormat(head: string, fileName?: string): LogFormat {
  let text = head.length > HEAD_CHARS ? head.slice(0, HEAD_CHARS) : head;
  if (text.startsWith("\uFEFF")) text = text.slice(1);
  // A head cut out of a longer file may end inside a multi-byte character.
  text = text.replace(/\uFFFD{1,3}$/, "");
  if (text.trim() === "") throw new ParseError("The file is empty");
  if (looksBinary(text)) {
    // Neither CSV nor GPX is binary; sentences amid the junk can only be an NMEA capture.
    if (validSentences(text) >= MIN_SENTENCES_AMID_JUNK) return "nmea";
    throw notALog();
  }

  const trimmed = text.trimStart();
  if (trimmed.startsWith("<")) {
    const root = xmlRootName(trimmed);
    if (root === "gpx") return "gpx";
    if (root !== null) {
      throw new ParseError(
        `This is an XML file with a <${root}> root element, not GPX; only CSV, GPX and NMEA 0183 logs can be read`,
        undefined,
        undefined,
        "a <gpx> root element",
      );
    }
    // Root beyond the head (a long comment or DTD): GPX is the only XML format read, and the
    // GPX parser names the problem precisely if it is not one.
    if (trimmed.startsWith("<?xml") || (fileName && GPX_EXTENSIONS.test(fileName))) return "gpx";
  }

  const sample = text
    .split(/\r\n|\r|\n/, SAMPLE_LINES + 1)
    .slice(0, SAMPLE_LINES)
    .map((l) => l.trim())
    .filter((l) => l !== "");
  // Only lines that start with a sentence count: a CSV may carry raw sentences in a column.
  const nmea = sample.filter((l) => NMEA_LINE.test(l)).length;
  // Comment lines (GPSD's capture files open with a "#" header) are neither NMEA nor evidence against it.
  const nmeaShare = nmea / Math.max(1, sample.filter((l) => !l.startsWith("#")).length);
  if (nmeaShare >= 0.5) return "nmea";
  if (nmea > 0 && nmeaShare >= 0.1 && fileName && NMEA_EXTENSIONS.test(fileName)) return "nmea";
  if (sample.some(hasDelimitedFields)) return "csv";
  if (nmea > 0) return "nmea";
  throw notALog();
}

/** Number of sentences in `text` whose NMEA 0183 checksum (XOR between `$` and `*`) matches. */
function validSentences(text: string): number {
  let n = 0;
  for (const m of text.matchAll(NMEA_SENTENCE)) if (nmeaChecksumOk(m[0])) n++;
  return n;
}

function notALog(): ParseError {
  return new ParseError("This does not look like a text log (CSV, GPX or NMEA 0183)");
}

/** NUL anywhere, or more than 5 % control characters (other than tab, CR, LF, FF) or U+FFFD. */
function looksBinary(text: string): boolean {
  let odd = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return true;
    if ((c < 0x20 && c !== 0x09 && c !== 0x0a && c !== 0x0d && c !== 0x0c) || c === 0x7f || c === 0xfffd) odd++;
  }
  return odd / text.length > MAX_BINARY_SHARE;
}

/**
 * Local name of the first element, skipping the XML declaration, processing instructions,
 * comments and a DOCTYPE (with its internal subset). Null when the head ends before it.
 */
function xmlRootName(text: string): string | null {
  let i = 0;
  for (;;) {
    while (i < text.length && /\s/.test(text[i])) i++;
    if (i >= text.length) return null;
    if (text.startsWith("<?", i)) {
      const end = text.indexOf("?>", i + 2);
      if (end < 0) return null;
      i = end + 2;
    } else if (text.startsWith("<!--", i)) {
      const end = text.indexOf("-->", i + 4);
      if (end < 0) return null;
      i = end + 3;
    } else if (text.startsWith("<!DOCTYPE", i) || text.startsWith("<!doctype", i)) {
      const bracket = text.indexOf("[", i);
      const close = text.indexOf(">", i);
      if (close < 0) return null;
      if (bracket >= 0 && bracket < close) {
        const endSubset = text.indexOf("]", bracket);
        if (endSubset < 0) return null;
        const end = text.indexOf(">", endSubset);
        if (end < 0) return null;
        i = end + 1;
      } else i = close + 1;
    } else if (text[i] === "<") {
      const m = /^<([A-Za-z_][\w.-]*(?::[A-Za-z_][\w.-]*)?)/.exec(text.slice(i, i + 256));
      if (!m) return null;
      const name = m[1];
      return name.includes(":") ? name.slice(name.indexOf(":") + 1) : name;
    } else return null;
  }
}

/** A line with at least two fields split by one of the usual delimiters, e.g. "time,lat,lon". */
function hasDelimitedFields(line: string): boolean {
  return DELIMITERS.some((d) => {
    const fields = line.split(d);
    return fields.length >= 2 && fields.filter((f) => f.trim() !== "").length >= 2;
  });
}
