/**
 * Colour for the track's link metric: a fixed display range per metric, cut into a few bins, each
 * bin painted with cividis (Nuñez, Anderton & Renslow 2018, PLOS ONE 13(7)), a sequential scale
 * built to read the same with red–green colour-vision deficiency. Low link = dark, high = light:
 * weak stretches are the darkest, heaviest marks on the paper background, which is what a
 * debrief looks for first.
 */
import { interpolateCividis } from "d3-scale-chromatic";
import type { TrackMetric, TrackResponse } from "@/lib/series/types";

export const LINK_BINS = 8;

type Unit = NonNullable<TrackResponse["metric"]>["unit"];

export interface LinkScale {
  field: TrackMetric;
  unit: Unit;
  /** Short name for the legend. */
  label: string;
  /** Display range; values outside it take the end bins. Higher is always the better link. */
  min: number;
  max: number;
  bins: number;
}

/**
 * Display ranges. Common practice for hobby receivers, not a standard: LQ and RSSI % are shares
 * (0–100 %); RSSI in dBm from about −110 (near the sensitivity of typical 2.4 GHz / sub-GHz
 * receivers) to −50 (close-in); SNR from −10 dB (link at its limit) to +15 dB (clean).
 */
const ranges: Record<TrackMetric, { unit: Unit; label: string; min: number; max: number }> = {
  lqPct: { unit: "%", label: "Link quality (LQ)", min: 0, max: 100 },
  rssiPct: { unit: "%", label: "RSSI", min: 0, max: 100 },
  rssiDbm: { unit: "dBm", label: "RSSI", min: -110, max: -50 },
  snrDb: { unit: "dB", label: "SNR", min: -10, max: 15 },
};

export function linkScale(field: TrackMetric, bins: number = LINK_BINS): LinkScale {
  const r = ranges[field];
  return { field, ...r, bins };
}

/** Bin index 0…bins−1 of a value (clamped to the range); null when there is no value. */
export function linkBin(value: number | null | undefined, scale: LinkScale): number | null {
  if (value == null || !Number.isFinite(value)) return null;
  const span = scale.max - scale.min;
  // Multiply before dividing so edges such as −102.5 dBm land exactly on a bin boundary.
  const bin = Math.floor(((value - scale.min) * scale.bins) / span);
  return Math.min(scale.bins - 1, Math.max(0, bin));
}

/** Position 0…1 on the colour ramp of a bin's centre. */
export function binCentre(bin: number, scale: LinkScale): number {
  return (bin + 0.5) / scale.bins;
}

/** The CSS colour of a bin: cividis at the bin's centre. */
export function binColour(bin: number, scale: LinkScale): string {
  return interpolateCividis(binCentre(bin, scale));
}

/** The metric values a bin covers, [low, high), for labels. */
export function binRange(bin: number, scale: LinkScale): [number, number] {
  const w = (scale.max - scale.min) / scale.bins;
  return [scale.min + bin * w, scale.min + (bin + 1) * w];
}

/** A value's display colour, or null without a value. */
export function linkColour(value: number | null | undefined, scale: LinkScale): string | null {
  const bin = linkBin(value, scale);
  return bin == null ? null : binColour(bin, scale);
}
