"use client";

import "uplot/dist/uPlot.min.css";
import "./charts.css";
import uPlot from "uplot";
import { useEffect, useLayoutEffect, useMemo, useRef, type ReactNode } from "react";
import type { SeriesField } from "@/lib/series/types";
import type { ChartTheme } from "./chart-theme";
import { distanceConverter, formatDistance, isLogLabelValue, logAxisLabels } from "./log-axis";
import { buildRangeData, MIN_RANGE_SAMPLES, rangeEmptyReason, type RangeData } from "./range-data";
import { formatValue, paddedRange } from "./series-to-uplot";
import { useChartTheme } from "./use-chart-theme";
import { useElementWidth } from "./use-element-width";
import { useAbsentFields, usePoints } from "./use-series";

export interface RangeChartProps {
  runId: number;
  /** The run's data version; changes on every re-parse so no cached points outlive it. */
  version?: string;
  /** Where the data endpoints live; default `/api/runs/{runId}` (the shared page passes its share link's). */
  apiBase?: string;
  /** The run's log-distance fit (RSSI at 1 m and path-loss exponent n), null when none was made. */
  fit: { p0Dbm: number; pathLossExponent: number } | null;
  /** Receiver sensitivity + fade margin, dBm. */
  thresholdDbm: number | null;
  /** Where the fit meets the threshold, m. */
  estimatedRangeM: number | null;
  /** Metres → display unit. Without it, `distanceUnit` "m", "km", "ft" or "mi" picks one. */
  convertDistance?: (m: number) => number;
  distanceUnit?: string;
}

const RANGE_FIELDS: SeriesField[] = ["distanceFromHomeM", "rssiDbm"];
const RANGE_POINTS = 1500;
const HEIGHT = 280;
const NARROW_HEIGHT = 230;
const NARROW_PX = 480;

interface RangeState {
  data: RangeData | null;
  thresholdDbm: number | null;
  estimatedX: number | null;
  estimatedLabel: string;
  theme: ChartTheme;
  width: number;
  height: number;
  unit: string;
}

/**
 * RSSI against distance from home on a log-10 distance axis: the samples as dots, the run's
 * log-distance fit, the free-space line from the same 1 m level, the threshold and the range
 * where the fit meets it.
 */
export function RangeChart({ runId, version, apiBase, fit, thresholdDbm, estimatedRangeM, convertDistance, distanceUnit }: RangeChartProps) {
  const theme = useChartTheme();
  const wrapRef = useRef<HTMLDivElement>(null);
  const width = useElementWidth(wrapRef);
  const points = usePoints(runId, RANGE_FIELDS, RANGE_POINTS, version, apiBase);
  const unit = distanceUnit ?? "m";
  const toUnit = distanceConverter(distanceUnit, convertDistance);
  const p0 = fit?.p0Dbm;
  const n = fit?.pathLossExponent;

  const data = useMemo(
    () =>
      points.data
        ? buildRangeData(points.data, p0 != null && n != null ? { p0Dbm: p0, pathLossExponent: n } : null, estimatedRangeM, toUnit)
        : null,
    [points.data, p0, n, estimatedRangeM, toUnit],
  );
  const tooFew = data != null && data.samples < MIN_RANGE_SAMPLES;
  const absent = useAbsentFields(runId, RANGE_FIELDS, tooFew, version, apiBase);
  const height = width > 0 && width < NARROW_PX ? NARROW_HEIGHT : HEIGHT;
  const estimatedX = estimatedRangeM != null && Number.isFinite(estimatedRangeM) && estimatedRangeM > 0 ? toUnit(estimatedRangeM) : null;
  const estimatedLabel = estimatedX != null ? `Estimated range ${formatDistance(estimatedX, unit)}` : "";

  const hostRef = useRef<HTMLDivElement>(null);
  const readoutRef = useRef<HTMLParagraphElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const state = useRef<RangeState>({ data, thresholdDbm, estimatedX, estimatedLabel, theme, width, height, unit });
  useLayoutEffect(() => {
    Object.assign(state.current, { data, thresholdDbm, estimatedX, estimatedLabel, theme, width, height, unit });
  });

  const canCreate = width > 0 && data != null && !tooFew;
  useEffect(() => {
    const host = hostRef.current;
    const s = state.current;
    if (!canCreate || !host || !s.data) return;
    const font = `11px ${s.theme.font}`;
    const labelFont = `600 11px ${s.theme.font}`;
    const th = () => state.current.theme;
    const axisStroke = () => th().axis;
    const gridStroke = () => th().grid;

    const opts: uPlot.Options = {
      width: s.width,
      height: s.height,
      legend: { show: false },
      padding: [10, 14, 0, 0],
      cursor: {
        y: false,
        drag: { x: false, y: false, setScale: false },
        points: { show: false },
        bind: { dblclick: () => null },
      },
      select: { show: false, left: 0, top: 0, width: 0, height: 0 },
      scales: {
        x: { time: false, distr: 3, log: 10 },
        y: {
          range: (_u, min, max) => {
            const t = state.current.thresholdDbm;
            return paddedRange(min, max, t != null && Number.isFinite(t) ? [t] : []);
          },
        },
      },
      axes: [
        {
          scale: "x",
          label: `Distance from home (${s.unit}, log scale)`,
          labelSize: 18,
          labelFont,
          font,
          size: 26,
          stroke: axisStroke,
          grid: { stroke: gridStroke, width: 1, filter: (_u, splits) => splits.map((v) => (isLogLabelValue(v) ? v : null)) },
          ticks: { stroke: gridStroke, width: 1, size: 3 },
          values: (_u, splits) => logAxisLabels(splits, state.current.width < 420),
        },
        {
          scale: "y",
          label: "RSSI (dBm)",
          labelSize: 18,
          labelFont,
          font,
          size: 42,
          stroke: axisStroke,
          grid: { stroke: gridStroke, width: 1 },
          ticks: { stroke: gridStroke, width: 1, size: 3 },
        },
      ],
      series: [
        {},
        {
          // Scatter: dots only, never a line joining samples of different times.
          paths: () => null,
          stroke: () => th().series[0],
          alpha: 0.6,
          points: { show: true, size: 4, width: 0, fill: () => th().series[0] },
        },
        { stroke: () => th().series[1], width: 2, auto: false, spanGaps: true, points: { show: false } },
        { stroke: () => th().series[2], width: 1.5, dash: [6, 4], auto: false, spanGaps: true, points: { show: false } },
      ],
      hooks: {
        setCursor: [
          (u) => {
            const el = readoutRef.current;
            const d = state.current.data;
            if (!el || !d) return;
            const idx = u.cursor.idx;
            if (idx == null || idx < 0 || idx >= d.x.length) {
              el.textContent = "";
              return;
            }
            const parts = [`At ${formatDistance(d.x[idx], state.current.unit)}`];
            if (d.rssi[idx] != null) parts.push(`sample ${formatValue(d.rssi[idx])} dBm`);
            if (d.fit[idx] != null) parts.push(`fit ${formatValue(d.fit[idx])} dBm`);
            if (d.freeSpace[idx] != null) parts.push(`free space ${formatValue(d.freeSpace[idx])} dBm`);
            el.textContent = parts.join(" · ");
          },
        ],
        draw: [(u) => drawRangeGuides(u, state.current)],
      },
    };

    const u = new uPlot(opts, toAligned(s.data), host);
    plotRef.current = u;
    return () => {
      plotRef.current = null;
      u.destroy();
    };
  }, [canCreate, theme.font]);

  useEffect(() => {
    const u = plotRef.current;
    if (u && data && !tooFew) u.setData(toAligned(data));
  }, [data, tooFew]);

  useEffect(() => {
    const u = plotRef.current;
    if (u && width > 0 && (u.width !== width || u.height !== height)) u.setSize({ width, height });
  }, [width, height]);

  useEffect(() => {
    plotRef.current?.redraw(true, true);
  }, [thresholdDbm, estimatedX, theme]);

  const total = points.data?.total ?? 0;

  let body: ReactNode;
  if (points.error) {
    body = (
      <p className="rounded-md border border-act/40 px-3 py-2 text-sm text-act" role="alert">
        The range data did not load: {points.error.message}
      </p>
    );
  } else if (tooFew) {
    body = (
      <p className="rounded-md border border-dashed border-rule px-3 py-2 text-sm text-ink-soft">
        {rangeEmptyReason(absent, data?.samples ?? 0)}
      </p>
    );
  } else {
    body = (
      <>
        {!data || width <= 0 ? <div className="animate-pulse rounded-md bg-tide-50" style={{ height }} aria-hidden="true" /> : null}
        <div ref={hostRef} aria-hidden="true" />
        <p ref={readoutRef} className="figures mt-1 min-h-5 text-sm text-ink" aria-live="off" />
        <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-soft">
          <li className="flex items-center gap-1.5">
            <span className="inline-block size-2 rounded-full" style={{ backgroundColor: theme.series[0] }} aria-hidden="true" />
            Samples{data ? ` (${data.samples}${total > data.samples ? ` of ${total}` : ""})` : ""}
          </li>
          {fit ? (
            <>
              <li className="flex items-center gap-1.5">
                <span className="inline-block h-0.5 w-4" style={{ backgroundColor: theme.series[1] }} aria-hidden="true" />
                Fit: n = {fit.pathLossExponent.toFixed(2)}, {formatValue(fit.p0Dbm)} dBm at 1 m
              </li>
              <li className="flex items-center gap-1.5">
                <span className="inline-block w-4 border-t-2 border-dashed" style={{ borderColor: theme.series[2] }} aria-hidden="true" />
                Free space (n = 2)
              </li>
            </>
          ) : (
            <li>No fit for this run.</li>
          )}
          {thresholdDbm != null ? (
            <li className="flex items-center gap-1.5">
              <span className="inline-block w-4 border-t-2 border-dashed" style={{ borderColor: theme.threshold }} aria-hidden="true" />
              Threshold {formatValue(thresholdDbm)} dBm (sensitivity + fade margin)
            </li>
          ) : null}
          {estimatedX != null ? (
            <li className="flex items-center gap-1.5">
              <span className="inline-block h-3 border-l-2 border-dashed" style={{ borderColor: theme.text }} aria-hidden="true" />
              {estimatedLabel}, an estimate from this run only
            </li>
          ) : null}
        </ul>
      </>
    );
  }

  return (
    <div
      ref={wrapRef}
      className="sortie-chart"
      data-testid="range-chart"
      data-points={data && !tooFew ? data.samples : 0}
      data-empty={tooFew ? "true" : undefined}
      role="figure"
      aria-label="RSSI against distance from home"
    >
      {body}
    </div>
  );
}

function toAligned(d: RangeData): uPlot.AlignedData {
  return [d.x, d.rssi, d.fit, d.freeSpace];
}

/** Threshold (horizontal) and estimated range (vertical), dashed, with labels. */
function drawRangeGuides(u: uPlot, s: RangeState) {
  const { ctx } = u;
  const { left, top, width, height } = u.bbox;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  ctx.font = `600 ${11 * px}px ${s.theme.font}`;
  const label = (text: string, x: number, y: number, color: string) => {
    ctx.lineWidth = 3 * px;
    ctx.strokeStyle = "rgba(255,255,255,0.85)";
    ctx.strokeText(text, x, y);
    ctx.fillStyle = color;
    ctx.fillText(text, x, y);
  };
  if (s.thresholdDbm != null && Number.isFinite(s.thresholdDbm)) {
    const y = Math.round(u.valToPos(s.thresholdDbm, "y", true)) + 0.5;
    if (y >= top && y <= top + height) {
      ctx.strokeStyle = s.theme.threshold;
      ctx.lineWidth = 1.5 * px;
      ctx.setLineDash([6 * px, 4 * px]);
      ctx.beginPath();
      ctx.moveTo(left, y);
      ctx.lineTo(left + width, y);
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.textAlign = "left";
      const above = y - top > 16 * px;
      ctx.textBaseline = above ? "bottom" : "top";
      label(`Threshold ${formatValue(s.thresholdDbm)} dBm`, left + 4 * px, above ? y - 3 * px : y + 3 * px, s.theme.threshold);
    }
  }
  if (s.estimatedX != null) {
    const x = Math.round(u.valToPos(s.estimatedX, "x", true)) + 0.5;
    if (x >= left && x <= left + width) {
      ctx.strokeStyle = s.theme.text;
      ctx.lineWidth = 1.5 * px;
      ctx.setLineDash([3 * px, 3 * px]);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      ctx.setLineDash([]);
      // Label on whichever side of the line has room.
      const room = left + width - x;
      ctx.textAlign = room > 140 * px ? "left" : "right";
      ctx.textBaseline = "top";
      label(s.estimatedLabel, room > 140 * px ? x + 4 * px : x - 4 * px, top + 4 * px, s.theme.text);
    }
  }
  ctx.restore();
}
