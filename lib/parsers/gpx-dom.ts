import { DOMParser, type Element } from "@xmldom/xmldom";
import { ParseError } from "./types";
import type { WarningLog } from "./warnings";

/** The parsed `<gpx>` root and what the XML reader reported on the way. */
export interface GpxDocument {
  root: Element;
  /** Namespace of the root (GPX 1.0 or 1.1, or null); children are matched in the same one. */
  ns: string | null;
}

/**
 * Parses GPX text into a DOM with @xmldom/xmldom without ever printing to the console.
 * xmldom resolves no DTD and no external entity (it has no file or network access); a reference
 * to an entity declared in a DTD stays as its literal text ("&name;"), so numbers built from it
 * read as missing. A DOCTYPE adds the warning "dtd-ignored"; other reader warnings add "xml-warning".
 *
 * @param text the whole document
 * @param warnings collects the non-fatal findings
 * @returns the root element and its namespace
 * @throws {ParseError} for malformed XML (with xmldom's line and column) or a root that is not <gpx>
 * @example
 * readGpxDocument('<gpx version="1.1"/>', new WarningLog()).root.localName; // => "gpx"
 */
export function readGpxDocument(text: string, warnings: WarningLog): GpxDocument {
  let failure: { message: string; line?: number; column?: number } | null = null;
  let entityLine: number | undefined;
  let entityCount = 0;
  const parser = new DOMParser({
    onError(level, message, context: { locator?: { lineNumber?: number; columnNumber?: number } }) {
      const line = context?.locator?.lineNumber || undefined;
      const column = context?.locator?.columnNumber || undefined;
      if (level === "warning") {
        warnings.add("xml-warning", `The XML reader reported: ${message}`, line);
      } else if (level === "error" && /entity/i.test(message)) {
        entityLine ??= line;
        entityCount++;
      } else {
        failure ??= { message, line, column };
        if (level === "error") throw new Error(message); // stops xmldom: a non-entity error is malformed XML
      }
    },
  });
  let doc;
  let thrown: unknown = null;
  try {
    doc = parser.parseFromString(text, "text/xml");
  } catch (e) {
    thrown = e;
  }
  const f = failure as { message: string; line?: number; column?: number } | null;
  if (thrown || f || !doc) {
    const message = f?.message ?? (thrown instanceof Error ? thrown.message : "no document");
    throw new ParseError(`The GPX file is not well-formed XML: ${message}`, f?.line, f?.column, "well-formed XML");
  }
  const root = doc.documentElement;
  if (!root || root.localName !== "gpx") {
    throw new ParseError(
      `The file's root element is <${root?.localName ?? "none"}>; a GPX file starts with <gpx>`,
      root?.lineNumber,
      undefined,
      "a <gpx> root element",
    );
  }
  if (doc.doctype) {
    warnings.add(
      "dtd-ignored",
      `The file declares a DTD (<!DOCTYPE>); it was ignored and ${entityCount} entity reference(s) were left unexpanded`,
      doc.doctype.lineNumber,
    );
  } else if (entityCount > 0) {
    warnings.add("dtd-ignored", `${entityCount} unknown entity reference(s) were left unexpanded`, entityLine);
  }
  return { root, ns: root.namespaceURI };
}

/**
 * Element children (not deeper descendants) of `parent` named `localName` in namespace `ns`, in
 * document order. Matching the namespace keeps look-alikes from extensions out.
 * @example
 * childElements(trkseg, "trkpt", "http://www.topografix.com/GPX/1/1").length; // => 35
 */
export function childElements(parent: Element, localName: string, ns: string | null): Element[] {
  const out: Element[] = [];
  for (let n = parent.firstChild; n; n = n.nextSibling) {
    if (n.nodeType === 1) {
      const e = n as Element;
      if (e.localName === localName && e.namespaceURI === ns) out.push(e);
    }
  }
  return out;
}

/**
 * Trimmed text of the first child element `localName` in namespace `ns`; null when there is none.
 * @example
 * childText(trkpt, "ele", ns); // => "545.4" ("" for <ele></ele>, null without <ele>)
 */
export function childText(parent: Element, localName: string, ns: string | null): string | null {
  for (let n = parent.firstChild; n; n = n.nextSibling) {
    if (n.nodeType === 1) {
      const e = n as Element;
      if (e.localName === localName && e.namespaceURI === ns) return (e.textContent ?? "").trim();
    }
  }
  return null;
}

/**
 * Strict number from element or attribute text: null, empty, or not entirely a number → NaN
 * (unlike `Number("")`, which is 0, and `parseFloat("12abc")`, which is 12).
 * @example
 * toNumber("-0.114380"); // => -0.11438
 */
export function toNumber(text: string | null): number {
  if (text === null || text === "") return NaN;
  const v = Number(text);
  return Number.isFinite(v) ? v : NaN;
}

const ISO_TIME = /^(\d{4}-\d{2}-\d{2})[T ](\d{2}:\d{2}:\d{2})(\.\d+)?(Z|[+-]\d{2}:?\d{2})?$/i;

/**
 * Milliseconds since 1970 for an xsd:dateTime as GPX writes it ("2015-12-11T15:43:13.994+01:00").
 * The fraction is added separately so sub-millisecond digits survive; a time without a zone is
 * UTC (GPX times are UTC by definition), never the machine's local time.
 *
 * @param text the <time> text
 * @returns epoch milliseconds (may be fractional), or NaN when it is not a valid time
 * @example
 * parseGpxTime("2015-12-11T15:43:13.994+01:00"); // => 1449844993994
 */
export function parseGpxTime(text: string | null): number {
  if (!text) return NaN;
  const m = ISO_TIME.exec(text);
  if (!m) return NaN;
  const zone = m[4] ? (m[4].toUpperCase() === "Z" ? "Z" : m[4].length === 5 ? `${m[4].slice(0, 3)}:${m[4].slice(3)}` : m[4]) : "Z";
  const base = Date.parse(`${m[1]}T${m[2]}${zone}`);
  return m[3] ? base + Number(m[3]) * 1000 : base;
}

/**
 * The `lat` and `lon` attributes in degrees; null when either is missing, not numeric, or outside
 * ±90 / ±180.
 * @example
 * pointCoordinates(trkpt); // => { lat: 45.2787641494, lon: 13.726695478 }
 */
export function pointCoordinates(e: Element): { lat: number; lon: number } | null {
  const lat = toNumber(e.getAttribute("lat")?.trim() ?? null);
  const lon = toNumber(e.getAttribute("lon")?.trim() ?? null);
  if (Number.isNaN(lat) || Number.isNaN(lon) || Math.abs(lat) > 90 || Math.abs(lon) > 180) return null;
  return { lat, lon };
}
