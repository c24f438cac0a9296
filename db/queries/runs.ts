import { and, desc, eq, isNotNull } from "drizzle-orm";
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

/** The run made from an earlier upload of the same bytes into the same crew, if any. */
export async function findRunBySha(crewId: number, sha256: string, exceptUploadId: number) {
  const rows = await db()
    .select({ runId: runs.id, uploadId: uploads.id })
    .from(uploads)
    .innerJoin(runs, eq(runs.uploadId, uploads.id))
    .where(and(eq(uploads.crewId, crewId), eq(uploads.sha256, sha256), isNotNull(uploads.storedAt)))
    .orderBy(desc(runs.id));
  return rows.find((r) => r.uploadId !== exceptUploadId) ?? null;
}
