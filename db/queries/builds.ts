import { and, asc, desc, eq, isNotNull, isNull, sql } from "drizzle-orm";
import { db } from "@/db/client";
import { buildChanges, buildChannels, buildPhotos, builds, runs, users } from "@/db/schema";

export async function getBuild(id: number) {
  const [build] = await db().select().from(builds).where(eq(builds.id, id)).limit(1);
  if (!build) return null;
  const channels = await db().select().from(buildChannels).where(eq(buildChannels.buildId, id)).orderBy(asc(buildChannels.channel));
  return { ...build, channels };
}

export type BuildWithChannels = NonNullable<Awaited<ReturnType<typeof getBuild>>>;

export async function listBuilds(crewId: number, opts: { includeRetired?: boolean } = {}) {
  const where = opts.includeRetired ? eq(builds.crewId, crewId) : and(eq(builds.crewId, crewId), isNull(builds.retiredAt));
  return db()
    .select({
      id: builds.id,
      name: builds.name,
      vehicleType: builds.vehicleType,
      receiver: builds.receiver,
      bandMhz: builds.bandMhz,
      firmware: builds.firmware,
      firmwareVersion: builds.firmwareVersion,
      retiredAt: builds.retiredAt,
      updatedAt: builds.updatedAt,
    })
    .from(builds)
    .where(where)
    .orderBy(desc(builds.updatedAt));
}

/** The build's history, newest first, with the name of whoever made each change. */
export async function listBuildChanges(buildId: number) {
  return db()
    .select({ id: buildChanges.id, changes: buildChanges.changes, createdAt: buildChanges.createdAt, byName: users.name })
    .from(buildChanges)
    .leftJoin(users, eq(users.id, buildChanges.changedBy))
    .where(eq(buildChanges.buildId, buildId))
    .orderBy(desc(buildChanges.createdAt), desc(buildChanges.id));
}

/** When the run happened: the log's own start time, else the upload time. */
const runDate = sql<Date>`COALESCE(${runs.startedAt}, ${runs.createdAt})`;

/** The build's runs, oldest first (the order of the trend charts). */
export async function listBuildRuns(crewId: number, buildId: number) {
  return db()
    .select({
      id: runs.id,
      title: runs.title,
      status: runs.status,
      verdict: runs.verdict,
      durationS: runs.durationS,
      distanceM: runs.distanceM,
      startedAt: runs.startedAt,
      createdAt: runs.createdAt,
      summary: runs.summary,
      pilotName: users.name,
    })
    .from(runs)
    .leftJoin(users, eq(users.id, runs.pilotId))
    .where(and(eq(runs.crewId, crewId), eq(runs.buildId, buildId)))
    .orderBy(asc(runDate), asc(runs.id));
}

/** Photos whose upload was completed, oldest first. */
export async function listBuildPhotos(buildId: number) {
  return db()
    .select()
    .from(buildPhotos)
    .where(and(eq(buildPhotos.buildId, buildId), isNotNull(buildPhotos.storedAt)))
    .orderBy(asc(buildPhotos.createdAt), asc(buildPhotos.id));
}

export async function getBuildPhoto(id: number) {
  const [row] = await db().select().from(buildPhotos).where(eq(buildPhotos.id, id)).limit(1);
  return row ?? null;
}
