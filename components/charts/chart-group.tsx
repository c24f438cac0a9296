"use client";

import "uplot/dist/uPlot.min.css";
import "./charts.css";
import uPlot from "uplot";
import { useEffect, useId, useLayoutEffect, useMemo, useRef, useState, type KeyboardEvent } from "react";
import type { SeriesField, SeriesResponse } from "@/lib/series/types";
import { seriesColor, type ChartTheme } from "./chart-theme";
import { bandPixels, markerAtTime, MIN_BAND_PX } from "./markers";
import { clampRange, effectiveRange, panRange, rangeForKey, rangesEqual, zoomRange, ZOOM_IN_FACTOR, type TimeRange } from "./pan-zoom";
import {
  absentMessage,
  countInRange,
  formatValue,
  isolatedIndices,
  paddedRange,
  presentFields,
  toAlignedData,
  unionFields,
  type AlignedSeries,
  type Converters,
} from "./series-to-uplot";
import { formatRunTime, formatTimeTick, TIME_INCRS, TIME_LABEL_SPACE_HOURS_PX, TIME_LABEL_SPACE_PX, timeTicks } from "./time-axis";
import { useChartTheme } from "./use-chart-theme";
import { useElementWidth } from "./use-element-width";
import { useSeries } from "./use-series";

export interface ChartSeriesSpec {
  field: SeriesField;
  label: string;
  color?: string;
}
export interface ChartPanel {
  id: string;
  title: string;
  unit: string;
  series: ChartSeriesSpec[];
  thresholds?: { value: number; label: string }[];
  height?: number;
}
export interface ChartMarker {
  id: number;
  startS: number;
  endS: number;
  tone: "act" | "watch" | "info";
}
export interface ChartGroupProps {
  runId: number;
  /** The run's data version; changes on every re-parse so no cached series outlives it. */
  version?: string;
  /** Where the data endpoints live; default `/api/runs/{runId}` (the shared page passes its share link's). */
  apiBase?: string;
  panels: ChartPanel[];
  /** The whole run is [0, durationS] seconds. */
  durationS: number;
  /** Controlled x range; null = whole run. */
  range: { from: number; to: number } | null;
  /** Drag-select zooms, double-click resets (null). */
  onRangeChange: (r: { from: number; to: number } | null) => void;
  /** Events drawn as shaded bands. */
  markers: ChartMarker[];
  /** Drawn stronger. */
  selectedMarkerId: number | null;
  /** Click (or tap) on a band. */
  onSelectMarker?: (id: number) => void;
  /** Time of the sample under the cursor, null when there is none (so the map can show a dot). */
  onCursor?: (tS: number | null) => void;
  /**
   * Unit conversion (e.g. imperial). Thresholds pass through it too when the panel's first series
   * has one. Pass stable functions (module-level or memoised): a new function re-converts the data.
   */
  convert?: Partial<Record<SeriesField, (v: number) => number>>;
}

/** Fixed y-axis width so stacked panels share one x position per time. */
const Y_AXIS_PX = 48;
const X_AXIS_PX = 28;
const DEFAULT_HEIGHT = 180;
const NARROW_HEIGHT = 150;
const NARROW_PX = 480;
const FIRST_CHART_MARK = "sortie:first-chart";

let firstChartMarked = false;
/** Once per page load, when a panel has drawn fetched data (a benchmark reads this mark). */
function markFirstChart() {
  if (firstChartMarked || typeof performance === "undefined") return;
  firstChartMarked = true;
  try {
    if (performance.getEntriesByName(FIRST_CHART_MARK, "mark").length === 0) performance.mark(FIRST_CHART_MARK);
  } catch {
    /* performance.mark unsupported: nothing to measure */
  }
}

/** What the panels read at event/draw time, so cursor moves never re-render React. */
interface GroupLive {
  durationS: number;
  /** The committed range (null = whole run) and what the x scale shows for it. */
  range: TimeRange | null;
  view: TimeRange;
  markers: ChartMarker[];
  selectedMarkerId: number | null;
  theme: ChartTheme;
  onRangeChange: ChartGroupProps["onRangeChange"];
  onSelectMarker?: (id: number) => void;
  onCursor?: (tS: number | null) => void;
  plots: Map<string, uPlot>;
  lastCursor: number | null;
  commit: (r: TimeRange | null) => void;
  cursor: (t: number | null) => void;
}

/** The x range the plots show: a run with no length still needs a non-empty scale. */
function viewFor(r: TimeRange | null, durationS: number): TimeRange {
  if (!(durationS > 0)) return { from: 0, to: 1 };
  return effectiveRange(r, durationS);
}

function applyX(u: uPlot, r: TimeRange) {
  const sx = u.scales.x;
  if (sx.min === r.from && sx.max === r.to) return;
  u.setScale("x", { min: r.from, max: r.to });
}

const hideSelect = { left: 0, top: 0, width: 0, height: 0 };

/** Keeps the same converter object while every field's function is the same one. */
function useStableConverters(convert: Converters | undefined): Converters | undefined {
  const ref = useRef(convert);
  const prev = ref.current;
  const same =
    prev === convert ||
    (prev != null &&
      convert != null &&
      Object.keys(prev).length === Object.keys(convert).length &&
      (Object.keys(convert) as SeriesField[]).every((k) => prev[k] === convert[k]));
  const stable = same ? prev : convert;
  useEffect(() => {
    ref.current = stable;
  }, [stable]);
  return stable;
}

/**
 * A stack of time charts of one run sharing one cursor and one x zoom. Drag across any chart to
 * zoom, double-click for the whole run; the focused group pans with ← / →, zooms with + / −, and
 * resets with 0 or Escape. Buttons do the same for touch screens.
 */
export function ChartGroup(props: ChartGroupProps) {
  const { runId, panels, durationS, range, markers, selectedMarkerId } = props;
  const syncKey = `sortie-charts-${useId()}`;
  const hintId = `${syncKey}-hint`;
  const theme = useChartTheme();
  const bodyRef = useRef<HTMLDivElement>(null);
  const width = useElementWidth(bodyRef);
  const [view, setView] = useState<TimeRange | null>(() => clampRange(range, durationS));

  // Follow the controlled prop (the user's own changes are applied at once and echoed back).
  const rangeFrom = range?.from;
  const rangeTo = range?.to;
  useEffect(() => {
    const next = clampRange(rangeFrom == null || rangeTo == null ? null : { from: rangeFrom, to: rangeTo }, durationS);
    setView((prev) => (rangesEqual(prev, next) ? prev : next));
  }, [rangeFrom, rangeTo, durationS]);

  const fieldsKey = unionFields(panels).join(",");
  const fields = useMemo(() => (fieldsKey ? (fieldsKey.split(",") as SeriesField[]) : []), [fieldsKey]);
  const series = useSeries(runId, fields, view, width, durationS, props.version, props.apiBase);
  const convert = useStableConverters(props.convert);

  const liveRef = useRef<GroupLive | null>(null);
  if (liveRef.current == null) {
    const live: GroupLive = {
      durationS,
      range: view,
      view: viewFor(view, durationS),
      markers,
      selectedMarkerId,
      theme,
      onRangeChange: props.onRangeChange,
      onSelectMarker: props.onSelectMarker,
      onCursor: props.onCursor,
      plots: new Map(),
      lastCursor: null,
      commit: (r) => {
        for (const u of live.plots.values()) u.setSelect(hideSelect, false);
        const next = clampRange(r, live.durationS);
        if (rangesEqual(next, live.range)) return;
        live.range = next;
        live.view = viewFor(next, live.durationS);
        for (const u of live.plots.values()) applyX(u, live.view);
        setView(next);
        live.onRangeChange(next);
      },
      cursor: (t) => {
        if (t === live.lastCursor) return;
        live.lastCursor = t;
        live.onCursor?.(t);
      },
    };
    liveRef.current = live;
  }
  const live = liveRef.current;

  // Layout effect: runs before the panels' passive effects create or redraw plots.
  useLayoutEffect(() => {
    live.durationS = durationS;
    live.markers = markers;
    live.selectedMarkerId = selectedMarkerId;
    live.theme = theme;
    live.onRangeChange = props.onRangeChange;
    live.onSelectMarker = props.onSelectMarker;
    live.onCursor = props.onCursor;
    live.range = view;
    live.view = viewFor(view, durationS);
  });

  useEffect(() => {
    for (const u of live.plots.values()) applyX(u, live.view);
  }, [live, view, durationS]);

  const markersKey = markers.map((m) => `${m.id}:${m.startS}:${m.endS}:${m.tone}`).join("|");
  useEffect(() => {
    for (const u of live.plots.values()) u.redraw(false);
  }, [live, markersKey, selectedMarkerId]);

  useEffect(() => {
    for (const u of live.plots.values()) u.redraw(true, true);
  }, [live, theme]);

  // Tell the map the cursor is gone when the charts go away.
  useEffect(() => () => live.cursor(null), [live]);

  const hours = durationS >= 3600;
  const shown = viewFor(view, durationS);
  const zoomed = view != null;

  const onKeyDown = (e: KeyboardEvent<HTMLDivElement>) => {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    const res = rangeForKey(e.key, live.range, durationS);
    if (!res.handled) return;
    // Let Escape reach outer handlers (dialogs) when there is nothing to reset.
    if ((e.key === "Escape" || e.key === "0") && live.range == null) return;
    e.preventDefault();
    live.commit(res.range);
  };

  return (
    <div
      className="sortie-chart rounded-lg outline-offset-4"
      role="group"
      aria-label="Run charts"
      aria-describedby={hintId}
      tabIndex={0}
      onKeyDown={onKeyDown}
    >
      <div className="mb-3 flex flex-wrap items-center gap-2">
        <p className="figures mr-auto text-sm text-ink-soft" aria-live="polite">
          {zoomed ? (
            <>
              Showing {formatRunTime(shown.from, { hours })}–{formatRunTime(shown.to, { hours })} of{" "}
              {formatRunTime(durationS, { hours })}
            </>
          ) : (
            <>Whole run · {formatRunTime(durationS, { hours })}</>
          )}
          {series.isRefining && zoomed ? <span className="ml-2 text-xs">(loading detail…)</span> : null}
        </p>
        <div className="flex flex-wrap gap-1">
          <button type="button" className="btn-quiet px-3" disabled={!zoomed} aria-label="Earlier" title="Earlier (←)" onClick={() => live.commit(panRange(live.range, -1, durationS))}>
            ←
          </button>
          <button type="button" className="btn-quiet px-3" disabled={!zoomed} aria-label="Later" title="Later (→)" onClick={() => live.commit(panRange(live.range, 1, durationS))}>
            →
          </button>
          <button type="button" className="btn-quiet px-3" aria-label="Zoom in" title="Zoom in (+)" onClick={() => live.commit(zoomRange(live.range, ZOOM_IN_FACTOR, durationS))}>
            +
          </button>
          <button type="button" className="btn-quiet px-3" disabled={!zoomed} aria-label="Zoom out" title="Zoom out (−)" onClick={() => live.commit(zoomRange(live.range, 1 / ZOOM_IN_FACTOR, durationS))}>
            −
          </button>
          <button type="button" className="btn-quiet px-3" disabled={!zoomed} onClick={() => live.commit(null)}>
            Whole run
          </button>
        </div>
      </div>
      <p id={hintId} className="mb-3 text-xs text-ink-soft">
        Drag across a chart to zoom in; double-click, 0 or Esc for the whole run; ← → to move, + − to zoom. Tap or point at a
        chart to read its values.
      </p>
      {series.error && !series.data ? (
        <p className="mb-3 rounded-md border border-act/40 bg-card px-3 py-2 text-sm text-act" role="alert">
          The chart data did not load: {series.error.message}
        </p>
      ) : null}
      <div ref={bodyRef} className="space-y-6">
        {panels.map((p) => (
          <TimePanelView
            key={p.id}
            panel={p}
            data={series.data}
            failed={!!series.error && !series.data}
            width={width}
            syncKey={syncKey}
            live={live}
            theme={theme}
            convert={convert}
            view={shown}
          />
        ))}
      </div>
    </div>
  );
}

interface TimePanelViewProps {
  panel: ChartPanel;
  data: SeriesResponse | undefined;
  failed: boolean;
  width: number;
  syncKey: string;
  live: GroupLive;
  theme: ChartTheme;
  convert: Converters | undefined;
  view: TimeRange;
}

function TimePanelView({ panel, data, failed, width, syncKey, live, theme, convert, view }: TimePanelViewProps) {
  const fieldsKey = panel.series.map((s) => s.field).join(",");
  const present = useMemo(
    () => (data ? presentFields(data, fieldsKey.split(",") as SeriesField[]) : []),
    [data, fieldsKey],
  );
  const presentKey = present.join(",");
  // Before the first response, every series is listed so the legend does not jump.
  const specs = data ? panel.series.filter((s) => present.includes(s.field)) : panel.series;
  const missing = data ? panel.series.filter((s) => !present.includes(s.field)) : [];
  const colors = specs.map((s) => seriesColor(theme, panel.series.indexOf(s), s.color));
  const height = panel.height ?? (width > 0 && width < NARROW_PX ? NARROW_HEIGHT : DEFAULT_HEIGHT);

  const aligned = useMemo<AlignedSeries | null>(
    () => (data && presentKey ? toAlignedData(data, presentKey.split(",") as SeriesField[], convert) : null),
    [data, presentKey, convert],
  );
  const firstConv = convert?.[panel.series[0]?.field];
  const thresholdsKey = (panel.thresholds ?? []).map((t) => `${t.value}:${t.label}`).join("|");
  const thresholds = useMemo(
    () =>
      (panel.thresholds ?? []).map((t) => ({ label: t.label, value: firstConv ? firstConv(t.value) : t.value })),
    // thresholdsKey stands for panel.thresholds' content (the array may be new on every render).
    [thresholdsKey, firstConv],
  );

  const wrapperRef = useRef<HTMLDivElement>(null);
  const hostRef = useRef<HTMLDivElement>(null);
  const timeRef = useRef<HTMLSpanElement>(null);
  const valueRefs = useRef<(HTMLSpanElement | null)[]>([]);
  const plotRef = useRef<uPlot | null>(null);
  // Read by uPlot's hooks, which are created once per plot.
  const state = useRef({ aligned, thresholds, colors, unit: panel.unit, width, height, isolated: [] as number[][] });
  useLayoutEffect(() => {
    Object.assign(state.current, { aligned, thresholds, colors, unit: panel.unit, width, height });
  });

  const canCreate = width > 0 && aligned != null;
  useEffect(() => {
    const host = hostRef.current;
    const s = state.current;
    if (!canCreate || !host || !s.aligned) return;

    const updateLegend = (u: uPlot) => {
      const idx = u.cursor.idx;
      const xs = u.data[0] as ArrayLike<number>;
      const t = idx != null && idx >= 0 && idx < xs.length ? xs[idx] : null;
      if (timeRef.current) timeRef.current.textContent = t != null ? formatRunTime(t, { decimals: 1, hours: live.durationS >= 3600 }) : "";
      valueRefs.current.forEach((el, i) => {
        if (!el) return;
        const col = u.data[i + 1] as ArrayLike<number | null | undefined> | undefined;
        const v = t != null && col ? col[idx!] : null;
        el.textContent = v != null ? `${formatValue(v)} ${state.current.unit}`.trim() : "";
      });
      live.cursor(t);
    };

    const fontPx = 11;
    const font = `${fontPx}px ${live.theme.font}`;
    const axisStroke = () => live.theme.axis;
    const gridStroke = () => live.theme.grid;

    const opts: uPlot.Options = {
      width: s.width,
      height: s.height,
      legend: { show: false },
      // Right padding leaves room for half of the last time label.
      padding: [8, 24, 0, 0],
      cursor: {
        y: false,
        sync: { key: syncKey, setSeries: false, scales: ["x", null] },
        drag: { x: true, y: false, setScale: false, dist: 8 },
        points: { size: 7 },
        // Double-click resets through onRangeChange, not uPlot's own auto-scale.
        bind: { dblclick: () => null },
      },
      select: { show: true, left: 0, top: 0, width: 0, height: 0 },
      scales: {
        x: {
          time: false,
          auto: false,
          range: (_u, min, max) => (min == null || max == null ? [live.view.from, live.view.to] : [min, max]),
        },
        y: {
          range: (_u, min, max) => paddedRange(min, max, state.current.thresholds.map((t) => t.value)),
        },
      },
      axes: [
        {
          scale: "x",
          size: X_AXIS_PX,
          font,
          stroke: axisStroke,
          grid: { stroke: gridStroke, width: 1 },
          ticks: { stroke: gridStroke, width: 1, size: 4 },
          space: () => (live.durationS >= 3600 ? TIME_LABEL_SPACE_HOURS_PX : TIME_LABEL_SPACE_PX),
          incrs: TIME_INCRS,
          splits: (_u, _ai, min, max, incr) => timeTicks(min, max, incr),
          values: (_u, splits, _ai, _space, incr) => splits.map((v) => formatTimeTick(v, incr, live.durationS >= 3600)),
        },
        {
          scale: "y",
          size: Y_AXIS_PX,
          font,
          stroke: axisStroke,
          grid: { stroke: gridStroke, width: 1 },
          ticks: { stroke: gridStroke, width: 1, size: 4 },
        },
      ],
      series: [
        {},
        ...s.colors.map(
          (_c, i): uPlot.Series => ({
            scale: "y",
            width: 1.5,
            spanGaps: false,
            stroke: () => state.current.colors[i] ?? live.theme.text,
            points: {
              // Lines skip lone samples between gaps, so those get a dot.
              show: false,
              size: 5,
              width: 0,
              fill: () => state.current.colors[i] ?? live.theme.text,
              filter: (_u, si) => {
                const idxs = state.current.isolated[si];
                return idxs && idxs.length > 0 ? idxs : null;
              },
            },
          }),
        ),
      ],
      hooks: {
        setData: [
          (u) => {
            state.current.isolated = u.data.map((col, i) => (i === 0 ? [] : isolatedIndices(col as ArrayLike<number | null>)));
          },
        ],
        setScale: [
          (u, key) => {
            if (key !== "x" || !wrapperRef.current) return;
            wrapperRef.current.dataset.xMin = String(u.scales.x.min);
            wrapperRef.current.dataset.xMax = String(u.scales.x.max);
          },
        ],
        setSelect: [
          (u) => {
            if (!(u.select.width > 0)) return;
            const from = u.posToVal(u.select.left, "x");
            const to = u.posToVal(u.select.left + u.select.width, "x");
            live.commit({ from, to });
          },
        ],
        setCursor: [updateLegend],
        drawClear: [(u) => drawBands(u, live)],
        draw: [
          (u) => {
            drawSelectedBand(u, live);
            drawThresholds(u, state.current.thresholds, live.theme);
            const xs = u.data[0] as ArrayLike<number>;
            const n = countInRange(xs, u.scales.x.min ?? 0, u.scales.x.max ?? 0);
            if (wrapperRef.current) wrapperRef.current.dataset.points = String(n);
            if (n > 0) markFirstChart();
          },
        ],
      },
    };

    const u = new uPlot(opts, s.aligned as uPlot.AlignedData, host);
    plotRef.current = u;
    live.plots.set(panel.id, u);
    applyX(u, live.view);
    if (wrapperRef.current) {
      wrapperRef.current.dataset.xMin = String(u.scales.x.min);
      wrapperRef.current.dataset.xMax = String(u.scales.x.max);
    }

    // Click/tap on a band selects its event; a drag is not a click.
    let downX = Number.NaN;
    const onDown = (e: MouseEvent) => {
      downX = e.clientX;
    };
    const onClick = (e: MouseEvent) => {
      if (!Number.isFinite(downX) || Math.abs(e.clientX - downX) > 4) return;
      if (!live.onSelectMarker || live.markers.length === 0) return;
      const rect = u.over.getBoundingClientRect();
      const t = u.posToVal(e.clientX - rect.left, "x");
      const sPerPx = ((u.scales.x.max ?? 0) - (u.scales.x.min ?? 0)) / Math.max(1, rect.width);
      const m = markerAtTime(live.markers, t, sPerPx * (MIN_BAND_PX / 2 + 2), live.selectedMarkerId);
      if (m) live.onSelectMarker(m.id);
    };
    const onDblClick = (e: MouseEvent) => {
      e.preventDefault();
      live.commit(null);
    };
    u.over.addEventListener("mousedown", onDown);
    u.over.addEventListener("click", onClick);
    u.over.addEventListener("dblclick", onDblClick);

    return () => {
      u.over.removeEventListener("mousedown", onDown);
      u.over.removeEventListener("click", onClick);
      u.over.removeEventListener("dblclick", onDblClick);
      if (live.plots.get(panel.id) === u) live.plots.delete(panel.id);
      plotRef.current = null;
      u.destroy();
    };
    // The plot is rebuilt only when its series set, sync group or font changes; data, size,
    // colours and range are pushed into it by the effects below.
  }, [canCreate, presentKey, syncKey, live, panel.id, theme.font]);

  useEffect(() => {
    const u = plotRef.current;
    if (!u || !aligned || u.data === (aligned as uPlot.AlignedData)) return;
    u.setData(aligned as uPlot.AlignedData);
    applyX(u, live.view);
  }, [aligned, live]);

  useEffect(() => {
    const u = plotRef.current;
    if (u && width > 0 && (u.width !== width || u.height !== height)) u.setSize({ width, height });
  }, [width, height]);

  const colorsKey = colors.join(",");
  useEffect(() => {
    plotRef.current?.redraw(true, true);
  }, [thresholds, colorsKey]);

  const allAbsent = data != null && present.length === 0;

  if (allAbsent) {
    return (
      <section
        ref={wrapperRef}
        data-testid={`chart-${panel.id}`}
        data-x-min={view.from}
        data-x-max={view.to}
        data-points={0}
        data-absent="true"
      >
        <PanelHeading panel={panel} />
        <p className="rounded-md border border-dashed border-rule px-3 py-2 text-sm text-ink-soft">
          {absentMessage(panel.series.map((s) => s.label))}
        </p>
      </section>
    );
  }

  return (
    <section ref={wrapperRef} data-testid={`chart-${panel.id}`} data-points={0}>
      <PanelHeading panel={panel} />
      {!aligned || width <= 0 ? (
        <div
          className={`rounded-md bg-tide-50 ${failed ? "" : "animate-pulse"}`}
          style={{ height }}
          aria-hidden="true"
        />
      ) : null}
      <div ref={hostRef} aria-hidden="true" />
      <dl className="figures mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-label={`${panel.title} at the cursor`}>
        <div className="flex items-baseline gap-1.5">
          <dt className="text-ink-soft">Time</dt>
          <dd>
            <span ref={timeRef} className="sortie-chart-value" />
          </dd>
        </div>
        {specs.map((s, i) => (
          <div key={s.field} className="flex items-baseline gap-1.5">
            <dt className="flex items-center gap-1.5 text-ink-soft">
              <span className="inline-block h-0.5 w-4 rounded" style={{ backgroundColor: colors[i] }} aria-hidden="true" />
              {s.label}
            </dt>
            <dd>
              <span
                ref={(el) => {
                  valueRefs.current[i] = el;
                }}
                className="sortie-chart-value text-ink"
              />
            </dd>
          </div>
        ))}
        {missing.length > 0 ? <div className="text-ink-soft">{absentMessage(missing.map((s) => s.label))}</div> : null}
      </dl>
    </section>
  );
}

function PanelHeading({ panel }: { panel: ChartPanel }) {
  return (
    <h3 className="mb-1 text-sm font-semibold text-ink">
      {panel.title}
      {panel.unit ? <span className="ml-1 font-normal text-ink-soft">({panel.unit})</span> : null}
    </h3>
  );
}

/** Event bands, under the grid and lines (drawClear runs right after the canvas is cleared). */
function drawBands(u: uPlot, live: GroupLive) {
  if (live.markers.length === 0) return;
  const { ctx } = u;
  const { left, top, width, height } = u.bbox;
  const px = uPlot.pxRatio;
  ctx.save();
  for (const m of live.markers) {
    const b = bandPixels(u.valToPos(m.startS, "x", true), u.valToPos(m.endS, "x", true), left, width, MIN_BAND_PX * px);
    if (!b) continue;
    ctx.globalAlpha = m.id === live.selectedMarkerId ? 0.3 : 0.13;
    ctx.fillStyle = live.theme.band[m.tone];
    ctx.fillRect(b.x, top, b.w, height);
  }
  ctx.restore();
}

/** The selected band also gets solid edges, over the lines, so it reads without colour alone. */
function drawSelectedBand(u: uPlot, live: GroupLive) {
  const m = live.markers.find((x) => x.id === live.selectedMarkerId);
  if (!m) return;
  const { ctx } = u;
  const { left, top, width, height } = u.bbox;
  const px = uPlot.pxRatio;
  const b = bandPixels(u.valToPos(m.startS, "x", true), u.valToPos(m.endS, "x", true), left, width, MIN_BAND_PX * px);
  if (!b) return;
  ctx.save();
  ctx.strokeStyle = live.theme.band[m.tone];
  ctx.lineWidth = 2 * px;
  ctx.beginPath();
  ctx.moveTo(b.x, top);
  ctx.lineTo(b.x, top + height);
  ctx.moveTo(b.x + b.w, top);
  ctx.lineTo(b.x + b.w, top + height);
  ctx.stroke();
  ctx.restore();
}

/** Dashed horizontal threshold lines with their labels at the right end. */
function drawThresholds(u: uPlot, thresholds: readonly { value: number; label: string }[], theme: ChartTheme) {
  if (thresholds.length === 0) return;
  const { ctx } = u;
  const { left, top, width, height } = u.bbox;
  const px = uPlot.pxRatio;
  ctx.save();
  ctx.beginPath();
  ctx.rect(left, top, width, height);
  ctx.clip();
  for (const t of thresholds) {
    const y = Math.round(u.valToPos(t.value, "y", true)) + 0.5;
    if (!(y >= top && y <= top + height)) continue;
    ctx.strokeStyle = theme.threshold;
    ctx.lineWidth = 1.5 * px;
    ctx.setLineDash([6 * px, 4 * px]);
    ctx.beginPath();
    ctx.moveTo(left, y);
    ctx.lineTo(left + width, y);
    ctx.stroke();
    ctx.setLineDash([]);
    ctx.font = `600 ${11 * px}px ${theme.font}`;
    ctx.textAlign = "right";
    // Label above the line, or below it when the line hugs the top edge.
    const above = y - top > 16 * px;
    ctx.textBaseline = above ? "bottom" : "top";
    const ty = above ? y - 3 * px : y + 3 * px;
    const tx = left + width - 4 * px;
    ctx.lineWidth = 3 * px;
    ctx.strokeStyle = "rgba(255,255,255,0.85)";
    ctx.strokeText(t.label, tx, ty);
    ctx.fillStyle = theme.threshold;
    ctx.fillText(t.label, tx, ty);
  }
  ctx.restore();
}
