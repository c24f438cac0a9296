/**
 * GPX 1.1 (Topografix schema, http://www.topografix.com/GPX/1/1/gpx.xsd) for a run's flown track:
 * one <trk>, a <trkseg> per piece (a new one at every segment start or reception gap), a <trkpt>
 * per stored sample with a position, carrying <ele>, <time>, <sat> and <hdop> when logged, in the
 * order the schema's wptType sequence requires.
 *
 * Time: the run's start (when the log carried a clock) plus the sample's seconds. A log without a
 * clock gets no <time> at all (the schema allows a trkpt without one) rather than an invented date.
 *
 * Streaming: head(), then points() for each chunk, then tail(); the writer only remembers whether a
 * segment is open.
 */
import { decimal, roundPosition, type TrackPoint } from "./track-points";

export interface GpxMeta {
  /** The run's title (escaped here). */
  name: string;
  /** Absolute time of the first sample; null when the log had no clock. */
  startedAt: Date | null;
}

// XML 1.0 §2.2 Char: no control characters but tab, LF, CR; no lone surrogates, no U+FFFE/U+FFFF.
const NOT_XML_CHAR = /[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu;

/** Text for element content or a quoted attribute. */
export function xmlText(s: string): string {
  return s
    .replace(NOT_XML_CHAR, "")
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&apos;");
}

const finite = (v: number) => v - v === 0 && Math.abs(v) < 1e15;

export class GpxWriter {
  private open = false;
  constructor(private readonly meta: GpxMeta) {}

  head(): string {
    const name = xmlText(this.meta.name);
    const time = this.meta.startedAt ? `<time>${this.meta.startedAt.toISOString()}</time>` : "";
    return (
      '<?xml version="1.0" encoding="UTF-8"?>\n' +
      '<gpx version="1.1" creator="Sortie" xmlns="http://www.topografix.com/GPX/1/1" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance" xsi:schemaLocation="http://www.topografix.com/GPX/1/1 http://www.topografix.com/GPX/1/1/gpx.xsd">\n' +
      `<metadata><name>${name}</name>${time}</metadata>\n` +
      `<trk><name>${name}</name>\n`
    );
  }

  points(points: Iterable<TrackPoint>): string {
    const out: string[] = [];
    const t0 = this.meta.startedAt?.getTime() ?? null;
    for (const p of points) {
      if (p.newSegment || !this.open) {
        if (this.open) out.push("</trkseg>\n");
        out.push("<trkseg>\n");
        this.open = true;
      }
      const { lat, lon } = roundPosition(p.lat, p.lon);
      let s = `<trkpt lat="${lat}" lon="${lon}">`;
      if (finite(p.altM)) s += `<ele>${decimal(p.altM, 2)}</ele>`;
      if (t0 !== null && finite(p.tS)) {
        const at = new Date(t0 + Math.round(p.tS * 1000));
        if (!Number.isNaN(at.getTime())) s += `<time>${at.toISOString()}</time>`;
      }
      if (finite(p.sats) && p.sats >= 0) s += `<sat>${Math.round(p.sats)}</sat>`;
      if (finite(p.hdop) && p.hdop >= 0) s += `<hdop>${decimal(p.hdop, 2)}</hdop>`;
      out.push(s + "</trkpt>\n");
    }
    return out.join("");
  }

  tail(): string {
    return (this.open ? "</trkseg>\n" : "") + "</trk>\n</gpx>\n";
  }
}

/** A whole document at once (small tracks, tests). */
export function writeGpx(meta: GpxMeta, points: Iterable<TrackPoint>): string {
  const w = new GpxWriter(meta);
  return w.head() + w.points(points) + w.tail();
}
