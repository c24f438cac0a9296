"use client";

/**
 * The debrief's map: the flown track coloured by link, the route plan, home, event pins and the
 * charts' cursor. Leaflet touches `window` when it loads, so it is imported inside an effect and
 * never on the server; everything on the map is drawn imperatively into one map per mount.
 */
import "leaflet/dist/leaflet.css";
import type * as Leaflet from "leaflet";
import { useEffect, useRef, useState, type ReactNode } from "react";
import useSWR from "swr";
import { trackUrl } from "@/components/charts/series-request";
import type { TrackResponse } from "@/lib/series/types";
import { formatDegrees, graticuleStep, graticuleValues } from "./graticule";
import { binColour, linkBin, linkScale, type LinkScale } from "./link-colour";
import { homeTitle, missionStartTitle, type MapHome, type MapMissionStart } from "./map-words";
import { indexRange, nearestIndex } from "./nearest-time";
import { groupByBin, trackPieces } from "./track-pieces";

export type { MapHome, MapMissionStart } from "./map-words";

export interface MapWaypoint {
  name: string;
  lat: number;
  lon: number;
  radiusM: number;
}

export interface MapEvent {
  id: number;
  kind: string;
  label: string;
  tone: "act" | "watch" | "info";
  lat: number | null;
  lon: number | null;
  startS: number;
}

export interface TrackMapProps {
  runId: number;
  /** The run's data version; changes on every re-parse so no cached track outlives it. */
  version?: string;
  /** Where the data endpoints live; default `/api/runs/{runId}` (the shared page passes its share link's). */
  apiBase?: string;
  /** The route plan: dashed line through the waypoints, numbered marks, acceptance circles. */
  plan: { name: string; waypoints: MapWaypoint[] } | null;
  home: MapHome | null;
  /** A flag where route following began; the first leg runs from here to waypoint 1. */
  missionStart?: MapMissionStart | null;
  /** Pinned where they have a position. */
  events: MapEvent[];
  /** Highlighted, and panned into view. */
  selectedEventId: number | null;
  /** Pin click or tap, or Enter/Space on a focused pin. */
  onSelectEvent: (id: number) => void;
  /** Fit the view to the track inside this time range (s from run start); null = whole track. */
  focus: { from: number; to: number } | null;
  /** A dot on the track point nearest this time (the charts' cursor). */
  cursorS: number | null;
  /** Tile URL template from a setting; null = no tiles (plain background and lat/lon grid, works offline). */
  tileUrl: string | null;
  tileAttribution?: string | null;
  /** For the scale bar and acceptance radii. */
  distanceUnit?: "metric" | "imperial";
  /** The judged link metric's name when it is not a column of the log (e.g. "RSSI (channel 14)"). */
  linkLabel?: string;
  /** Extra classes for the wrapper (layout only). */
  className?: string;
}

type LeafletModule = typeof Leaflet;
type Ctx = { L: LeafletModule; map: Leaflet.Map };
type Tone = MapEvent["tone"];

// Theme colours (app/globals.css); Leaflet draws with inline SVG attributes, so they are spelled out here.
const C = {
  ink: "#14212b",
  inkSoft: "#46555f",
  rule: "#d9d4c7",
  paper: "#f5f3ec",
  card: "#fffdf8",
  route: "#9a5200", // signal-700
  cursor: "#d97a07", // signal-500
  act: "#b42318",
  watch: "#a86a00",
  info: "#0d5c63", // tide-700
};

const toneColour: Record<Tone, string> = { act: C.act, watch: C.watch, info: C.info };
const PIN_TIP: Leaflet.TooltipOptions = { direction: "top", offset: [0, -16] };
const toneWord: Record<Tone, string> = { act: "Act", watch: "Watch", info: "Info" };

// Shape as well as colour, so the pins read without colour vision: diamond, triangle, circle.
function toneShape(tone: Tone): string {
  const style = `fill="${toneColour[tone]}" stroke="#ffffff" stroke-width="2" stroke-linejoin="round"`;
  if (tone === "act") return `<path d="M16 4.5 27.5 16 16 27.5 4.5 16Z" ${style}/>`;
  if (tone === "watch") return `<path d="M16 5 28 26H4Z" ${style}/>`;
  return `<circle cx="16" cy="16" r="9" ${style}/>`;
}

/** 32 px pin: comfortably above the 28 px touch minimum; the ring shows selection. */
function pinHtml(tone: Tone): string {
  return (
    `<svg width="32" height="32" viewBox="0 0 32 32" aria-hidden="true" focusable="false" style="display:block;overflow:visible">` +
    `<circle data-ring cx="16" cy="16" r="15" fill="${C.card}" fill-opacity="0.85" stroke="${C.ink}" stroke-width="2.5" opacity="0"/>` +
    toneShape(tone) +
    `</svg>`
  );
}

const HOME_SVG =
  `<svg width="28" height="28" viewBox="0 0 28 28" aria-hidden="true" focusable="false" style="display:block">` +
  `<path d="M14 3.5 25 13.5h-3V24H6V13.5H3Z" fill="${C.ink}" stroke="#ffffff" stroke-width="2" stroke-linejoin="round"/>` +
  `<rect x="12" y="17" width="4" height="7" fill="#ffffff"/></svg>`;

// A flag on a pole: the mission's first leg starts here.
const START_SVG =
  `<svg width="26" height="28" viewBox="0 0 26 28" aria-hidden="true" focusable="false" style="display:block">` +
  `<path d="M6 26V3" stroke="#ffffff" stroke-width="5" stroke-linecap="round"/>` +
  `<path d="M6 26V3" stroke="${C.route}" stroke-width="2.5" stroke-linecap="round"/>` +
  `<path d="M7 3.5h14l-3.5 4.5L21 12.5H7Z" fill="${C.route}" stroke="#ffffff" stroke-width="1.5" stroke-linejoin="round"/></svg>`;

function waypointHtml(n: number): string {
  return (
    `<span style="display:flex;align-items:center;justify-content:center;box-sizing:border-box;width:22px;height:22px;margin:3px;` +
    `border-radius:9999px;background:${C.card};border:2px solid ${C.route};color:${C.route};` +
    `font:600 11px/1 var(--font-mono),ui-monospace,monospace">${n}</span>`
  );
}

/** Run time as m:ss (h:mm:ss past an hour). */
function runTime(s: number): string {
  const total = Math.max(0, Math.floor(s));
  const h = Math.floor(total / 3600);
  const m = Math.floor((total % 3600) / 60);
  const sec = String(total % 60).padStart(2, "0");
  return h > 0 ? `${h}:${String(m).padStart(2, "0")}:${sec}` : `${m}:${sec}`;
}

function signed(v: number): string {
  return v < 0 ? `\u2212${Math.abs(v)}` : String(v);
}

const validPos = (lat: number, lon: number) =>
  Number.isFinite(lat) && Number.isFinite(lon) && Math.abs(lat) <= 90 && Math.abs(lon) <= 180;

/** Tooltip body as DOM nodes: labels come from logs and must never be parsed as HTML. */
function tooltipBody(title: string, detail: string): HTMLElement {
  const box = document.createElement("div");
  const strong = document.createElement("strong");
  strong.textContent = title;
  const small = document.createElement("div");
  small.textContent = detail;
  small.style.color = C.inkSoft;
  box.append(strong, small);
  return box;
}

async function fetchTrack(url: string): Promise<TrackResponse> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  if (!res.ok) throw new Error(`track request failed (${res.status})`);
  return (await res.json()) as TrackResponse;
}

function extendWithTrack(bounds: Leaflet.LatLngBounds, data: TrackResponse, from = 0, to = data.lat.length - 1) {
  for (let i = from; i <= to; i++) if (validPos(data.lat[i], data.lon[i])) bounds.extend([data.lat[i], data.lon[i]]);
}

export function TrackMap({
  runId,
  version,
  apiBase,
  plan,
  home,
  missionStart = null,
  events,
  selectedEventId,
  onSelectEvent,
  focus,
  cursorS,
  tileUrl,
  tileAttribution = null,
  distanceUnit = "metric",
  linkLabel,
  className = "",
}: TrackMapProps) {
  const containerRef = useRef<HTMLDivElement>(null);
  const [ctx, setCtx] = useState<Ctx | null>(null);
  const [trackInfo, setTrackInfo] = useState<{ points: number; noValue: boolean }>({ points: 0, noValue: false });

  const { data, error, isLoading, mutate } = useSWR<TrackResponse>(trackUrl(runId, version, apiBase), fetchTrack, {
    revalidateOnFocus: false,
  });
  const track = data && data.runId === runId ? data : undefined;
  const base: LinkScale | null = track?.metric ? linkScale(track.metric.field) : null;
  // RSSI read from a link-sheet channel: the legend names the channel, as the chart does.
  const scale: LinkScale | null = base && linkLabel && track?.metric?.field === "rssiPct" ? { ...base, label: linkLabel } : base;

  // Props that arrive as fresh objects each render are compared by content, so a parent's
  // re-render does not rebuild the pins (and take keyboard focus away from them).
  const planKey = plan ? JSON.stringify(plan) : "";
  const homeKey = home ? `${home.lat},${home.lon},${home.source ?? ""}` : "";
  const startKey = missionStart ? `${missionStart.lat},${missionStart.lon},${missionStart.source},${missionStart.startS}` : "";
  const eventsKey = events.map((e) => [e.id, e.lat, e.lon, e.tone, e.kind, e.label, e.startS].join("|")).join(";");
  const focusKey = focus ? `${focus.from}:${focus.to}` : "";
  const latest = useRef({ plan, home, missionStart, events, focus, onSelectEvent, distanceUnit });
  latest.current = { plan, home, missionStart, events, focus, onSelectEvent, distanceUnit };

  const markersRef = useRef(new Map<number, Leaflet.Marker>());
  const tipsRef = useRef(new Map<number, () => HTMLElement>());
  const cursorRef = useRef<Leaflet.CircleMarker | null>(null);
  const fittedRunRef = useRef<number | null>(null);
  const appliedFocusRef = useRef<{ runId: number; key: string }>({ runId, key: "" });

  // The map itself: created once Leaflet has loaded, destroyed on unmount.
  useEffect(() => {
    let cancelled = false;
    let map: Leaflet.Map | null = null;
    let observer: ResizeObserver | null = null;
    import("leaflet").then((mod) => {
      const el = containerRef.current;
      if (cancelled || !el) return;
      const L = ((mod as unknown as { default?: LeafletModule }).default ?? mod) as LeafletModule;
      map = L.map(el, { maxZoom: 22, minZoom: 2, zoomSnap: 0.5, worldCopyJump: false });
      map.setView([20, 0], 2);
      const pane = (name: string, z: number, events = false) => {
        const p = map!.createPane(name);
        p.style.zIndex = String(z);
        if (!events) p.style.pointerEvents = "none";
      };
      pane("sortie-grid", 250); // above tiles, below everything drawn
      pane("sortie-plan-area", 390); // acceptance circles under the track
      pane("sortie-route", 450); // the dashed plan on top of the track, so both stay visible
      pane("sortie-cursor", 460);
      observer = new ResizeObserver(() => map?.invalidateSize());
      observer.observe(el);
      setCtx({ L, map });
    });
    return () => {
      cancelled = true;
      observer?.disconnect();
      markersRef.current.clear();
      cursorRef.current = null;
      map?.remove();
      setCtx(null);
    };
  }, []);

  // Background: tiles from the setting, or a lat/lon grid that needs no network.
  useEffect(() => {
    if (!ctx) return;
    const { L, map } = ctx;
    if (tileUrl) {
      const tiles = L.tileLayer(tileUrl, { attribution: tileAttribution ?? undefined, maxNativeZoom: 19, maxZoom: 22 });
      tiles.addTo(map);
      return () => {
        tiles.remove();
      };
    }
    const grid = L.layerGroup().addTo(map);
    const draw = () => {
      grid.clearLayers();
      const size = map.getSize();
      if (size.x <= 0 || size.y <= 0) return;
      const b = map.getBounds();
      const west = b.getWest();
      const east = b.getEast();
      const south = Math.max(-85, b.getSouth());
      const north = Math.min(85, b.getNorth());
      // One spacing for both axes, set by longitude (fewer pixels per degree in Web Mercator), so
      // latitude lines are never closer than longitude lines.
      const step = graticuleStep(east - west, size.x);
      const padLon = east - west;
      const padLat = north - south;
      const lons = graticuleValues(west - padLon, east + padLon, step);
      const lats = graticuleValues(Math.max(-85, south - padLat), Math.min(85, north + padLat), step);
      if (lons.length === 0 || lats.length === 0) return;
      const s = lats[0];
      const n = lats[lats.length - 1];
      const w = lons[0];
      const e = lons[lons.length - 1];
      const lines: Leaflet.LatLngExpression[][] = [
        ...lons.map((lon): Leaflet.LatLngExpression[] => [[s, lon], [n, lon]]),
        ...lats.map((lat): Leaflet.LatLngExpression[] => [[lat, w], [lat, e]]),
      ];
      grid.addLayer(L.polyline(lines, { pane: "sortie-grid", color: C.rule, weight: 1, opacity: 1, interactive: false }));
      const label = (text: string, at: Leaflet.LatLngExpression, anchor: [number, number], align: "center" | "right") =>
        L.marker(at, {
          pane: "sortie-grid",
          interactive: false,
          keyboard: false,
          icon: L.divIcon({
            className: "sortie-grid-label",
            iconSize: [96, 16],
            iconAnchor: anchor,
            html:
              `<span style="display:block;text-align:${align};font:11px/16px var(--font-mono),ui-monospace,monospace;color:${C.inkSoft};white-space:nowrap">` +
              `<span style="background:${C.paper};padding:0 3px">${text}</span></span>`,
          }),
        });
      // Longitudes along the top edge, latitudes along the right edge (clear of the zoom buttons).
      for (const lon of lons) if (lon >= west && lon <= east) grid.addLayer(label(formatDegrees(lon, step, "lon"), [north, lon], [48, -4], "center"));
      for (const lat of lats) if (lat >= south && lat <= north) grid.addLayer(label(formatDegrees(lat, step, "lat"), [lat, east], [100, 8], "right"));
    };
    draw();
    map.on("moveend resize", draw);
    return () => {
      map.off("moveend resize", draw);
      grid.remove();
    };
  }, [ctx, tileUrl, tileAttribution]);

  useEffect(() => {
    if (!ctx) return;
    const imperial = distanceUnit === "imperial";
    const scaleBar = ctx.L.control.scale({ metric: !imperial, imperial, position: "bottomleft", maxWidth: 140 });
    scaleBar.addTo(ctx.map);
    return () => {
      scaleBar.remove();
    };
  }, [ctx, distanceUnit]);

  // The flown track: one layer per colour bin plus a dark casing that keeps the light end of the
  // scale visible on the paper background and on light tiles.
  useEffect(() => {
    if (!ctx || !track) {
      setTrackInfo({ points: 0, noValue: false });
      return;
    }
    const { L, map } = ctx;
    const sc = track.metric ? linkScale(track.metric.field) : null;
    const { pieces, pointCount } = trackPieces(track, sc ? (v) => linkBin(v, sc) : () => null);
    const at = (i: number): Leaflet.LatLngTuple => [track.lat[i], track.lon[i]];
    const line = (p: { start: number; end: number }) => {
      const pts: Leaflet.LatLngTuple[] = [];
      for (let i = p.start; i <= p.end; i++) pts.push(at(i));
      return pts;
    };
    const group = L.layerGroup();
    const round = { lineCap: "round", lineJoin: "round", interactive: false } as const;
    if (sc) {
      const cased = pieces.filter((p) => p.bin != null && p.end > p.start).map(line);
      if (cased.length) group.addLayer(L.polyline(cased, { ...round, color: C.ink, weight: 7, opacity: 0.85 }));
    }
    // Strong bins first so the weak ones sit on top where pieces meet.
    const groups = [...groupByBin(pieces)].sort(([a], [b]) => (a === "none" ? 1 : b === "none" ? -1 : b - a));
    let noValue = false;
    for (const [key, list] of groups) {
      const colour = key === "none" || !sc ? C.inkSoft : binColour(key, sc);
      const dotted = key === "none" && !!sc; // samples without a link value inside a coloured track
      if (dotted) noValue = true;
      const lines = list.filter((p) => p.end > p.start).map(line);
      if (lines.length) {
        group.addLayer(
          L.polyline(lines, dotted ? { ...round, color: C.inkSoft, weight: 3.5, dashArray: "1 7" } : { ...round, color: colour, weight: 4, opacity: 1 }),
        );
      }
      for (const p of list) {
        if (p.end !== p.start) continue;
        group.addLayer(L.circleMarker(at(p.start), { radius: 4, color: C.ink, weight: 1.5, fillColor: colour, fillOpacity: 1, interactive: false }));
      }
    }
    group.addTo(map);
    setTrackInfo({ points: pointCount, noValue });
    return () => {
      group.remove();
    };
  }, [ctx, track]);

  // Route plan: acceptance circles (true metres), dashed line, numbered waypoint marks.
  useEffect(() => {
    const plan = latest.current.plan;
    if (!ctx || !plan || plan.waypoints.length === 0) return;
    const { L, map } = ctx;
    const imperial = latest.current.distanceUnit === "imperial";
    const group = L.layerGroup();
    const wps = plan.waypoints.filter((w) => validPos(w.lat, w.lon));
    for (const w of wps) {
      if (w.radiusM > 0) {
        group.addLayer(
          L.circle([w.lat, w.lon], { pane: "sortie-plan-area", radius: w.radiusM, color: C.route, weight: 1.5, fillColor: C.route, fillOpacity: 0.1, interactive: false }),
        );
      }
    }
    if (wps.length > 1) {
      group.addLayer(L.polyline(wps.map((w) => [w.lat, w.lon] as Leaflet.LatLngTuple), { pane: "sortie-route", color: C.route, weight: 2.5, dashArray: "8 6", interactive: false }));
    }
    wps.forEach((w, i) => {
      const radius = imperial ? `${Math.round(w.radiusM * 3.28084)} ft` : `${Math.round(w.radiusM * 10) / 10} m`;
      const mark = L.marker([w.lat, w.lon], {
        icon: L.divIcon({ className: "sortie-waypoint", html: waypointHtml(i + 1), iconSize: [28, 28], iconAnchor: [14, 14] }),
        keyboard: false,
        zIndexOffset: -1000,
      });
      mark.bindTooltip(tooltipBody(`${i + 1}. ${w.name || "Waypoint"}`, `Acceptance radius ${radius}`), { direction: "top", offset: [0, -12] });
      group.addLayer(mark);
    });
    group.addTo(map);
    return () => {
      group.remove();
    };
  }, [ctx, planKey, distanceUnit]);

  useEffect(() => {
    const home = latest.current.home;
    if (!ctx || !home || !validPos(home.lat, home.lon)) return;
    const { L, map } = ctx;
    const mark = L.marker([home.lat, home.lon], {
      icon: L.divIcon({ className: "sortie-home", html: HOME_SVG, iconSize: [28, 28], iconAnchor: [14, 22] }),
      keyboard: false,
      interactive: false,
      zIndexOffset: -500,
      title: homeTitle(home),
    }).addTo(map);
    return () => {
      mark.remove();
    };
  }, [ctx, homeKey]);

  useEffect(() => {
    const start = latest.current.missionStart;
    if (!ctx || !start || !validPos(start.lat, start.lon)) return;
    const { L, map } = ctx;
    const mark = L.marker([start.lat, start.lon], {
      // The pole's foot on the spot.
      icon: L.divIcon({ className: "sortie-mission-start", html: START_SVG, iconSize: [26, 28], iconAnchor: [6, 26] }),
      keyboard: false,
      interactive: false,
      zIndexOffset: -400,
      title: missionStartTitle(start),
    }).addTo(map);
    return () => {
      mark.remove();
    };
  }, [ctx, startKey]);

  // Event pins: focusable buttons; click, tap, Enter or Space selects.
  useEffect(() => {
    if (!ctx) return;
    const { L, map } = ctx;
    const markers = markersRef.current;
    for (const ev of latest.current.events) {
      if (ev.lat == null || ev.lon == null || !validPos(ev.lat, ev.lon)) continue;
      const id = ev.id;
      const mark = L.marker([ev.lat, ev.lon], {
        icon: L.divIcon({ className: "sortie-pin", html: pinHtml(ev.tone), iconSize: [32, 32], iconAnchor: [16, 16] }),
        keyboard: true,
        riseOnHover: true,
      });
      const tip = () => tooltipBody(ev.label, `${toneWord[ev.tone]} · at ${runTime(ev.startS)}`);
      tipsRef.current.set(id, tip);
      mark.bindTooltip(tip(), PIN_TIP);
      mark.on("click", () => latest.current.onSelectEvent(id));
      mark.addTo(map);
      const el = mark.getElement();
      if (el) {
        el.setAttribute("data-event-id", String(id));
        el.setAttribute("aria-label", `${toneWord[ev.tone]}: ${ev.label}, at ${runTime(ev.startS)}`);
        el.setAttribute("aria-pressed", "false");
        L.DomEvent.on(el, "keydown", (e) => {
          const key = (e as KeyboardEvent).key;
          if (key !== "Enter" && key !== " ") return;
          L.DomEvent.preventDefault(e);
          latest.current.onSelectEvent(id);
        });
      }
      markers.set(id, mark);
    }
    return () => {
      for (const m of markers.values()) m.remove();
      markers.clear();
      tipsRef.current.clear();
    };
  }, [ctx, eventsKey]);

  // Selection: ring, aria-pressed, on top, its label kept open (a permanent tooltip, so it does not
  // depend on hover and stays after a tap), and into view if it is near or past the edge.
  useEffect(() => {
    if (!ctx) return;
    for (const [id, m] of markersRef.current) {
      const on = id === selectedEventId;
      const el = m.getElement();
      el?.setAttribute("aria-pressed", String(on));
      el?.querySelector("[data-ring]")?.setAttribute("opacity", on ? "1" : "0");
      m.setZIndexOffset(on ? 1000 : 0);
      const tip = tipsRef.current.get(id);
      if (tip && !!m.getTooltip()?.options.permanent !== on) {
        m.unbindTooltip();
        m.bindTooltip(tip(), { ...PIN_TIP, permanent: on });
      }
    }
    const m = selectedEventId == null ? undefined : markersRef.current.get(selectedEventId);
    if (!m) return;
    const inner = ctx.map.getBounds().pad(-0.15);
    if (!inner.contains(m.getLatLng())) ctx.map.panTo(m.getLatLng());
  }, [ctx, selectedEventId, eventsKey]);

  // First view of a run: the whole track with the plan and home. Until the track arrives, the plan
  // and home alone, so the map is not left on the world view while loading.
  useEffect(() => {
    if (!ctx || fittedRunRef.current === runId) return;
    const { L, map } = ctx;
    const settled = track !== undefined || error !== undefined;
    const bounds = L.latLngBounds([]);
    if (track) extendWithTrack(bounds, track);
    const { plan, home } = latest.current;
    for (const w of plan?.waypoints ?? []) if (validPos(w.lat, w.lon)) bounds.extend([w.lat, w.lon]);
    if (home && validPos(home.lat, home.lon)) bounds.extend([home.lat, home.lon]);
    if (bounds.isValid()) map.fitBounds(bounds, { padding: [28, 28], maxZoom: 19, animate: false });
    if (settled) fittedRunRef.current = runId;
  }, [ctx, runId, track, error, planKey, homeKey]);

  // Focus on a time range (after the first fit, so a focus set at load wins).
  useEffect(() => {
    if (!ctx || !track) return;
    const applied = appliedFocusRef.current;
    if (applied.runId === runId && applied.key === focusKey) return;
    appliedFocusRef.current = { runId, key: focusKey };
    const { L, map } = ctx;
    const focus = latest.current.focus;
    const bounds = L.latLngBounds([]);
    if (!focus) {
      extendWithTrack(bounds, track);
      for (const w of latest.current.plan?.waypoints ?? []) if (validPos(w.lat, w.lon)) bounds.extend([w.lat, w.lon]);
      if (bounds.isValid()) map.fitBounds(bounds, { padding: [28, 28], maxZoom: 19 });
      return;
    }
    const range = indexRange(track.t, focus.from, focus.to);
    if (range) extendWithTrack(bounds, track, range[0], range[1]);
    if (bounds.isValid()) {
      map.fitBounds(bounds, { padding: [48, 48], maxZoom: 19 });
      return;
    }
    // Nothing inside the range (a reception gap): centre on the nearest point instead.
    const i = nearestIndex(track.t, (focus.from + focus.to) / 2);
    if (i >= 0 && validPos(track.lat[i], track.lon[i])) map.panTo([track.lat[i], track.lon[i]]);
  }, [ctx, track, runId, focusKey]);

  // The charts' cursor: one dot moved in place, cheap enough for pointer-move rates.
  useEffect(() => {
    if (!ctx) return;
    const i = track && cursorS != null ? nearestIndex(track.t, cursorS) : -1;
    if (!track || i < 0 || !validPos(track.lat[i], track.lon[i])) {
      cursorRef.current?.remove();
      cursorRef.current = null;
      return;
    }
    const at: Leaflet.LatLngTuple = [track.lat[i], track.lon[i]];
    if (cursorRef.current) cursorRef.current.setLatLng(at);
    else {
      cursorRef.current = ctx.L.circleMarker(at, {
        pane: "sortie-cursor",
        radius: 7,
        color: C.ink,
        weight: 2,
        fillColor: C.cursor,
        fillOpacity: 1,
        interactive: false,
      }).addTo(ctx.map);
    }
  }, [ctx, track, cursorS]);

  const selected = selectedEventId == null ? undefined : events.find((e) => e.id === selectedEventId);
  const selectedUnplaced = selected && (selected.lat == null || selected.lon == null);
  const tonesShown = (["act", "watch", "info"] as const).filter((t) => events.some((e) => e.tone === t && e.lat != null && e.lon != null));
  const hasPlan = !!plan && plan.waypoints.length > 0;

  let status: ReactNode = null;
  if (!ctx) status = "Loading the map…";
  else if (error) {
    status = (
      <>
        Could not load the track.{" "}
        <button type="button" className="font-semibold text-tide-700 underline underline-offset-2" onClick={() => mutate()}>
          Try again
        </button>
      </>
    );
  } else if (isLoading || !track) status = "Loading the track…";
  else if (trackInfo.points === 0) status = "This log has no positions to draw.";
  else if (selectedUnplaced) status = "The selected event has no position on the map.";

  return (
    <section
      aria-label="Track map"
      data-testid="track-map"
      data-track-points={trackInfo.points}
      data-selected-event={selectedEventId ?? ""}
      className={`relative isolate ${className}`}
    >
      <div className="relative">
        <div
          ref={containerRef}
          className="h-[min(70vh,34rem)] min-h-80 w-full overflow-hidden rounded-lg border border-rule"
          // Inline, because leaflet.css sets these on .leaflet-container outside Tailwind's layers.
          style={{ background: tileUrl ? "#e9e6dd" : C.paper, fontFamily: "var(--font-sans)" }}
        />
        {status ? (
          <p
            role="status"
            className="pointer-events-auto absolute left-1/2 top-3 z-[1000] max-w-[85%] -translate-x-1/2 rounded-md border border-rule bg-card px-3 py-1.5 text-center text-sm text-ink shadow-sm"
          >
            {status}
          </p>
        ) : null}
      </div>
      <MapLegend
        scale={scale}
        noValue={trackInfo.noValue}
        hasTrack={!!track && trackInfo.points > 0}
        planName={hasPlan ? plan!.name : null}
        home={home}
        missionStart={missionStart}
        tones={tonesShown}
      />
    </section>
  );
}

function Swatch({ children, label }: { children: ReactNode; label: string }) {
  return (
    <li className="flex items-center gap-2">
      <svg width="28" height="16" viewBox="0 0 28 16" aria-hidden="true" focusable="false" className="shrink-0">
        {children}
      </svg>
      <span>{label}</span>
    </li>
  );
}

function MapLegend({
  scale,
  noValue,
  hasTrack,
  planName,
  home,
  missionStart,
  tones,
}: {
  scale: LinkScale | null;
  noValue: boolean;
  hasTrack: boolean;
  planName: string | null;
  home: MapHome | null;
  missionStart: MapMissionStart | null;
  tones: Tone[];
}) {
  const unit = scale?.unit ?? "";
  const min = scale ? `${signed(scale.min)} ${unit}` : "";
  const max = scale ? `${scale.field === "snrDb" && scale.max > 0 ? "+" : ""}${signed(scale.max)} ${unit}` : "";
  return (
    <div className="mt-3 space-y-2 text-sm text-ink" aria-label="Map legend" role="group">
      {hasTrack && scale ? (
        <div>
          <p className="font-medium">
            Track colour: {scale.label}, {unit}
          </p>
          <div className="mt-1 flex items-center gap-2">
            <span className="figures text-xs text-ink-soft">{min}</span>
            <span className="flex h-3 overflow-hidden rounded-sm ring-1 ring-ink/50" aria-hidden="true">
              {Array.from({ length: scale.bins }, (_, b) => (
                <span key={b} className="block h-full w-5" style={{ background: binColour(b, scale) }} />
              ))}
            </span>
            <span className="figures text-xs text-ink-soft">{max}</span>
          </div>
          <p className="mt-1 text-xs text-ink-soft">
            Dark = weaker link, light = stronger: from {min} (darkest) to {max} (lightest). Cividis colours, chosen to read the
            same with colour-vision deficiency. This range is common practice for the metric, not a standard; readings outside it
            take the end colours.
          </p>
        </div>
      ) : null}
      <ul className="flex flex-wrap gap-x-5 gap-y-1.5">
        {hasTrack && !scale ? (
          <Swatch label="Track (this log has no link metric)">
            <line x1="2" y1="8" x2="26" y2="8" stroke={C.inkSoft} strokeWidth="4" strokeLinecap="round" />
          </Swatch>
        ) : null}
        {hasTrack && noValue ? (
          <Swatch label="No link value">
            <line x1="3" y1="8" x2="25" y2="8" stroke={C.inkSoft} strokeWidth="3.5" strokeLinecap="round" strokeDasharray="1 7" />
          </Swatch>
        ) : null}
        {planName != null ? (
          <>
            <Swatch label={`Route plan${planName ? `: ${planName}` : ""}`}>
              <line x1="1" y1="8" x2="27" y2="8" stroke={C.route} strokeWidth="2.5" strokeDasharray="8 6" />
            </Swatch>
            <Swatch label="Waypoint acceptance radius">
              <circle cx="14" cy="8" r="6.5" stroke={C.route} strokeWidth="1.5" fill={C.route} fillOpacity="0.1" />
            </Swatch>
            <Swatch label="Waypoint (numbered in plan order)">
              <circle cx="14" cy="8" r="6.5" stroke={C.route} strokeWidth="2" fill={C.card} />
            </Swatch>
          </>
        ) : null}
        {home ? (
          <Swatch label={homeTitle(home)}>
            <path d="M14 1.5 21 8h-2v6.5H9V8H7Z" fill={C.ink} />
          </Swatch>
        ) : null}
        {missionStart ? (
          <Swatch label={missionStartTitle(missionStart)}>
            <path d="M11 15V1.5" stroke={C.route} strokeWidth="2" strokeLinecap="round" />
            <path d="M11.5 2h8l-2 2.5 2 2.5h-8Z" fill={C.route} />
          </Swatch>
        ) : null}
        {tones.map((tone) => (
          <li key={tone} className="flex items-center gap-2">
            <svg
              width="20"
              height="20"
              viewBox="0 0 32 32"
              aria-hidden="true"
              focusable="false"
              className="shrink-0"
              dangerouslySetInnerHTML={{ __html: toneShape(tone) }}
            />
            <span>{toneWord[tone]} event</span>
          </li>
        ))}
        {hasTrack ? (
          <Swatch label="Chart cursor">
            <circle cx="14" cy="8" r="5.5" fill={C.cursor} stroke={C.ink} strokeWidth="2" />
          </Swatch>
        ) : null}
      </ul>
    </div>
  );
}
