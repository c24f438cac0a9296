/**
 * What the shared page shows of one debrief: the run's own report and nothing else of the crew
 * (no crew name, no member e-mails, no upload file name or object key, no links into the app).
 * Names appear only where the debrief itself carries them: pilot, note authors, sign-off.
 */
import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getRoutePlan } from "@/db/queries/route-plans";
import { builds, events as eventsTable, runNotes, uploads, users, type Run } from "@/db/schema";
import { debriefEvent, debriefPlan } from "@/lib/runs/debrief-parts";
import { versionOf } from "@/lib/series/read-series";
import { openShare } from "./resolve";

const nameOf = async (id: number | null) => {
  if (!id) return null;
  const [row] = await db().select({ name: users.name }).from(users).where(eq(users.id, id)).limit(1);
  return row?.name ?? null;
};

async function debriefOf(run: Run) {
  const ready = run.status === "ready";
  const [events, notes, build, plan, pilotName, signedOffBy, upload] = await Promise.all([
    ready ? db().select().from(eventsTable).where(eq(eventsTable.runId, run.id)).orderBy(asc(eventsTable.startS), asc(eventsTable.id)) : [],
    db()
      .select({ id: runNotes.id, body: runNotes.body, createdAt: runNotes.createdAt, authorName: users.name })
      .from(runNotes)
      .leftJoin(users, eq(users.id, runNotes.authorId))
      .where(eq(runNotes.runId, run.id))
      .orderBy(asc(runNotes.createdAt), asc(runNotes.id)),
    run.buildId ? db().select({ name: builds.name }).from(builds).where(eq(builds.id, run.buildId)).limit(1) : [],
    run.routePlanId ? getRoutePlan(run.routePlanId) : null,
    nameOf(run.pilotId),
    run.signedOffAt ? nameOf(run.signedOffBy) : null,
    db().select({ note: uploads.note }).from(uploads).where(eq(uploads.id, run.uploadId)).limit(1),
  ]);
  return {
    run: {
      id: run.id,
      title: run.title,
      status: run.status,
      format: run.format,
      sampleCount: run.sampleCount,
      durationS: run.durationS,
      startedAt: run.startedAt,
      summary: run.summary,
      note: upload[0]?.note ?? null,
    },
    events: events.map(debriefEvent),
    notes: notes.map((n) => ({ id: n.id, body: n.body, createdAt: n.createdAt, authorName: n.authorName ?? null })),
    buildName: build[0]?.name ?? null,
    pilotName,
    plan: debriefPlan(plan, run.summary ?? null),
    dataVersion: versionOf(run),
    signOff: run.signedOffAt ? { by: signedOffBy ?? "a former member", at: run.signedOffAt } : null,
  };
}

export type SharedDebrief = Awaited<ReturnType<typeof debriefOf>> & { expiresAt: Date };

/** Opens a share link for one page load (counting the view); null when it is unknown, expired or withdrawn. */
export async function openSharedDebrief(token: string, now = new Date()): Promise<SharedDebrief | null> {
  const found = await openShare(token, now);
  if (!found) return null;
  return { ...(await debriefOf(found.run)), expiresAt: found.link.expiresAt };
}
