/**
 * Text on a pdfkit page in the shipped IBM Plex Sans subsets: Latin first, then Latin Extended,
 * Cyrillic, Greek and Vietnamese for what Latin lacks, so names such as "Łódź" or "Ана" print as
 * themselves. Every string is cleaned (control characters out) before it is drawn.
 */
import fs from "node:fs";
import path from "node:path";
import { cleanText, fontRuns } from "./layout";

/**
 * IBM Plex Sans (OFL; licence beside the files) as WOFF. The app's WOFF2 files trip fontkit's
 * subsetter on composite glyphs (accented letters, quotes) and Plex Mono's WOFF on its space
 * glyph, so the PDF uses Sans only; its figures are tabular, so columns of numbers still align.
 */
const FONT_DIR = path.join(process.cwd(), "lib", "reports", "fonts");
export const weights = { sans: 400, medium: 500, semibold: 600, bold: 700 } as const;
export type Weight = keyof typeof weights;
const SUBSETS = ["latin", "latin-ext", "cyrillic", "greek", "vietnamese"] as const;

const g = globalThis as unknown as { sortieReportFonts?: Map<string, Buffer> };
/** Read once per process; 6–24 kB each. */
function fontFiles(): Map<string, Buffer> {
  if (!g.sortieReportFonts) {
    const m = new Map<string, Buffer>();
    for (const [w, n] of Object.entries(weights)) {
      for (const s of SUBSETS) m.set(`${w}:${s}`, fs.readFileSync(path.join(FONT_DIR, `ibm-plex-sans-${s}-${n}-normal.woff`)));
    }
    g.sortieReportFonts = m;
  }
  return g.sortieReportFonts;
}

type Align = "left" | "right" | "center";
interface FontkitFont {
  hasGlyphForCodePoint(cp: number): boolean;
}

export class PdfText {
  private weight: Weight = "sans";
  private size = 10;
  private chains = new Map<Weight, ((cp: number) => boolean)[]>();

  constructor(private doc: PDFKit.PDFDocument) {
    for (const [key, buf] of fontFiles()) doc.registerFont(key, buf);
  }

  /** Sets weight, size and colour for what follows. */
  use(weight: Weight, size: number, fill: string): this {
    this.weight = weight;
    this.size = size;
    this.doc.font(`${weight}:latin`).fontSize(size).fillColor(fill);
    return this;
  }

  private chain(): ((cp: number) => boolean)[] {
    let c = this.chains.get(this.weight);
    if (!c) {
      c = SUBSETS.map((s) => {
        this.doc.font(`${this.weight}:${s}`);
        // pdfkit keeps the fontkit font of an embedded font on `_font.font`.
        const fk = (this.doc as unknown as { _font?: { font?: FontkitFont } })._font?.font;
        return fk ? (cp: number) => fk.hasGlyphForCodePoint(cp) : () => s === "latin";
      });
      this.doc.font(`${this.weight}:latin`);
      this.chains.set(this.weight, c);
    }
    return c;
  }

  private runs(s: string, multiline: boolean) {
    return fontRuns(cleanText(s, multiline), this.chain()).map((r) => ({ font: `${this.weight}:${SUBSETS[r.font]}`, text: r.text }));
  }

  /** The text as it will be printed, in one font (for measuring). */
  private plain(s: string, multiline: boolean) {
    return this.runs(s, multiline).map((r) => r.text).join("");
  }

  /** Flowing text; wraps within `opts.width`. Mixed scripts are written as one continued paragraph. */
  write(s: string, x?: number, y?: number, opts: PDFKit.Mixins.TextOptions & { multiline?: boolean } = {}): this {
    const { multiline = false, ...o } = opts;
    const runs = this.runs(s, multiline);
    if (runs.length === 0) return this;
    runs.forEach((r, i) => {
      this.doc.font(r.font);
      const more = i < runs.length - 1;
      if (i === 0) this.doc.text(r.text, x, y, { ...o, continued: more });
      else this.doc.text(r.text, { continued: more });
    });
    this.doc.font(`${this.weight}:latin`);
    return this;
  }

  /** Height `s` takes in `width` (measured in the Latin font; other subsets have the same metrics). */
  height(s: string, width: number, multiline = false): number {
    return this.doc.heightOfString(this.plain(s, multiline) || " ", { width });
  }

  widthOf(s: string): number {
    let w = 0;
    for (const r of this.runs(s, false)) w += this.doc.font(r.font).widthOfString(r.text);
    this.doc.font(`${this.weight}:latin`);
    return w;
  }

  /** One line, never wrapped: cut with "…" to fit `width` when given, aligned within it. */
  cell(s: string, x: number, y: number, width?: number, align: Align = "left"): this {
    let runs = this.runs(s, false);
    const w = () => runs.reduce((sum, r) => sum + this.doc.font(r.font).widthOfString(r.text), 0);
    let total = w();
    if (width != null && total > width) {
      const ell = this.doc.font(`${this.weight}:latin`).widthOfString("…");
      // Drop characters from the end until it fits with the ellipsis.
      while (runs.length && total + ell > width) {
        const last = runs[runs.length - 1];
        const chars = [...last.text];
        chars.pop();
        if (chars.length) last.text = chars.join("");
        else runs = runs.slice(0, -1);
        total = w();
      }
      runs = [...runs, { font: `${this.weight}:latin`, text: "…" }];
      total += ell;
    }
    let cx = width == null || align === "left" ? x : align === "right" ? x + width - total : x + (width - total) / 2;
    for (const r of runs) {
      this.doc.font(r.font).text(r.text, cx, y, { lineBreak: false });
      cx += this.doc.widthOfString(r.text);
    }
    this.doc.font(`${this.weight}:latin`);
    return this;
  }

  get fontSize(): number {
    return this.size;
  }
}
