import { NextResponse } from "next/server";
import type { Cached } from "./read-series";

/** A cached read as a response: 304 when the client's copy is current, else JSON; both with ETag and Cache-Control. */
export function cachedJson<T>(c: Cached<T>): Response {
  const headers = { etag: c.etag, "cache-control": c.cacheControl };
  if (c.body === null) return new Response(null, { status: 304, headers });
  return NextResponse.json(c.body, { headers });
}
