import { sql } from "drizzle-orm";
import { NextResponse } from "next/server";
import { db } from "@/db/client";
import { objectStoreReachable } from "@/lib/storage/s3";

export const dynamic = "force-dynamic";

/** Liveness for load balancers and the start script: database and object store reachable. */
export async function GET() {
  const [database, objectStore] = await Promise.all([
    db().execute(sql`SELECT 1`).then(() => true, () => false),
    objectStoreReachable(),
  ]);
  const ok = database && objectStore;
  return NextResponse.json({ ok, database, objectStore }, { status: ok ? 200 : 503 });
}
