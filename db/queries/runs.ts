import { and, asc, desc, eq, isNotNull } from "drizzle-orm";
import { db } from "@/db/client";
import { runs, uploads } from "@/db/schema";

export async function getRun(id: number) {
  const [row] = await db().select().from(runs).where(eq(runs.id, id)).limit(1);
  return row ?? null;
}

export async function getRunWithUpload(id: number) {
  const [row] = await db().select({ run: runs, upload: uploads }).from(runs).innerJoin(uploads, eq(uploads.id, runs.uploadId)).where(eq(runs.id, id)).limit(1);
  return row ?? null;
}

export async function getUpload(id: number) {
  const [row] = await db().select().from(uploads).where(eq(uploads.id, id)).limit(1);
  return row ?? null;
}

/**
 * Every run made from one upload, in part order: one for most files, one per part for a file
 * holding several separate runs. The caller has checked access to one of them (same crew).
 */
export async function listUploadParts(uploadId: number) {
  return db()
    .select({
      id: runs.id,
      part: runs.part,
      title: runs.title,
      status: runs.status,
      verdict: runs.verdict,
      durationS: runs.durationS,
      startedAt: runs.startedAt,
    })
    .from(runs)
    .where(eq(runs.uploadId, uploadId))
    .orderBy(asc(runs.part));
}

export type UploadPart = Awaited<ReturnType<typeof listUploadParts>>[number];

/** The run (part 1) made from an earlier upload of the same bytes into the same crew, if any. */
export async function findRunBySha(crewId: number, sha256: string, exceptUploadId: number) {
  const rows = await db()
    .select({ runId: runs.id, uploadId: uploads.id })
    .from(uploads)
    .innerJoin(runs, and(eq(runs.uploadId, uploads.id), eq(runs.part, 1)))
    .where(and(eq(uploads.crewId, crewId), eq(uploads.sha256, sha256), isNotNull(uploads.storedAt)))
    .orderBy(desc(runs.id));
  return rows.find((r) => r.uploadId !== exceptUploadId) ?? null;
}
