/** Downloads of a run for every member of its crew: the track as GPX or GeoJSON, the events as CSV. */
export function ExportLinks({ runId }: { runId: number }) {
  const base = `/api/runs/${runId}/export`;
  return (
    <nav aria-label="Export this run" className="flex flex-wrap gap-2" data-testid="export-links">
      <a href={`${base}/track.gpx`} className="btn-quiet" download>
        Track as GPX
      </a>
      <a href={`${base}/track.geojson`} className="btn-quiet" download>
        Track as GeoJSON
      </a>
      <a href={`${base}/events.csv`} className="btn-quiet" download>
        Events as CSV
      </a>
    </nav>
  );
}
