/**
 * Chart colours. Every colour is a CSS custom property with a fallback, so a high-contrast field
 * mode (or a crew theme) can swap them without touching the charts.
 *
 * Series fallbacks are the colour-blind-safe Okabe–Ito set (M. Okabe & K. Ito, 2008, "Color
 * Universal Design"), minus its yellow, which is unreadable as a thin line on a light card.
 */

/** Okabe–Ito colours by their published names. */
export const OKABE_ITO = {
  black: "#000000",
  orange: "#E69F00",
  skyBlue: "#56B4E9",
  bluishGreen: "#009E73",
  yellow: "#F0E442",
  blue: "#0072B2",
  vermillion: "#D55E00",
  reddishPurple: "#CC79A7",
} as const;

/** Fallbacks for --chart-1 … --chart-6, in the order series take them. */
export const SERIES_FALLBACKS = [
  OKABE_ITO.blue,
  OKABE_ITO.vermillion,
  OKABE_ITO.bluishGreen,
  OKABE_ITO.reddishPurple,
  OKABE_ITO.orange,
  OKABE_ITO.skyBlue,
] as const;

export interface ChartTheme {
  /** Six series colours (--chart-1 … --chart-6). */
  series: string[];
  grid: string;
  axis: string;
  text: string;
  threshold: string;
  band: { act: string; watch: string; info: string };
  /** Font family for canvas text (canvas cannot resolve CSS variables itself). */
  font: string;
}

/** Fallbacks for the non-series roles; they follow the app's paper/ink/verdict colours. */
export const ROLE_FALLBACKS = {
  grid: "#e4dfd3",
  axis: "#46555f",
  text: "#14212b",
  threshold: "#9a5200",
  bandAct: "#b42318",
  bandWatch: "#a86a00",
  bandInfo: "#1f8a86",
} as const;

export const DEFAULT_FONT = "ui-sans-serif, system-ui, sans-serif";

/** Reads a custom property; empty string when unset. */
export type CssVarReader = (name: string) => string;

/**
 * Builds the theme from a custom-property reader (pure, so it can be tested without a DOM).
 * Blank values fall back; anything else is taken as the author wrote it.
 */
export function resolveChartTheme(read: CssVarReader, font?: string): ChartTheme {
  const pick = (name: string, fallback: string) => {
    const v = read(name).trim();
    return v === "" ? fallback : v;
  };
  return {
    series: SERIES_FALLBACKS.map((fb, i) => pick(`--chart-${i + 1}`, fb)),
    grid: pick("--chart-grid", ROLE_FALLBACKS.grid),
    axis: pick("--chart-axis", ROLE_FALLBACKS.axis),
    text: pick("--chart-text", ROLE_FALLBACKS.text),
    threshold: pick("--chart-threshold", ROLE_FALLBACKS.threshold),
    band: {
      act: pick("--chart-band-act", ROLE_FALLBACKS.bandAct),
      watch: pick("--chart-band-watch", ROLE_FALLBACKS.bandWatch),
      info: pick("--chart-band-info", ROLE_FALLBACKS.bandInfo),
    },
    font: font && font.trim() !== "" ? font : DEFAULT_FONT,
  };
}

/** Theme with every fallback: what the server render and the first client render use. */
export const FALLBACK_THEME: ChartTheme = resolveChartTheme(() => "");

/** Reads the live theme from the document (browser only). */
export function readDocumentTheme(): ChartTheme {
  if (typeof document === "undefined") return FALLBACK_THEME;
  const rootStyle = getComputedStyle(document.documentElement);
  const bodyFont = document.body ? getComputedStyle(document.body).fontFamily : "";
  return resolveChartTheme((name) => rootStyle.getPropertyValue(name), bodyFont);
}

/** The colour a series takes: its own, else the palette's next one. */
export function seriesColor(theme: ChartTheme, index: number, own?: string): string {
  return own ?? theme.series[index % theme.series.length];
}

export function themesEqual(a: ChartTheme, b: ChartTheme): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}
