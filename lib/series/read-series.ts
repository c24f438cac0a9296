/**
 * What the series, track and points route handlers call: access check, readiness, caching
 * headers, one consistent read of the stored levels, and a rebuild for runs stored before
 * levels existed.
 */
import { timesUsable } from "@/lib/parsers/warnings";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { loadAnalysisInputs } from "@/lib/ingest/analysis-inputs";
import { pool } from "@/db/client";
import { getRun } from "@/db/queries/runs";
import type { Run } from "@/db/schema";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { ConflictError } from "@/lib/errors";
import { LEVELS_VERSION, seriesBlobs, type SeriesBlob } from "./levels";
import type { PointsQueryInput, SeriesQueryInput } from "./query";
import { loadMeta, readPoints, readSeries, readTrack, type LoadedMeta, type SampleSource } from "./read";
import { dbSampleSource, loadStoredSeries } from "./samples";
import { dbBlobSource, deleteSeriesLevels, memoryBlobSource, writeSeriesLevels, type BlobSource } from "./store";
import type { PointsResponse, SeriesResponse, TrackResponse } from "./types";

/** A body to send, or null when the client's copy (If-None-Match) is current. */
export interface Cached<T> {
  body: T | null;
  etag: string;
  cacheControl: string;
}

/** Changes whenever the stored levels can: a re-parse or re-analysis rewrites the run row. */
export const versionOf = (run: Pick<Run, "updatedAt">) => `${LEVELS_VERSION}.${run.updatedAt.getTime()}`;

/**
 * A request that names the current version (`v`, from an earlier response) may be kept for good:
 * that URL's answer can never change. Otherwise revalidate each time (a 304 costs one run lookup).
 */
const cacheControlFor = (v: string | undefined, version: string) =>
  v === version ? "private, max-age=31536000, immutable" : "private, no-cache";

function describeStatus(run: Run): string {
  if (run.status === "failed") return "This run could not be parsed, so it has no series; re-parse it first";
  return `This run is ${run.status}; its series can be read once it is ready`;
}

/** The access check of the run routes: the actor may read the run in its own crew (404 otherwise). */
export async function requireReadableRun(actor: Actor, runId: number): Promise<Run> {
  const { record } = await requireRecordPermission(actor, () => getRun(runId), "read", "Run");
  return record;
}

const etagMatches = (header: string | null, etag: string) =>
  !!header && header.split(",").some((t) => t.trim().replace(/^W\//, "") === etag);

type Reader<T> = (src: BlobSource, samples: SampleSource, loaded: LoadedMeta) => Promise<T>;

/** Rebuilds in flight, one per run; and at most one at a time (a million samples hold ~100 MB). */
const g = globalThis as unknown as { sortieSeriesRebuilds?: Map<number, Promise<{ source: BlobSource; loaded: LoadedMeta }>>; sortieSeriesQueue?: Promise<unknown> };
const rebuilds = (g.sortieSeriesRebuilds ??= new Map());

/**
 * Levels for a run stored before they existed (or with an older layout): built from its samples,
 * with the derived fields from the (pure) analysis run again, stored unless the run changed
 * meanwhile, and served from memory for this request.
 */
function rebuildLevels(run: Run): Promise<{ source: BlobSource; loaded: LoadedMeta }> {
  const running = rebuilds.get(run.id);
  if (running) return running;
  const job = (g.sortieSeriesQueue ?? Promise.resolve())
    .catch(() => {})
    .then(async () => {
      const series = await loadStoredSeries(pool(), run.id, run.modeNames ?? []);
      const analysis = analyseRun(series, { ...(await loadAnalysisInputs(run)), timesUsable: timesUsable(run.warnings) });
      const blobs: SeriesBlob[] = [...seriesBlobs(series, analysis.perSample)];
      const source = memoryBlobSource(blobs);
      const loaded = await loadMeta(source);
      if (!loaded) throw new Error(`levels of run ${run.id} could not be built`);
      await storeRebuilt(run, blobs).catch((e) => console.error(`[series] storing rebuilt levels of run ${run.id} failed`, e));
      return { source, loaded };
    })
    .finally(() => rebuilds.delete(run.id));
  // The queue holds only completion, not the result: a finished rebuild's blobs must be collectable.
  g.sortieSeriesQueue = job.then(
    () => {},
    () => {},
  );
  rebuilds.set(run.id, job);
  return job;
}

async function storeRebuilt(run: Run, blobs: SeriesBlob[]): Promise<void> {
  const conn = await pool().getConnection();
  try {
    await conn.beginTransaction();
    // Locks the run row: an ingest of the same run commits either before (then we skip) or after us.
    const [rows] = (await conn.query("SELECT status, updated_at FROM runs WHERE id = ? FOR UPDATE", [run.id])) as unknown as [{ status: string; updated_at: Date }[]];
    const now = rows[0];
    if (!now || now.status !== "ready" || now.updated_at.getTime() !== run.updatedAt.getTime()) {
      await conn.rollback();
      return;
    }
    await deleteSeriesLevels(conn, run.id);
    await writeSeriesLevels(conn, run.id, blobs);
    await conn.commit();
  } catch (e) {
    await conn.rollback().catch(() => {});
    throw e;
  } finally {
    conn.release();
  }
}

/**
 * Runs `read` over one consistent snapshot of the run row and its levels (a re-parse committing
 * in between cannot mix old and new rows).
 */
async function withLevels<T>(run: Run, read: Reader<T>): Promise<{ value: T; run: Run }> {
  const conn = await pool().getConnection();
  let current = run;
  try {
    // Ingest leaves its connections in READ COMMITTED; a snapshot needs REPEATABLE READ.
    await conn.query("SET TRANSACTION ISOLATION LEVEL REPEATABLE READ");
    await conn.query("START TRANSACTION WITH CONSISTENT SNAPSHOT, READ ONLY");
    const [rows] = (await conn.query("SELECT status, updated_at FROM runs WHERE id = ?", [run.id])) as unknown as [{ status: Run["status"]; updated_at: Date }[]];
    if (!rows[0]) throw new ConflictError("This run was removed while it was read");
    current = { ...run, status: rows[0].status, updatedAt: rows[0].updated_at };
    if (current.status !== "ready") throw new ConflictError(describeStatus(current));
    const src = dbBlobSource(conn, run.id);
    const loaded = await loadMeta(src);
    if (loaded) return { value: await read(src, dbSampleSource(conn, run.id), loaded), run: current };
  } finally {
    await conn.query("COMMIT").catch(() => {});
    conn.release();
  }
  const built = await rebuildLevels(current);
  return { value: await read(built.source, dbSampleSource(pool(), run.id), built.loaded), run: current };
}

async function cachedRead<T>(run: Run, kind: string, v: string | undefined, ifNoneMatch: string | null, read: Reader<T>): Promise<Cached<T & { runId: number; version: string }>> {
  if (run.status !== "ready") throw new ConflictError(describeStatus(run));
  const etagOf = (r: Run) => `"${kind}-${r.id}-${versionOf(r)}"`;
  if (etagMatches(ifNoneMatch, etagOf(run))) return { body: null, etag: etagOf(run), cacheControl: cacheControlFor(v, versionOf(run)) };
  const { value, run: current } = await withLevels(run, read);
  const version = versionOf(current);
  return { body: { runId: run.id, version, ...value }, etag: etagOf(current), cacheControl: cacheControlFor(v, version) };
}

/*
 * The reads take a run whose access was already checked: the run routes check the actor's crew
 * (below), the share routes a share token (lib/share); both then serve the same answers.
 */

/** The series of a run the caller may read. */
export function readRunSeries(run: Run, q: SeriesQueryInput, ifNoneMatch: string | null): Promise<Cached<SeriesResponse>> {
  return cachedRead(run, "series", q.v, ifNoneMatch, (src, samples, loaded) => readSeries(src, samples, loaded, q));
}

/** The track overview of a run the caller may read. */
export function readRunTrack(run: Run, q: { v?: string }, ifNoneMatch: string | null): Promise<Cached<TrackResponse>> {
  return cachedRead(run, "track", q.v, ifNoneMatch, (src, _samples, loaded) => readTrack(src, loaded));
}

/** The scatter points of a run the caller may read. */
export function readRunPoints(run: Run, q: PointsQueryInput, ifNoneMatch: string | null): Promise<Cached<PointsResponse>> {
  return cachedRead(run, "points", q.v, ifNoneMatch, (src, samples, loaded) => readPoints(src, samples, loaded, q));
}

/** `GET /api/runs/{id}/series`. */
export async function getRunSeries(actor: Actor, runId: number, q: SeriesQueryInput, ifNoneMatch: string | null): Promise<Cached<SeriesResponse>> {
  return readRunSeries(await requireReadableRun(actor, runId), q, ifNoneMatch);
}

/** `GET /api/runs/{id}/track`. */
export async function getRunTrack(actor: Actor, runId: number, q: { v?: string }, ifNoneMatch: string | null): Promise<Cached<TrackResponse>> {
  return readRunTrack(await requireReadableRun(actor, runId), q, ifNoneMatch);
}

/** `GET /api/runs/{id}/points`. */
export async function getRunPoints(actor: Actor, runId: number, q: PointsQueryInput, ifNoneMatch: string | null): Promise<Cached<PointsResponse>> {
  return readRunPoints(await requireReadableRun(actor, runId), q, ifNoneMatch);
}
