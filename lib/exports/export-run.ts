/**
 * The run exports: the flown track as GPX 1.1 or GeoJSON, the events as CSV. Observers and up of
 * the run's own crew. Tracks are streamed: samples are read in seq pages inside one consistent
 * snapshot (a re-parse committing meanwhile cannot mix old and new rows), so a million-sample run
 * never sits in memory, as rows or as text.
 */
import { asc, eq } from "drizzle-orm";
import type { PoolConnection } from "mysql2/promise";
import { db, pool } from "@/db/client";
import { getRun, listUploadParts } from "@/db/queries/runs";
import { events as eventsTable, type Run } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { ConflictError } from "@/lib/errors";
import { fromBytes } from "@/lib/series/codec";
import { RAW_CHUNK } from "@/lib/series/levels";
import { loadMeta } from "@/lib/series/read";
import { dbSampleSource } from "@/lib/series/samples";
import { dbBlobSource } from "@/lib/series/store";
import { writeEventsCsv } from "./events-csv";
import { contentDisposition } from "./file-name";
import { GeoJsonWriter } from "./geojson-writer";
import { GpxWriter } from "./gpx-writer";
import { Segmenter, segmentRules, trackPoints, type TrackPoint } from "./track-points";

export type ExportFormat = "gpx" | "geojson" | "events-csv";

export interface ExportFile {
  body: ReadableStream<Uint8Array> | string;
  contentType: string;
  disposition: string;
}

/** Samples per read: a quarter of a stored break-bit chunk, so each page needs one chunk. */
const PAGE = RAW_CHUNK / 4;
const TRACK_FIELDS = ["lat", "lon", "altM", "sats", "hdop", "fixType"] as const;

interface TrackWriter {
  head(): string;
  points(points: Iterable<TrackPoint>): string;
  tail(): string;
}

async function exportableRun(actor: Actor, runId: number): Promise<Run> {
  const { record } = await requireRecordPermission(actor, () => getRun(runId), "read", "Run");
  if (record.status !== "ready") throw new ConflictError(record.status === "failed" ? "This run could not be parsed, so there is nothing to export; re-parse it first" : `This run is ${record.status}; it can be exported once it is ready`);
  // The runs of a file that held several share its title: each part's downloads say which part.
  const parts = await listUploadParts(record.uploadId);
  return parts.length > 1 ? { ...record, title: `${record.title} part ${record.part}` } : record;
}

const bitAt = (bits: Uint8Array, i: number) => i >= 0 && i >> 3 < bits.length && ((bits[i >> 3] >> (i & 7)) & 1) === 1;

/**
 * The document's text, page by page. The connection is taken on the first pull and given back in
 * `finally`, which also runs when the download is cancelled (the stream calls return()).
 */
async function* trackText(run: Run, writer: TrackWriter): AsyncGenerator<string> {
  const conn: PoolConnection = await pool().getConnection();
  try {
    await conn.query("SET TRANSACTION ISOLATION LEVEL REPEATABLE READ");
    await conn.query("START TRANSACTION WITH CONSISTENT SNAPSHOT, READ ONLY");
    yield writer.head();
    const [[{ n }]] = (await conn.query("SELECT COALESCE(MAX(seq) + 1, 0) AS n FROM samples WHERE run_id = ?", [run.id])) as unknown as [{ n: number }[]];
    const total = Number(n);
    const blobs = dbBlobSource(conn, run.id);
    // With current levels, their break bits carry the log's own segment starts; without, gaps alone.
    const levels = await loadMeta(blobs);
    const samples = dbSampleSource(conn, run.id);
    let seg: Segmenter | null = null;
    let bits: Uint8Array = new Uint8Array(0);
    let bitsChunk = -1;
    for (let lo = 0; lo < total; lo += PAGE) {
      const rows = await samples.range(lo, Math.min(total, lo + PAGE) - 1, TRACK_FIELDS);
      const v = rows.values as Record<(typeof TRACK_FIELDS)[number], ArrayLike<number>>;
      seg ??= new Segmenter(segmentRules(rows.t, v.lat, v.lon, v.fixType, levels ? levels.meta.gapStepS : undefined));
      const chunk = Math.floor(lo / RAW_CHUNK);
      if (levels && chunk !== bitsChunk) {
        const got = await blobs.read([{ kind: "raw", bucketSize: 1, fields: ["_break"], chunks: [chunk, chunk] }]);
        bits = fromBytes("u8", got.get("raw:1:_break") ?? []);
        bitsChunk = chunk;
      }
      const base = chunk * RAW_CHUNK;
      const breakBefore = levels ? (i: number) => bitAt(bits, rows.seq[i] - base) : undefined;
      const text = writer.points(trackPoints(seg, { t: rows.t, lat: v.lat, lon: v.lon, fixType: v.fixType, altM: v.altM, sats: v.sats, hdop: v.hdop }, breakBefore));
      if (text) yield text;
    }
    yield writer.tail();
  } finally {
    await conn.query("COMMIT").catch(() => {});
    conn.release();
  }
}

/** A byte stream over the generator, pulled as the client reads (back-pressure), cancelled with it. */
function streamOf(gen: AsyncGenerator<string>, what: string): ReadableStream<Uint8Array> {
  const enc = new TextEncoder();
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      try {
        const { value, done } = await gen.next();
        if (done) controller.close();
        else controller.enqueue(enc.encode(value));
      } catch (e) {
        console.error(`[export] ${what} failed`, e);
        controller.error(e);
      }
    },
    async cancel() {
      await gen.return(undefined);
    },
  });
}

const fallbackName = (run: Run) => `run-${run.id}`;

async function recordExport(actor: Actor, run: Run, format: ExportFormat) {
  await audit({ crewId: run.crewId, actorId: actor.user.id, action: "run.exported", targetType: "run", targetId: run.id, detail: { format } });
}

/** `GET /api/runs/{id}/export/track.gpx` */
export async function exportTrackGpx(actor: Actor, runId: number): Promise<ExportFile> {
  const run = await exportableRun(actor, runId);
  await recordExport(actor, run, "gpx");
  return {
    body: streamOf(trackText(run, new GpxWriter({ name: run.title, startedAt: run.startedAt })), `GPX of run ${run.id}`),
    contentType: "application/gpx+xml; charset=utf-8",
    disposition: contentDisposition(run.title, ".gpx", fallbackName(run)),
  };
}

/** `GET /api/runs/{id}/export/track.geojson` */
export async function exportTrackGeoJson(actor: Actor, runId: number): Promise<ExportFile> {
  const run = await exportableRun(actor, runId);
  await recordExport(actor, run, "geojson");
  return {
    body: streamOf(trackText(run, new GeoJsonWriter({ name: run.title, startedAt: run.startedAt })), `GeoJSON of run ${run.id}`),
    // RFC 7946 §12.
    contentType: "application/geo+json; charset=utf-8",
    disposition: contentDisposition(run.title, ".geojson", fallbackName(run)),
  };
}

/** `GET /api/runs/{id}/export/events.csv` — a run has at most a few thousand events: built in memory. */
export async function exportEventsCsv(actor: Actor, runId: number): Promise<ExportFile> {
  const run = await exportableRun(actor, runId);
  const rows = await db().select().from(eventsTable).where(eq(eventsTable.runId, run.id)).orderBy(asc(eventsTable.startS), asc(eventsTable.id));
  await recordExport(actor, run, "events-csv");
  return {
    body: writeEventsCsv(rows.map((e) => ({ ...e, detail: (e.detail as Record<string, unknown> | null) ?? null }))),
    contentType: "text/csv; charset=utf-8; header=present",
    disposition: contentDisposition(run.title, "-events.csv", fallbackName(run)),
  };
}

/** The download as a response: an attachment, never cached or sniffed. */
export function exportResponse(f: ExportFile): Response {
  return new Response(f.body, {
    headers: {
      "content-type": f.contentType,
      "content-disposition": f.disposition,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
