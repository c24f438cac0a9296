import { env } from "@/lib/env";
import type { Units } from "@/lib/format/units";
import { DebriefWorkspace } from "./debrief-workspace";
import type { DebriefEvent } from "./event-words";
import { RangeSection } from "./range-section";
import { SummaryFigures, type RunSummary } from "./summary-figures";

interface Props {
  run: { id: number; status: string; sampleCount: number; durationS: number | null; summary: Record<string, unknown> | null };
  summary: RunSummary & { fieldsPresent?: string[] };
  dataVersion: string;
  events: DebriefEvent[];
  plan: { name: string; waypoints: { name: string; lat: number; lon: number; radiusM: number }[] } | null;
  units: Units;
  /** Where charts and map read their data: the run's own API, or a share link's. */
  apiBase?: string;
}

/** A ready run's figures, synced charts and map, and range view: the same for the crew and a share link. */
export function DebriefBody({ run, summary, dataVersion, events, plan, units, apiBase }: Props) {
  if (run.status !== "ready") return null;
  const link = summary.link ?? { metric: null, unit: null, fadeThreshold: null, source: null };
  // A bench run (no usable fix) has no track: no map, no route, no range (DESIGN.md §10).
  const bench = summary.bench === true;
  const start = summary.route?.start ?? null;
  return (
    <>
      <SummaryFigures summary={summary} units={units} />
      {run.sampleCount > 0 && (
        <DebriefWorkspace
          runId={run.id}
          version={dataVersion}
          apiBase={apiBase}
          durationS={run.durationS ?? summary.timelineS ?? summary.durationS ?? 0}
          events={events}
          fieldsPresent={summary.fieldsPresent ?? []}
          hasPlan={Boolean(plan) && !bench}
          link={{ metric: link.metric, unit: link.unit, fadeThreshold: link.fadeThreshold, source: link.source ?? null }}
          units={units}
          plan={bench ? null : plan}
          home={summary.home ? { lat: summary.home.lat, lon: summary.home.lon, source: summary.home.source ?? null } : null}
          missionStart={start ? { lat: start.lat, lon: start.lon, source: start.source, startS: start.startS } : null}
          bench={bench}
          tileUrl={env().MAP_TILE_URL ?? null}
          tileAttribution={env().MAP_TILE_ATTRIBUTION ?? null}
        />
      )}
      {!bench && <RangeSection runId={run.id} version={dataVersion} apiBase={apiBase} range={summary.range} units={units} />}
    </>
  );
}
