import { and, count, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { builds, memberships, routePlans, runs } from "@/db/schema";

export async function getCrewOverview(crewId: number) {
  const n = (q: Promise<{ n: number }[]>) => q.then((r) => r[0]?.n ?? 0);
  const [runCount, buildCount, routePlanCount, memberCount, recentRuns] = await Promise.all([
    n(db().select({ n: count() }).from(runs).where(eq(runs.crewId, crewId))),
    n(db().select({ n: count() }).from(builds).where(and(eq(builds.crewId, crewId), isNull(builds.retiredAt)))),
    n(db().select({ n: count() }).from(routePlans).where(eq(routePlans.crewId, crewId))),
    n(db().select({ n: count() }).from(memberships).where(eq(memberships.crewId, crewId))),
    db()
      .select({ id: runs.id, title: runs.title, status: runs.status, verdict: runs.verdict, createdAt: runs.createdAt })
      .from(runs)
      .where(eq(runs.crewId, crewId))
      .orderBy(desc(runs.createdAt))
      .limit(5),
  ]);
  return { runCount, buildCount, routePlanCount, memberCount, recentRuns };
}

export async function listRuns(crewId: number, limit = 50) {
  return db()
    .select({
      id: runs.id,
      title: runs.title,
      status: runs.status,
      verdict: runs.verdict,
      durationS: runs.durationS,
      distanceM: runs.distanceM,
      createdAt: runs.createdAt,
    })
    .from(runs)
    .where(eq(runs.crewId, crewId))
    .orderBy(desc(runs.createdAt))
    .limit(limit);
}
