"use client";

import "uplot/dist/uPlot.min.css";
import "@/components/charts/charts.css";
import uPlot from "uplot";
import { useEffect, useLayoutEffect, useRef } from "react";
import type { ChartTheme } from "@/components/charts/chart-theme";
import { formatValue, paddedRange } from "@/components/charts/series-to-uplot";
import { useChartTheme } from "@/components/charts/use-chart-theme";
import { useElementWidth } from "@/components/charts/use-element-width";

export interface TrendChartProps {
  testId: string;
  label: string;
  unit: string;
  /** One point per run, oldest first; t in Unix seconds. */
  points: { t: number; v: number; runId: number; title: string }[];
  /** When the build record changed (Unix seconds), drawn as dashed vertical lines. */
  markers: { t: number; label: string }[];
  note?: string | null;
}

const HEIGHT = 170;
const DAY_S = 86_400;

const dateText = (t: number) => new Date(t * 1000).toISOString().slice(0, 10);

/** Axis labels in UTC, like the rest of the build page: dates, with the time when ticks are closer than a day. */
function timeLabels(splits: number[], incr: number): string[] {
  return splits.map((t) => {
    const iso = new Date(t * 1000).toISOString();
    return incr >= DAY_S ? iso.slice(5, 10) : `${iso.slice(5, 10)} ${iso.slice(11, 16)}`;
  });
}

interface DrawState {
  markers: { t: number; label: string }[];
  theme: ChartTheme;
}

/** One figure of a build's runs over time, with the moments the build record changed. */
export function TrendChart({ testId, label, unit, points, markers, note }: TrendChartProps) {
  const theme = useChartTheme();
  const wrapRef = useRef<HTMLDivElement>(null);
  const hostRef = useRef<HTMLDivElement>(null);
  const readoutRef = useRef<HTMLParagraphElement>(null);
  const plotRef = useRef<uPlot | null>(null);
  const width = useElementWidth(wrapRef);
  const state = useRef<DrawState>({ markers, theme });
  useLayoutEffect(() => {
    state.current = { markers, theme };
  });

  const key = JSON.stringify([points, markers]);
  const canDraw = width > 0 && points.length > 0;

  useEffect(() => {
    const host = hostRef.current;
    if (!canDraw || !host) return;
    const xs = [...points.map((p) => p.t), ...markers.map((m) => m.t)];
    const lo = Math.min(...xs);
    const hi = Math.max(...xs);
    const pad = Math.max((hi - lo) * 0.06, DAY_S / 2);
    const th = () => state.current.theme;
    const font = `11px ${theme.font}`;
    const opts: uPlot.Options = {
      width,
      height: HEIGHT,
      legend: { show: false },
      padding: [12, 12, 0, 0],
      cursor: { y: false, drag: { x: false, y: false, setScale: false }, points: { size: 8 } },
      select: { show: false, left: 0, top: 0, width: 0, height: 0 },
      scales: {
        x: { time: true, range: () => [lo - pad, hi + pad] },
        // Every trend figure but a dBm level is positive: keep the axis from dipping below zero.
        y: {
          range: (_u, min, max) => {
            const [a, b] = paddedRange(min, max, [], 0.15);
            return min >= 0 && a < 0 ? [0, b] : [a, b];
          },
        },
      },
      axes: [
        {
          font,
          size: 28,
          space: 70,
          stroke: () => th().axis,
          grid: { stroke: () => th().grid, width: 1 },
          ticks: { stroke: () => th().grid, width: 1, size: 3 },
          values: (_u, splits, _i, _space, incr) => timeLabels(splits, incr),
        },
        {
          font,
          size: 44,
          stroke: () => th().axis,
          grid: { stroke: () => th().grid, width: 1 },
          ticks: { stroke: () => th().grid, width: 1, size: 3 },
          values: (_u, splits) => splits.map((v) => formatValue(v)),
        },
      ],
      series: [{}, { stroke: () => th().series[0], width: 2, spanGaps: true, points: { show: true, size: 7, fill: () => th().series[0] } }],
      hooks: {
        setCursor: [
          (u) => {
            const el = readoutRef.current;
            const i = u.cursor.idx;
            if (!el) return;
            if (i == null || i < 0 || i >= points.length) {
              el.textContent = "";
              return;
            }
            const p = points[i];
            el.textContent = `${p.title} · ${dateText(p.t)} · ${formatValue(p.v)} ${unit}`;
          },
        ],
        draw: [(u) => drawMarkers(u, state.current)],
      },
    };
    const u = new uPlot(opts, [points.map((p) => p.t), points.map((p) => p.v)], host);
    plotRef.current = u;
    return () => {
      plotRef.current = null;
      u.destroy();
    };
    // Rebuilt when the data (key) or width changes; colours are read at draw time.
  }, [canDraw, key, width, unit, theme.font]);

  useEffect(() => {
    plotRef.current?.redraw(false, true);
  }, [theme]);

  return (
    <figure ref={wrapRef} className="sortie-chart min-w-0" data-testid={testId} data-points={points.length} data-markers={markers.length}>
      <figcaption className="mb-1 text-sm font-semibold">{label}</figcaption>
      {points.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule px-3 py-6 text-center text-sm text-ink-soft">No run of this build has this figure yet.</p>
      ) : (
        <>
          {width <= 0 && <div className="animate-pulse rounded-md bg-tide-50" style={{ height: HEIGHT }} aria-hidden="true" />}
          <div ref={hostRef} aria-hidden="true" />
          <p ref={readoutRef} className="figures min-h-5 text-xs text-ink" aria-live="off" />
          <table className="sr-only">
            <caption>{label} per run</caption>
            <thead>
              <tr>
                <th scope="col">Run</th>
                <th scope="col">Date</th>
                <th scope="col">Value ({unit})</th>
              </tr>
            </thead>
            <tbody>
              {points.map((p) => (
                <tr key={p.runId}>
                  <td>{p.title}</td>
                  <td>{dateText(p.t)}</td>
                  <td>{formatValue(p.v)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
      {note && <p className="text-xs text-ink-soft">{note}</p>}
    </figure>
  );
}

/** Dashed vertical lines where the build changed, with a small flag at the top. */
function drawMarkers(u: uPlot, s: DrawState) {
  const { ctx } = u;
  const { left, top, width, height } = u.bbox;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  ctx.strokeStyle = s.theme.threshold;
  ctx.fillStyle = s.theme.threshold;
  ctx.lineWidth = 1.5 * px;
  for (const m of s.markers) {
    const x = Math.round(u.valToPos(m.t, "x", true)) + 0.5;
    if (x < left || x > left + width) continue;
    ctx.setLineDash([4 * px, 3 * px]);
    ctx.beginPath();
    ctx.moveTo(x, top);
    ctx.lineTo(x, top + height);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.beginPath();
    ctx.moveTo(x - 4 * px, top);
    ctx.lineTo(x + 4 * px, top);
    ctx.lineTo(x, top + 6 * px);
    ctx.closePath();
    ctx.fill();
  }
  ctx.restore();
}
