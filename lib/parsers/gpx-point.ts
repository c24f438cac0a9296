import type { Element } from "@xmldom/xmldom";
import type { BatchBuilder } from "./batch-builder";
import { childText, toNumber } from "./gpx-dom";
import type { SampleField } from "./types";
import type { WarningLog } from "./warnings";

/**
 * GPX `<fix>` (xsd fixType) → Sortie `fixType`:
 * none → 0; 2d → 2; 3d → 3; dgps → 2 (a differential fix, the DGPS code of the sample stream);
 * pps → 3 (military precise positioning, treated as a full 3-D fix). Any other text is left empty
 * with a "bad-value" warning.
 */
export const GPX_FIX_TYPES: Readonly<Record<string, number>> = { none: 0, "2d": 2, "3d": 3, dgps: 2, pps: 3 };

/** Per-point GPX children copied to sample fields, with the range each must fall in. */
const NUMERIC_CHILDREN: readonly { tag: string; field: SampleField; min: number; max: number; integer?: boolean }[] = [
  { tag: "ele", field: "altM", min: -Infinity, max: Infinity },
  { tag: "sat", field: "sats", min: 0, max: Infinity, integer: true },
  { tag: "hdop", field: "hdop", min: 0, max: Infinity },
  // GPX 1.0 only: <speed> in m/s and <course> in degrees true (1.1 moved them to extensions,
  // which are not read).
  { tag: "speed", field: "speedMps", min: 0, max: Infinity },
  { tag: "course", field: "headingDeg", min: 0, max: 360 },
];

/**
 * Copies one point's <ele>, <sat>, <hdop>, <fix>, <speed> and <course> into the current sample of
 * `b`. Empty or absent elements stay NaN; present but invalid text (not a number, out of range,
 * unknown fix) also stays NaN and adds a "bad-value" warning for that element. <extensions> and
 * anything else are never looked at.
 *
 * @param p the <trkpt> (or <rtept>/<wpt>) element
 * @param ns the GPX namespace of the document
 * @param b builder positioned on the sample (after `begin`)
 * @param warnings receives "bad-value" findings
 * @param pointNo 1-based point number, for messages
 * @example
 * readPointFields(trkpt, ns, builder, warnings, 1); // sets altM, sats, hdop, fixType… when present
 */
export function readPointFields(p: Element, ns: string | null, b: BatchBuilder, warnings: WarningLog, pointNo: number): void {
  for (const { tag, field, min, max, integer } of NUMERIC_CHILDREN) {
    const text = childText(p, tag, ns);
    if (text === null || text === "") continue;
    const v = toNumber(text);
    if (Number.isNaN(v) || v < min || v > max || (integer && !Number.isInteger(v))) {
      badValue(warnings, p, pointNo, tag, text);
      continue;
    }
    b.set(field, field === "headingDeg" ? v % 360 : v);
  }
  const fix = childText(p, "fix", ns);
  if (fix !== null && fix !== "") {
    const code = GPX_FIX_TYPES[fix.toLowerCase()];
    if (code === undefined) badValue(warnings, p, pointNo, "fix", fix);
    else b.set("fixType", code);
  }
}

function badValue(warnings: WarningLog, p: Element, pointNo: number, tag: string, text: string): void {
  const shown = text.length > 40 ? `${text.slice(0, 40)}…` : text;
  warnings.add("bad-value", `Some <${tag}> values are invalid and were left empty (first: point ${pointNo}, ${JSON.stringify(shown)})`, p.lineNumber, tag);
}
