import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { getRoutePlan } from "@/db/queries/route-plans";
import { findRunBySha, getUpload } from "@/db/queries/runs";
import { runs, uploads } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission, requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { env } from "@/lib/env";
import { ConflictError, ValidationError } from "@/lib/errors";
import { completeMultipart, objectSize, presignPut, readObject, startMultipart } from "@/lib/storage/objects";
import type { ColumnMap } from "@/lib/parsers/column-map";
import type { UploadCreate } from "@/lib/validations/upload";
import { startIngest } from "./ingest-queue";
import { uploadObjectKey } from "./object-key";
import { resolveColumnMap } from "./resolve-column-map";


function megabytes(n: number): string {
  return `${(n / 1024 / 1024).toFixed(n < 10 * 1024 * 1024 ? 1 : 0)} MB`;
}

/** Checks the upload, records it and hands back where the browser should PUT the bytes. */
export async function createUpload(actor: Actor, crewId: number, input: Omit<UploadCreate, "crewId">) {
  await requireCrewPermission(actor, crewId, "uploadLog", "Crew");
  const max = env().UPLOAD_MAX_BYTES;
  if (input.size > max) {
    throw new ValidationError(`“${input.fileName}” is ${megabytes(input.size)}; the upload limit is ${megabytes(max)}`, {
      fields: { size: [`At most ${megabytes(max)}`] },
    });
  }
  // Build and route plan must be the caller's crew's own; another crew's id is just "not found".
  if (input.buildId) await requireRecordPermission(actor, () => getBuild(input.buildId!), "read", "Build");
  if (input.routePlanId) await requireRecordPermission(actor, () => getRoutePlan(input.routePlanId!), "read", "Route plan");
  const objectKey = uploadObjectKey(crewId, input.fileName);
  const contentType = input.contentType || "application/octet-stream";
  // Large files go up in parts, so a dropped connection at the field costs one part, not the file.
  const partSize = env().UPLOAD_PART_BYTES;
  const multipart = input.size >= env().UPLOAD_MULTIPART_BYTES ? await startMultipart(objectKey, contentType, Math.ceil(input.size / partSize)) : null;
  const [{ id }] = await db()
    .insert(uploads)
    .values({
      crewId,
      uploadedBy: actor.user.id,
      fileName: input.fileName,
      sizeBytes: input.size,
      contentType,
      objectKey,
      multipartUploadId: multipart?.uploadId ?? null,
      buildId: input.buildId ?? null,
      routePlanId: input.routePlanId ?? null,
      note: input.note ?? null,
    })
    .$returningId();
  if (multipart) {
    return { uploadId: id, contentType, multipart: { partSize, parts: multipart.urls.map((url, i) => ({ partNumber: i + 1, url })) } };
  }
  return { uploadId: id, contentType, putUrl: await presignPut(objectKey, contentType) };
}

async function sha256OfObject(key: string): Promise<string> {
  const h = createHash("sha256");
  for await (const chunk of await readObject(key)) h.update(chunk as Buffer);
  return h.digest("hex");
}

function titleFor(fileName: string): string {
  return fileName.replace(/\.[a-z0-9]{1,5}$/i, "").slice(0, 160) || "Run";
}

/**
 * After the browser's PUT: checks the object landed whole, hashes it, and either points to the
 * run already made from the same bytes in this crew or creates a run and starts parsing it.
 */
export async function completeUpload(
  actor: Actor,
  uploadId: number,
  input: { columnMapId?: number; columnMap?: ColumnMap; parts?: string[] },
): Promise<{ runId: number; status: string; duplicate: boolean }> {
  const { record: upload } = await requireRecordPermission(actor, () => getUpload(uploadId), "uploadLog", "Upload");
  if (upload.storedAt) {
    const [run] = await db().select({ id: runs.id, status: runs.status }).from(runs).where(eq(runs.uploadId, uploadId));
    if (run) return { runId: run.id, status: run.status, duplicate: false };
  }
  if (upload.multipartUploadId) {
    if (!input.parts?.length) throw new ValidationError("This upload went up in parts; send the parts' ETags to finish it");
    await completeMultipart(upload.objectKey, upload.multipartUploadId, input.parts);
  }
  const size = await objectSize(upload.objectKey);
  if (size === null) throw new ConflictError("The file has not arrived in storage yet; upload it to the address you were given first");
  if (size !== upload.sizeBytes) {
    await db().update(uploads).set({ status: "failed", error: `Stored ${size} bytes, expected ${upload.sizeBytes}` }).where(eq(uploads.id, uploadId));
    throw new ConflictError(`The stored file has ${size} bytes but ${upload.sizeBytes} were announced; upload it again`);
  }
  const columnMap = await resolveColumnMap(actor, upload.crewId, input);
  const sha256 = await sha256OfObject(upload.objectKey);
  await db().update(uploads).set({ sha256, status: "stored", storedAt: new Date() }).where(eq(uploads.id, uploadId));

  const earlier = await findRunBySha(upload.crewId, sha256, uploadId);
  if (earlier) {
    const [run] = await db().select({ status: runs.status }).from(runs).where(eq(runs.id, earlier.runId));
    return { runId: earlier.runId, status: run.status, duplicate: true };
  }
  const [{ id: runId }] = await db()
    .insert(runs)
    .values({
      crewId: upload.crewId,
      uploadId,
      buildId: upload.buildId,
      routePlanId: upload.routePlanId,
      pilotId: actor.user.id,
      title: titleFor(upload.fileName),
      status: "queued",
      columnMap: (columnMap as Record<string, unknown> | undefined) ?? null,
    })
    .$returningId();
  await audit({ crewId: upload.crewId, actorId: actor.user.id, action: "run.uploaded", targetType: "run", targetId: runId, detail: { fileName: upload.fileName, size } });
  startIngest(runId);
  return { runId, status: "queued", duplicate: false };
}
