"use client";

import { useEffect, useState } from "react";
import useSWR from "swr";
import type { PointsResponse, SeriesField, SeriesResponse } from "@/lib/series/types";
import type { TimeRange } from "./pan-zoom";
import { mergeSeries } from "./series-to-uplot";
import { pointsForWidth, pointsUrl, roundRangeForFetch, seriesUrl } from "./series-request";

/** Quiet time after the last range change before asking for finer data. */
export const RANGE_DEBOUNCE_MS = 150;

export class FetchError extends Error {
  constructor(
    message: string,
    readonly status: number,
  ) {
    super(message);
  }
}

export async function fetchJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { credentials: "same-origin", headers: { accept: "application/json" } });
  if (!res.ok) {
    let message = `The server answered ${res.status}.`;
    try {
      const body = (await res.json()) as { error?: unknown; message?: unknown };
      const m = typeof body.message === "string" ? body.message : typeof body.error === "string" ? body.error : null;
      if (m) message = m;
    } catch {
      /* not JSON: keep the status line */
    }
    throw new FetchError(message, res.status);
  }
  return (await res.json()) as T;
}

/** `value`, but only after it has stayed the same for `ms` (compare by a primitive key). */
export function useDebouncedValue<T extends string | number | boolean | null>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    if (Object.is(value, settled)) return;
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, settled, ms]);
  return settled;
}

const rangeKey = (r: TimeRange | null) => (r ? `${r.from}~${r.to}` : "");
const parseRangeKey = (k: string): TimeRange | null => {
  if (!k) return null;
  const [from, to] = k.split("~").map(Number);
  return { from, to };
};

const swrOptions = {
  revalidateOnFocus: false,
  revalidateIfStale: false,
  keepPreviousData: true,
  shouldRetryOnError: (err: unknown) => !(err instanceof FetchError && err.status >= 400 && err.status < 500),
  errorRetryCount: 3,
} as const;

export interface UseSeriesResult {
  /** The whole-run overview with, when zoomed, the finest detail fetched so far merged in. */
  data: SeriesResponse | undefined;
  error: Error | undefined;
  /** True until the first overview arrives. */
  isLoading: boolean;
  /** True while a finer window is on its way (the previous data stays on screen). */
  isRefining: boolean;
}

/**
 * The series for a group of charts: one request for all fields. The whole run is fetched once at
 * about one x position per pixel; zooming in fetches the visible window at the same density after
 * the range has settled for 150 ms, keyed on the rounded window.
 */
export function useSeries(
  runId: number,
  fields: readonly SeriesField[],
  range: TimeRange | null,
  widthPx: number,
  durationS: number,
  /** The run's current data version (from the page): part of every URL, so a re-parse never shows cached data. */
  runVersion?: string,
  /** Where the data endpoints live (default `/api/runs/{runId}`; a share link's own base on the shared page). */
  apiBase?: string,
): UseSeriesResult {
  const points = pointsForWidth(widthPx);
  const fetchRange = roundRangeForFetch(range, durationS);
  // Debounce a string so parent re-renders (e.g. on every cursor move) do not restart the timer.
  const fetchKey = rangeKey(fetchRange);
  const settledKey = useDebouncedValue(fetchKey, RANGE_DEBOUNCE_MS);
  const settledRange = parseRangeKey(settledKey);
  const ready = widthPx > 0 && fields.length > 0;

  const overview = useSWR<SeriesResponse, Error>(ready ? seriesUrl(runId, fields, null, points, runVersion, apiBase) : null, fetchJson, swrOptions);
  // Zoom windows wait for the overview so they can carry its version (cacheable answers).
  const version = runVersion ?? overview.data?.version;
  const detail = useSWR<SeriesResponse, Error>(
    ready && settledRange && overview.data ? seriesUrl(runId, fields, settledRange, points, version, apiBase) : null,
    fetchJson,
    swrOptions,
  );

  let data = overview.data;
  // Back at the whole run the detail key is null; SWR's keepPreviousData would still hand back
  // the last window, which must not be merged in then.
  if (data && fetchRange && detail.data && detail.data.runId === data.runId) data = mergeSeries(data, detail.data);

  return {
    data,
    error: overview.error ?? detail.error,
    isLoading: !overview.data && !overview.error,
    isRefining: detail.isValidating || fetchKey !== settledKey,
  };
}

/** Scatter samples for the range chart. */
export function usePoints(runId: number, fields: readonly SeriesField[], points: number, runVersion?: string, apiBase?: string) {
  return useSWR<PointsResponse, Error>(pointsUrl(runId, fields, points, runVersion, apiBase), fetchJson, swrOptions);
}

/** Which of `fields` the run has no value for anywhere (asked only when `enabled`). */
export function useAbsentFields(runId: number, fields: readonly SeriesField[], enabled: boolean, runVersion?: string, apiBase?: string): SeriesField[] | null {
  const res = useSWR<SeriesResponse, Error>(enabled ? seriesUrl(runId, fields, null, 100, runVersion, apiBase) : null, fetchJson, swrOptions);
  return res.data ? res.data.absent : null;
}
