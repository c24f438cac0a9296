import { and, asc, count, desc, eq, gte, inArray, lt, sql, type SQL } from "drizzle-orm";
import type { AnyMySqlColumn } from "drizzle-orm/mysql-core";
import { db } from "@/db/client";
import { builds, memberships, routePlans, runs, users } from "@/db/schema";
import { RUNS_PER_PAGE, type RunListQuery, type RunSortKey } from "@/lib/validations/run-list";

/** When the run happened: the log's own start time, else the upload time (what the table shows). */
const runDate = sql`COALESCE(${runs.startedAt}, ${runs.createdAt})`;

const sortColumns: Record<RunSortKey, AnyMySqlColumn | SQL> = {
  date: runDate,
  build: builds.name,
  pilot: users.name,
  plan: routePlans.name,
  duration: runs.durationS,
  distance: runs.distanceM,
  verdict: runs.verdict,
  status: runs.status,
};

/** One page of a crew's runs with the names the table shows; filters and sort from the URL. */
export async function listRunsPage(crewId: number, q: RunListQuery) {
  const where = [eq(runs.crewId, crewId)];
  if (q.build) where.push(eq(runs.buildId, q.build));
  if (q.pilot) where.push(eq(runs.pilotId, q.pilot));
  if (q.verdict) where.push(eq(runs.verdict, q.verdict));
  // Dates filter on when the run happened (upload time when the log has no clock), UTC days.
  if (q.from) where.push(gte(runDate, new Date(`${q.from}T00:00:00Z`)));
  if (q.to) where.push(lt(runDate, new Date(Date.parse(`${q.to}T00:00:00Z`) + 86_400_000)));
  const filter = and(...where);
  const order = q.dir === "asc" ? asc : desc;

  const [rows, [{ n }]] = await Promise.all([
    db()
      .select({
        id: runs.id,
        title: runs.title,
        part: runs.part,
        /** Runs made from the same file (more than 1 when it held several separate runs). */
        partCount: sql<number>`(SELECT COUNT(*) FROM ${runs} AS p WHERE p.upload_id = ${runs.uploadId})`.mapWith(Number),
        status: runs.status,
        progress: runs.progress,
        verdict: runs.verdict,
        durationS: runs.durationS,
        distanceM: runs.distanceM,
        startedAt: runs.startedAt,
        createdAt: runs.createdAt,
        buildName: builds.name,
        pilotName: users.name,
        planName: routePlans.name,
      })
      .from(runs)
      .leftJoin(builds, eq(builds.id, runs.buildId))
      .leftJoin(users, eq(users.id, runs.pilotId))
      .leftJoin(routePlans, eq(routePlans.id, runs.routePlanId))
      .where(filter)
      // Blanks (no build, not yet analysed…) last in either direction.
      .orderBy(sql`${sortColumns[q.sort]} IS NULL`, order(sortColumns[q.sort]), desc(runs.id))
      .limit(RUNS_PER_PAGE)
      .offset((q.page - 1) * RUNS_PER_PAGE),
    db().select({ n: count() }).from(runs).where(filter),
  ]);
  return { rows, total: n, pages: Math.max(1, Math.ceil(n / RUNS_PER_PAGE)) };
}

/** Builds and pilots that appear in the crew's runs, for the filter menus. */
export async function runFilterOptions(crewId: number) {
  const [buildRows, pilotRows] = await Promise.all([
    db().selectDistinct({ id: builds.id, name: builds.name }).from(runs).innerJoin(builds, eq(builds.id, runs.buildId)).where(eq(runs.crewId, crewId)).orderBy(asc(builds.name)),
    db().selectDistinct({ id: users.id, name: users.name }).from(runs).innerJoin(users, eq(users.id, runs.pilotId)).where(eq(runs.crewId, crewId)).orderBy(asc(users.name)),
  ]);
  return { builds: buildRows, pilots: pilotRows };
}

/** Status and progress of the given runs, only those in crews the user belongs to. */
export async function runStatusesForUser(userId: number, ids: number[]) {
  if (!ids.length) return [];
  return db()
    .select({ id: runs.id, status: runs.status, progress: runs.progress })
    .from(runs)
    .innerJoin(memberships, and(eq(memberships.crewId, runs.crewId), eq(memberships.userId, userId)))
    .where(inArray(runs.id, ids));
}
