/**
 * Pure layout helpers of the PDF debrief: the local map projection, fitting a drawing into a
 * box, axis ticks, pieces of a series between gaps, the scale bar, text clean-up and the file
 * name. No pdfkit here, so all of it is unit-tested (tests/unit/reports).
 */
import { M_PER_FT, M_PER_MI, type Units } from "@/lib/format/units";

/** Mean Earth radius R1 = 6,371,008.8 m (IUGG; Moritz, Geodetic Reference System 1980). */
export const EARTH_RADIUS_M = 6_371_008.8;

export interface LatLon {
  lat: number;
  lon: number;
}

export interface XY {
  x: number;
  y: number;
}

export interface Bounds {
  minX: number;
  maxX: number;
  minY: number;
  maxY: number;
}

/**
 * A local equirectangular projection about `ref`: metres east (x) and north (y). Over a field a
 * few kilometres across its distortion is far below a printed line's width; longitudes are
 * taken the short way round, so a track across the antimeridian stays in one piece.
 */
export function localProjection(ref: LatLon): (p: LatLon) => XY {
  const k = (Math.PI / 180) * EARTH_RADIUS_M;
  const c = Math.cos((ref.lat * Math.PI) / 180);
  return (p) => {
    let dLon = p.lon - ref.lon;
    if (dLon > 180) dLon -= 360;
    else if (dLon < -180) dLon += 360;
    return { x: dLon * c * k, y: (p.lat - ref.lat) * k };
  };
}

/** The box around the finite points, or null when there is none. */
export function boundsOf(points: Iterable<XY>): Bounds | null {
  let b: Bounds | null = null;
  for (const p of points) {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) continue;
    if (!b) b = { minX: p.x, maxX: p.x, minY: p.y, maxY: p.y };
    else {
      if (p.x < b.minX) b.minX = p.x;
      if (p.x > b.maxX) b.maxX = p.x;
      if (p.y < b.minY) b.minY = p.y;
      if (p.y > b.maxY) b.maxY = p.y;
    }
  }
  return b;
}

export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface Fit {
  /** Page units per metre, the same in x and y (a map must not stretch). */
  scale: number;
  /** Projected metres → page position (page y grows downwards, north is up). */
  toPage(p: XY): XY;
}

/**
 * Fits `bounds` (metres) into `box` (page units) with `pad` on every side, centred, one scale for
 * both axes. A very small extent (a run that never moved) is widened to `minSpanM` so a single
 * point is not blown up to fill the page.
 */
export function fitToBox(bounds: Bounds, box: Box, pad = 0, minSpanM = 20): Fit {
  const cx = (bounds.minX + bounds.maxX) / 2;
  const cy = (bounds.minY + bounds.maxY) / 2;
  const spanX = Math.max(bounds.maxX - bounds.minX, minSpanM);
  const spanY = Math.max(bounds.maxY - bounds.minY, minSpanM);
  const w = Math.max(1, box.w - 2 * pad);
  const h = Math.max(1, box.h - 2 * pad);
  const scale = Math.min(w / spanX, h / spanY);
  const px = box.x + box.w / 2;
  const py = box.y + box.h / 2;
  return { scale, toPage: (p) => ({ x: px + (p.x - cx) * scale, y: py - (p.y - cy) * scale }) };
}

/** The nearest of 1, 2, 5 × 10^k at or above `raw` (raw > 0). */
export function niceStep(raw: number): number {
  if (!(raw > 0) || !Number.isFinite(raw)) return 1;
  const p = 10 ** Math.floor(Math.log10(raw));
  const m = raw / p;
  // A hair of tolerance so 0.3 / 3 = 0.09999… still gives 0.1.
  return (m <= 1 + 1e-9 ? 1 : m <= 2 + 1e-9 ? 2 : m <= 5 + 1e-9 ? 5 : 10) * p;
}

/** Decimals a tick label needs for this step (0.5 → 1, 0.25 → 2, 20 → 0). */
export function stepDecimals(step: number): number {
  for (let d = 0; d <= 6; d++) if (Math.abs(Math.round(step * 10 ** d) - step * 10 ** d) < 1e-6) return d;
  return 6;
}

/**
 * Round tick values inside [min, max], at most about `maxTicks` of them, on a 1-2-5 step.
 * min = max gives that one value.
 */
export function niceTicks(min: number, max: number, maxTicks = 5): { step: number; values: number[] } {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return { step: 1, values: [] };
  if (max < min) [min, max] = [max, min];
  if (max === min) return { step: 1, values: [min] };
  const step = niceStep((max - min) / Math.max(1, maxTicks));
  const values: number[] = [];
  const d = stepDecimals(step);
  for (let v = Math.ceil(min / step - 1e-9) * step; v <= max + step * 1e-9; v += step) values.push(Number(v.toFixed(d)));
  return { step, values };
}

/** Steps of a time axis, s: seconds, then minutes, then hours, as a clock reads. */
const TIME_STEPS = [1, 2, 5, 10, 15, 20, 30, 60, 120, 300, 600, 900, 1200, 1800, 3600, 7200, 10800, 21600, 43200, 86400];

/** Time ticks in s from the run's start over [from, to], at most about `maxTicks`. */
export function timeTicks(from: number, to: number, maxTicks = 6): number[] {
  if (!Number.isFinite(from) || !Number.isFinite(to) || to <= from) return [];
  const raw = (to - from) / Math.max(1, maxTicks);
  const step = TIME_STEPS.find((s) => s >= raw) ?? Math.ceil(raw / 86400) * 86400;
  const out: number[] = [];
  for (let v = Math.ceil(from / step) * step; v <= to + 1e-9; v += step) out.push(v);
  return out;
}

/**
 * A value range worth drawing: the data's min and max, widened to include `include` (a
 * threshold line) and never empty (a flat series gets ±1 or ±5 % around its value).
 */
export function valueRange(values: Iterable<number | null>, include: (number | null | undefined)[] = []): { min: number; max: number } | null {
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    if (v == null || !Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (min > max) return null;
  for (const v of include) {
    if (v == null || !Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  if (max === min) {
    const d = Math.abs(min) > 20 ? Math.abs(min) * 0.05 : 1;
    return { min: min - d, max: max + d };
  }
  const pad = (max - min) * 0.05;
  return { min: min - pad, max: max + pad };
}

/**
 * The runs of consecutive values that are present: a null (a reception gap in the stored levels)
 * ends a piece, so a chart draws a break there rather than a line across it.
 */
export function pieces(t: ArrayLike<number>, v: ArrayLike<number | null>): { t: number; v: number }[][] {
  const out: { t: number; v: number }[][] = [];
  let cur: { t: number; v: number }[] = [];
  for (let i = 0; i < t.length; i++) {
    const y = v[i];
    if (y == null || !Number.isFinite(y) || !Number.isFinite(t[i])) {
      if (cur.length) out.push(cur);
      cur = [];
      continue;
    }
    cur.push({ t: t[i], v: y });
  }
  if (cur.length) out.push(cur);
  return out;
}

/**
 * Index ranges [start, end) of a track split at its breaks (TrackResponse.breaks: indices where a
 * new piece starts; 0 is implied).
 */
export function trackRanges(n: number, breaks: readonly number[]): [number, number][] {
  const cuts = [...new Set(breaks.filter((b) => b > 0 && b < n))].sort((a, b) => a - b);
  const out: [number, number][] = [];
  let start = 0;
  for (const c of [...cuts, n]) {
    if (c > start) out.push([start, c]);
    start = c;
  }
  return out;
}

/**
 * The longest round length (1, 2, 5 × 10^k in m, or in ft / mi for imperial) that fits in
 * `maxMetres`, for the map's scale bar.
 */
export function scaleBar(maxMetres: number, units: Units): { metres: number; label: string } | null {
  if (!(maxMetres > 0) || !Number.isFinite(maxMetres)) return null;
  const floorNice = (v: number) => {
    const p = 10 ** Math.floor(Math.log10(v));
    const m = v / p;
    return (m >= 5 ? 5 : m >= 2 ? 2 : 1) * p;
  };
  if (units === "imperial") {
    const mi = maxMetres / M_PER_MI;
    if (mi >= 0.2) {
      const n = floorNice(mi);
      return { metres: n * M_PER_MI, label: `${trim(n)} mi` };
    }
    const n = floorNice(maxMetres / M_PER_FT);
    return { metres: n * M_PER_FT, label: `${trim(n)} ft` };
  }
  const n = floorNice(maxMetres);
  return n >= 1000 ? { metres: n, label: `${trim(n / 1000)} km` } : { metres: n, label: `${trim(n)} m` };
}

const trim = (v: number) => String(Number(v.toPrecision(6)));

/**
 * User text made fit for a PDF text run: C0/C1 control characters and bidirectional overrides
 * removed (they could hide or reorder what a reader sees), tabs as spaces, line ends as \n,
 * NFC (so "é" is one glyph). Line breaks are kept only when `multiline`.
 */
export function cleanText(s: string | null | undefined, multiline = false): string {
  if (!s) return "";
  let out = s.normalize("NFC").replace(/\r\n?/g, "\n").replace(/\t/g, " ");
  out = out.replace(/[\u0000-\u0008\u000B-\u001F\u007F-\u009F\u200E\u200F\u202A-\u202E\u2066-\u2069]/g, "");
  out = multiline ? out.replace(/\n{3,}/g, "\n\n") : out.replace(/\s*\n\s*/g, " ");
  return out.trim();
}

/** Characters none of the shipped font subsets has, written with ones they have. */
const FALLBACK: Record<string, string> = {
  "≤": "<=",
  "≥": ">=",
  "→": "->",
  "←": "<-",
  "■": "",
  "▲": "",
  "●": "",
};

/**
 * Splits text into runs, each drawn with the first font of the chain that has all its glyphs
 * (index into `chain`); a character no font has becomes its fallback above, else "?". A missing
 * glyph would print as a blank box and extract as nothing, which is worse than a "?". Spaces and
 * line breaks always go to the first font: fontkit cannot subset the space glyph of the other
 * subsets (it fails with an out-of-bounds read).
 */
export function fontRuns(s: string, chain: readonly ((codePoint: number) => boolean)[]): { font: number; text: string }[] {
  const out: { font: number; text: string }[] = [];
  const push = (font: number, text: string) => {
    const last = out[out.length - 1];
    if (last && last.font === font) last.text += text;
    else out.push({ font, text });
  };
  for (const ch of s) {
    if (ch === " " || ch === "\n") {
      push(0, ch);
      continue;
    }
    const cp = ch.codePointAt(0)!;
    const i = chain.findIndex((has) => has(cp));
    if (i >= 0) push(i, ch);
    else {
      const sub = ch in FALLBACK ? FALLBACK[ch] : "?";
      if (sub) push(0, sub);
    }
  }
  return out;
}

/**
 * An ASCII file name from the run's title: "sortie-run-12-mudlark-flats-loop.pdf". Safe in a
 * quoted Content-Disposition filename (no quotes, backslashes or control characters).
 */
export function reportFileName(runId: number, title: string, ext = "pdf"): string {
  const slug = title
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60)
    .replace(/-+$/g, "");
  return `sortie-run-${runId}${slug ? `-${slug}` : ""}.${ext}`;
}
