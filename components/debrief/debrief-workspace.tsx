"use client";

import { useCallback, useEffect, useMemo, useState } from "react";
import { ChartGroup, type ChartMarker } from "@/components/charts/chart-group";
import { TrackMap, type MapHome, type MapMissionStart } from "@/components/map/track-map";
import { formatClock, type Units } from "@/lib/format/units";
import { chartPanels, linkChart, panelConversions, type LinkInfo } from "./chart-panels";
import { EventTimeline } from "./event-timeline";
import { EventsTable } from "./events-table";
import { eventLabel, eventTone, eventWindow, fadeLeadIn, type DebriefEvent } from "./event-words";

export interface DebriefWorkspaceProps {
  runId: number;
  /** The run's data version (changes with every re-parse); keys every data request. */
  version: string;
  /** Where the charts and map fetch from; default `/api/runs/{runId}` (the shared page passes `/api/share/{token}`). */
  apiBase?: string;
  durationS: number;
  events: DebriefEvent[];
  fieldsPresent: string[];
  hasPlan: boolean;
  link: LinkInfo;
  units: Units;
  plan: { name: string; waypoints: { name: string; lat: number; lon: number; radiusM: number }[] } | null;
  home: MapHome | null;
  /** Where route following began (summary.route.start). */
  missionStart: MapMissionStart | null;
  /** A bench run (no usable fix): charts and events only, no map. */
  bench: boolean;
  tileUrl: string | null;
  tileAttribution: string | null;
}

type Range = { from: number; to: number } | null;

const typing = (t: EventTarget | null) => t instanceof HTMLElement && (t.isContentEditable || /^(INPUT|TEXTAREA|SELECT)$/.test(t.tagName));

/**
 * The interactive half of the debrief: timeline, synced charts, track map and events table share
 * one selection and one time range, so choosing an event anywhere shows it everywhere.
 */
export function DebriefWorkspace(props: DebriefWorkspaceProps) {
  const { runId, durationS, events, units } = props;
  const [range, setRange] = useState<Range>(null);
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [cursorS, setCursorS] = useState<number | null>(null);

  const panels = useMemo(() => chartPanels(props.fieldsPresent, props.hasPlan, props.link, units), [props.fieldsPresent, props.hasPlan, props.link, units]);
  const convert = useMemo(() => panelConversions(units), [units]);
  const markers: ChartMarker[] = useMemo(
    () => events.filter((e) => e.kind !== "armed" && e.kind !== "disarmed").map((e) => ({ id: e.id, startS: e.startS, endS: e.endS, tone: eventTone(e) })),
    [events],
  );
  const mapEvents = useMemo(
    () => events.map((e) => ({ id: e.id, kind: e.kind, label: eventLabel(e), tone: eventTone(e), lat: e.lat, lon: e.lon, startS: e.startS })),
    [events],
  );

  const select = useCallback(
    (id: number | null) => {
      setSelectedId(id);
      const e = id === null ? null : events.find((x) => x.id === id);
      setRange(e ? eventWindow(e, durationS) : null);
    },
    [events, durationS],
  );

  const step = useCallback(
    (dir: 1 | -1) => {
      if (!events.length) return;
      const i = events.findIndex((e) => e.id === selectedId);
      const next = i < 0 ? (dir === 1 ? 0 : events.length - 1) : Math.min(events.length - 1, Math.max(0, i + dir));
      select(events[next].id);
    },
    [events, selectedId, select],
  );

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (typing(e.target) || e.metaKey || e.ctrlKey || e.altKey) return;
      if (e.key === "n" || e.key === "]") step(1);
      else if (e.key === "p" || e.key === "[") step(-1);
      else if (e.key === "Escape" || e.key === "0") select(null);
      else return;
      e.preventDefault();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [step, select]);

  const selected = events.find((e) => e.id === selectedId) ?? null;

  return (
    <section aria-labelledby="workspace-title" className="mt-6">
      <h2 id="workspace-title" className="sr-only">
        Charts, map and events
      </h2>
      <div className="panel mb-3 flex flex-wrap items-center gap-2 py-2 sm:py-3 lg:sticky lg:top-0 lg:z-[1100]">
        <button type="button" className="btn-quiet" onClick={() => step(-1)} disabled={!events.length} aria-keyshortcuts="p">
          ← Previous event
        </button>
        <button type="button" className="btn-quiet" onClick={() => step(1)} disabled={!events.length} aria-keyshortcuts="n">
          Next event →
        </button>
        <button type="button" className="btn-quiet" onClick={() => select(null)} disabled={!range && selectedId === null} aria-keyshortcuts="0">
          Whole run
        </button>
        <p className="figures ml-auto text-sm" aria-live="polite" data-testid="range-readout">
          {selected ? `${eventLabel(selected)} · ` : ""}
          {range ? `${formatClock(range.from)}–${formatClock(range.to)}` : `Whole run, ${formatClock(durationS)}`}
        </p>
      </div>
      <EventTimeline
        durationS={durationS}
        marks={events.map((e) => ({ id: e.id, startS: e.startS, endS: e.endS, tone: eventTone(e), label: eventLabel(e), leadInS: fadeLeadIn(e) }))}
        selectedId={selectedId}
        range={range}
        onSelect={select}
      />
      <p className="mb-3 text-xs text-ink-soft">
        Keys: <kbd>n</kbd> next event, <kbd>p</kbd> previous, <kbd>0</kbd> whole run; on a chart, drag to zoom, <kbd>←</kbd>/<kbd>→</kbd> pan, <kbd>+</kbd>/<kbd>−</kbd> zoom.
      </p>
      <div className={props.bench ? "" : "grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]"}>
        <div className="panel min-w-0 p-2 sm:p-3">
          <ChartGroup
            runId={runId}
            version={props.version}
            apiBase={props.apiBase}
            panels={panels}
            durationS={durationS}
            range={range}
            onRangeChange={setRange}
            markers={markers}
            selectedMarkerId={selectedId}
            onSelectMarker={select}
            onCursor={setCursorS}
            convert={convert}
          />
        </div>
        {!props.bench && (
          <div className="panel min-w-0 p-2 sm:p-3 lg:sticky lg:top-20 lg:self-start">
            <TrackMap
              runId={runId}
              version={props.version}
              apiBase={props.apiBase}
              plan={props.plan}
              home={props.home}
              missionStart={props.missionStart}
              events={mapEvents}
              selectedEventId={selectedId}
              onSelectEvent={select}
              focus={range}
              cursorS={cursorS}
              tileUrl={props.tileUrl}
              tileAttribution={props.tileAttribution}
              distanceUnit={units}
              linkLabel={props.link.source?.kind === "rc-channel" ? linkChart(props.link, props.fieldsPresent)?.label : undefined}
            />
          </div>
        )}
      </div>
      <div className="mt-4">
        <h3 className="mb-2 text-lg font-semibold">
          Events <span className="figures text-ink-soft">({events.length.toLocaleString("en")})</span>
        </h3>
        <EventsTable events={events} selectedId={selectedId} onSelect={select} units={units} linkUnit={props.link.unit} bench={props.bench} />
      </div>
    </section>
  );
}
