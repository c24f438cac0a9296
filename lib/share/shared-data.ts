/**
 * The share data routes: the token resolves to its one run, then the very reads the run routes
 * use answer (same bodies, ETags and cache headers). No run id is taken from the request, so a
 * token cannot reach any other run.
 */
import type { PointsQueryInput, SeriesQueryInput } from "@/lib/series/query";
import { readRunPoints, readRunSeries, readRunTrack, type Cached } from "@/lib/series/read-series";
import type { PointsResponse, SeriesResponse, TrackResponse } from "@/lib/series/types";
import { requireSharedRun } from "./resolve";

/** `GET /api/share/{token}/series`. */
export async function getSharedSeries(token: string, q: SeriesQueryInput, ifNoneMatch: string | null): Promise<Cached<SeriesResponse>> {
  return readRunSeries(await requireSharedRun(token), q, ifNoneMatch);
}

/** `GET /api/share/{token}/track`. */
export async function getSharedTrack(token: string, q: { v?: string }, ifNoneMatch: string | null): Promise<Cached<TrackResponse>> {
  return readRunTrack(await requireSharedRun(token), q, ifNoneMatch);
}

/** `GET /api/share/{token}/points`. */
export async function getSharedPoints(token: string, q: PointsQueryInput, ifNoneMatch: string | null): Promise<Cached<PointsResponse>> {
  return readRunPoints(await requireSharedRun(token), q, ifNoneMatch);
}
