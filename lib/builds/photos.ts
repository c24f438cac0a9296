import { randomBytes } from "node:crypto";
import { GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild, getBuildPhoto, listBuildPhotos } from "@/db/queries/builds";
import { buildChanges, buildPhotos } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { ConflictError, NotFoundError, ValidationError } from "@/lib/errors";
import { safeFileName } from "@/lib/ingest/object-key";
import { deleteObject, objectSize, PRESIGN_TTL_S, readObject } from "@/lib/storage/objects";
import { bucket, s3ForBrowser } from "@/lib/storage/s3";
import { PHOTO_MAX_BYTES, type photoCreateSchema } from "@/lib/validations/build";
import type { z } from "zod";

/** Photo links shown on the page expire quickly; a reload signs new ones. */
export const PHOTO_VIEW_TTL_S = 5 * 60;

type PhotoType = "image/jpeg" | "image/png" | "image/webp";

/** The first bytes each accepted type starts with (JPEG SOI; PNG signature; RIFF….WEBP). */
export function imageTypeOf(head: Uint8Array): PhotoType | null {
  const b = head;
  if (b.length >= 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return "image/jpeg";
  if (b.length >= 8 && [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a].every((v, i) => b[i] === v)) return "image/png";
  const ascii = (from: number, to: number) => String.fromCharCode(...b.subarray(from, to));
  if (b.length >= 12 && ascii(0, 4) === "RIFF" && ascii(8, 12) === "WEBP") return "image/webp";
  return null;
}

const requireLead = (actor: Actor, buildId: number) => requireRecordPermission(actor, () => getBuild(buildId), "manageBuilds", "Build");

/**
 * Lead-only. Records the photo and returns a presigned PUT bound to the declared size (the store
 * refuses another length) and type; the complete step checks both again.
 */
export async function createPhotoUpload(actor: Actor, buildId: number, input: z.infer<typeof photoCreateSchema>) {
  const { record } = await requireLead(actor, buildId);
  const objectKey = `crews/${record.crewId}/builds/${buildId}/photos/${randomBytes(12).toString("hex")}/${safeFileName(input.fileName)}`;
  const [{ id }] = await db()
    .insert(buildPhotos)
    .values({ buildId, uploadedBy: actor.user.id, objectKey, fileName: input.fileName.slice(0, 160), contentType: input.contentType, sizeBytes: input.size, caption: input.caption ?? null })
    .$returningId();
  const putUrl = await getSignedUrl(
    s3ForBrowser(),
    new PutObjectCommand({ Bucket: bucket(), Key: objectKey, ContentType: input.contentType, ContentLength: input.size }),
    { expiresIn: PRESIGN_TTL_S },
  );
  return { photoId: id, putUrl, contentType: input.contentType, maxBytes: PHOTO_MAX_BYTES };
}

async function headBytes(key: string, n: number): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  for await (const c of await readObject(key, { start: 0, end: n - 1 })) chunks.push(c as Buffer);
  return new Uint8Array(Buffer.concat(chunks));
}

/** Drops a photo that failed its checks, object and row. */
async function discard(photo: { id: number; objectKey: string }) {
  await deleteObject(photo.objectKey).catch(() => {});
  await db().delete(buildPhotos).where(eq(buildPhotos.id, photo.id));
}

/**
 * After the browser's PUT: the object must be there, at most 10 MB and the declared size, and
 * start like the declared image type. Otherwise it is deleted and the request refused.
 */
export async function completePhotoUpload(actor: Actor, buildId: number, photoId: number) {
  const { record } = await requireLead(actor, buildId);
  const photo = await getBuildPhoto(photoId);
  if (!photo || photo.buildId !== buildId) throw new NotFoundError("Photo");
  if (photo.storedAt) return { photoId, stored: true };
  const size = await objectSize(photo.objectKey);
  if (size === null) throw new ConflictError("The photo has not arrived in storage yet; upload it to the address you were given first");
  if (size > PHOTO_MAX_BYTES || size !== photo.sizeBytes) {
    await discard(photo);
    throw new ValidationError(size > PHOTO_MAX_BYTES ? "Photos are limited to 10 MB" : `The stored photo has ${size} bytes but ${photo.sizeBytes} were announced`, {
      fields: { size: ["At most 10 MB, and the size announced"] },
    });
  }
  const kind = imageTypeOf(await headBytes(photo.objectKey, 12));
  if (kind !== photo.contentType) {
    await discard(photo);
    throw new ValidationError("The file is not a JPEG, PNG or WebP image of the type announced", { fields: { contentType: ["Upload a JPEG, PNG or WebP image"] } });
  }
  await db().transaction(async (tx) => {
    await tx.update(buildPhotos).set({ storedAt: new Date() }).where(eq(buildPhotos.id, photoId));
    await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes: { photo: { from: null, to: photo.fileName } } });
  });
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.photo-added", targetType: "build", targetId: buildId, detail: { photoId } });
  return { photoId, stored: true };
}

export async function deletePhoto(actor: Actor, buildId: number, photoId: number): Promise<void> {
  const { record } = await requireLead(actor, buildId);
  const photo = await getBuildPhoto(photoId);
  if (!photo || photo.buildId !== buildId) throw new NotFoundError("Photo");
  await db().transaction(async (tx) => {
    await tx.delete(buildPhotos).where(eq(buildPhotos.id, photoId));
    if (photo.storedAt) await tx.insert(buildChanges).values({ buildId, changedBy: actor.user.id, changes: { photo: { from: photo.fileName, to: null } } });
  });
  await deleteObject(photo.objectKey).catch(() => {});
  await audit({ crewId: record.crewId, actorId: actor.user.id, action: "build.photo-removed", targetType: "build", targetId: buildId, detail: { photoId } });
}

/** A short-lived link that shows the image in the page (inline, with its own type). */
function viewUrl(key: string, contentType: string): Promise<string> {
  return getSignedUrl(
    s3ForBrowser(),
    new GetObjectCommand({ Bucket: bucket(), Key: key, ResponseContentType: contentType, ResponseContentDisposition: "inline" }),
    { expiresIn: PHOTO_VIEW_TTL_S },
  );
}

export interface PhotoView {
  id: number;
  fileName: string;
  caption: string | null;
  url: string;
  createdAt: Date;
}

/** Stored photos with view links; the caller has checked read access. */
export async function photoViews(buildId: number): Promise<PhotoView[]> {
  const rows = await listBuildPhotos(buildId);
  return Promise.all(rows.map(async (p) => ({ id: p.id, fileName: p.fileName, caption: p.caption, createdAt: p.createdAt, url: await viewUrl(p.objectKey, p.contentType) })));
}

/** Read access (observers too): the photos with view links. */
export async function listPhotos(actor: Actor, buildId: number): Promise<PhotoView[]> {
  await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  return photoViews(buildId);
}
