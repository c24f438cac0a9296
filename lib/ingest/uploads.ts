import { createHash } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { getRoutePlan } from "@/db/queries/route-plans";
import { findRunBySha, getUpload } from "@/db/queries/runs";
import { runs, uploads } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission, requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { env } from "@/lib/env";
import { can } from "@/lib/auth/roles";
import { isDuplicateKey } from "@/lib/db-errors";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "@/lib/errors";
import { completeMultipart, objectSize, presignPut, readObject, startMultipart } from "@/lib/storage/objects";
import type { ColumnMap } from "@/lib/parsers/column-map";
import type { UploadCreate } from "@/lib/validations/upload";
import { enqueueIngest } from "@/lib/jobs/enqueue";
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
  // Build and route plan must belong to the upload's crew; anything else is just "not found".
  const sameCrew = async <T extends { crewId: number }>(load: () => Promise<T | null>, what: string) => {
    const { record } = await requireRecordPermission(actor, load, "read", what);
    if (record.crewId !== crewId) throw new NotFoundError(what);
    return record;
  };
  if (input.buildId) {
    const build = await sameCrew(() => getBuild(input.buildId!), "Build");
    // As when moving a run: new evidence goes to builds in service (the form only offers those).
    if (build.retiredAt) throw new ValidationError("That build is retired; bring it back first", { fields: { buildId: ["Choose a build in service"] } });
  }
  if (input.routePlanId) await sameCrew(() => getRoutePlan(input.routePlanId!), "Route plan");
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

/** The run this upload already has, or the run of an earlier upload of the same bytes in the crew. */
async function existingResult(uploadId: number, crewId: number, sha256: string | null) {
  // Part 1 is the run the upload created; a file holding several runs lists the others with it.
  const [own] = await db().select({ id: runs.id, status: runs.status }).from(runs).where(and(eq(runs.uploadId, uploadId), eq(runs.part, 1)));
  if (own) return { runId: own.id, status: own.status, duplicate: false };
  const earlier = sha256 ? await findRunBySha(crewId, sha256, uploadId) : null;
  if (!earlier) return null;
  const [run] = await db().select({ status: runs.status }).from(runs).where(eq(runs.id, earlier.runId));
  return { runId: earlier.runId, status: run.status, duplicate: true };
}

function titleFor(fileName: string): string {
  // A name that is a path ("../../x.csv", "/tmp/x.csv", "C:\\logs\\x.csv") gives its last segment;
  // any other name is kept as written, slashes and all (they are text, e.g. "</b>" or a URL).
  const isPath = /^(?:[a-z]:)?[\\/]|(?:^|[\\/])\.{1,2}[\\/]/i.test(fileName);
  const base = isPath ? (fileName.split(/[\\/]/).filter(Boolean).pop() ?? "") : fileName;
  return base.replace(/\.[a-z0-9]{1,5}$/i, "").slice(0, 160) || "Run";
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
  const { record: upload, access } = await requireRecordPermission(actor, () => getUpload(uploadId), "uploadLog", "Upload");
  if (upload.uploadedBy !== actor.user.id && !can(access.role, "delete")) throw new ForbiddenError("Only the person who uploaded the file or a lead can finish this upload");
  if (upload.storedAt) {
    const settled = await existingResult(upload.id, upload.crewId, upload.sha256);
    if (settled) return settled;
  }
  // A retry after the parts were joined finds the whole object already there.
  if (upload.multipartUploadId && (await objectSize(upload.objectKey)) !== upload.sizeBytes) {
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
  // Claim the upload: of two completes racing, only one gets past this.
  const [claim] = await db()
    .update(uploads)
    .set({ sha256, status: "stored", storedAt: new Date() })
    .where(and(eq(uploads.id, uploadId), isNull(uploads.storedAt)));
  if ((claim as unknown as { affectedRows: number }).affectedRows === 0 && !upload.storedAt) {
    const settled = await existingResult(upload.id, upload.crewId, sha256);
    if (settled) return settled;
    throw new ConflictError("This upload is being finished by another request; ask for the run in a moment");
  }
  const earlier = await existingResult(upload.id, upload.crewId, sha256);
  if (earlier) return earlier;
  let runId: number;
  try {
    [{ id: runId }] = await db()
    .insert(runs)
    .values({
      crewId: upload.crewId,
      uploadId,
      buildId: upload.buildId,
      routePlanId: upload.routePlanId,
      pilotId: upload.uploadedBy ?? actor.user.id,
      title: titleFor(upload.fileName),
      status: "queued",
      columnMap: (columnMap as Record<string, unknown> | undefined) ?? null,
    })
    .$returningId();
  } catch (e) {
    if (!isDuplicateKey(e)) throw e;
    return (await existingResult(upload.id, upload.crewId, sha256))!;
  }
  await audit({ crewId: upload.crewId, actorId: actor.user.id, action: "run.uploaded", targetType: "run", targetId: runId, detail: { fileName: upload.fileName, size } });
  await enqueueIngest(runId);
  return { runId, status: "queued", duplicate: false };
}
