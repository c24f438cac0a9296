import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { getRoutePlan } from "@/db/queries/route-plans";
import { getRun } from "@/db/queries/runs";
import { getUserById } from "@/db/queries/users";
import { events as eventsTable } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { viewRun } from "@/lib/ingest/runs";
import { versionOf } from "@/lib/series/read-series";
import { debriefEvent, debriefPlan } from "./debrief-parts";
import { listNotes } from "./notes";

/** Everything the debrief page shows for one run, after the read check in viewRun. */
export async function loadDebrief(actor: Actor, runId: number) {
  const run = await viewRun(actor, runId);
  const [events, notes, build, plan, pilot, row, me] = await Promise.all([
    run.status === "ready" ? db().select().from(eventsTable).where(eq(eventsTable.runId, runId)).orderBy(asc(eventsTable.startS), asc(eventsTable.id)) : [],
    listNotes(runId),
    run.buildId ? getBuild(run.buildId) : null,
    run.routePlanId ? getRoutePlan(run.routePlanId) : null,
    run.pilotId ? getUserById(run.pilotId) : null,
    getRun(runId),
    getUserById(actor.user.id),
  ]);
  const signedOffBy = row?.signedOffBy ? await getUserById(row.signedOffBy) : null;
  return {
    run,
    events: events.map(debriefEvent),
    notes,
    buildName: build?.name ?? null,
    pilotName: pilot?.name ?? null,
    plan: debriefPlan(plan, run.summary ?? null),
    /** Keys the charts' and map's requests: a re-parse rewrites the run row and so the version. */
    dataVersion: row ? versionOf(row) : "0",
    signOff: row?.signedOffAt ? { by: signedOffBy?.name ?? "a former member", at: row.signedOffAt } : null,
    units: me?.units ?? "metric",
  };
}

export type Debrief = Awaited<ReturnType<typeof loadDebrief>>;
