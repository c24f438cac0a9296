import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getRun } from "@/db/queries/runs";
import { runNotes, runs, users } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { ConflictError } from "@/lib/errors";

/** A run's notes, oldest first, with their authors' names. */
export async function listNotes(runId: number) {
  return db()
    .select({ id: runNotes.id, body: runNotes.body, createdAt: runNotes.createdAt, authorName: users.name })
    .from(runNotes)
    .leftJoin(users, eq(users.id, runNotes.authorId))
    .where(eq(runNotes.runId, runId))
    .orderBy(asc(runNotes.createdAt), asc(runNotes.id));
}

/** Pilots and leads of the run's crew may add notes. */
export async function addNote(actor: Actor, runId: number, body: string) {
  const { record } = await requireRecordPermission(actor, () => getRun(runId), "writeNote", "Run");
  const [{ id }] = await db().insert(runNotes).values({ runId: record.id, authorId: actor.user.id, body }).$returningId();
  return { id };
}

/** A lead signs the debrief off (who and when are kept), or withdraws a sign-off. */
export async function setSignOff(actor: Actor, runId: number, intent: "sign" | "withdraw") {
  const { record } = await requireRecordPermission(actor, () => getRun(runId), "signOff", "Run");
  if (intent === "sign" && record.status !== "ready") throw new ConflictError("Only a run that has been read and analysed can be signed off");
  const signed = intent === "sign";
  await db()
    .update(runs)
    .set({ signedOffBy: signed ? actor.user.id : null, signedOffAt: signed ? new Date() : null })
    .where(eq(runs.id, record.id));
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: signed ? "run.sign-off" : "run.sign-off-withdrawn", targetType: "run", targetId: record.id });
}
