import { Readable } from "node:stream";
import {
  AbortMultipartUploadCommand,
  CompleteMultipartUploadCommand,
  CreateMultipartUploadCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  PutObjectCommand,
  UploadPartCommand,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { bucket, s3ForBrowser, storageCall } from "./s3";

/** Presigned URLs are short-lived and bound to one key (and, for PUT, its content type). */
export const PRESIGN_TTL_S = 15 * 60;

export function presignPut(key: string, contentType: string): Promise<string> {
  return getSignedUrl(s3ForBrowser(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType }), { expiresIn: PRESIGN_TTL_S });
}

export function presignGet(key: string, downloadName: string): Promise<string> {
  const safe = downloadName.replace(/[^\w.\- ]+/g, "_");
  return getSignedUrl(
    s3ForBrowser(),
    new GetObjectCommand({ Bucket: bucket(), Key: key, ResponseContentDisposition: `attachment; filename="${safe}"` }),
    { expiresIn: PRESIGN_TTL_S },
  );
}

export async function startMultipart(key: string, contentType: string, parts: number): Promise<{ uploadId: string; urls: string[] }> {
  const { UploadId } = await storageCall((c) => c.send(new CreateMultipartUploadCommand({ Bucket: bucket(), Key: key, ContentType: contentType })));
  const urls = await Promise.all(
    Array.from({ length: parts }, (_, i) =>
      getSignedUrl(s3ForBrowser(), new UploadPartCommand({ Bucket: bucket(), Key: key, UploadId, PartNumber: i + 1 }), { expiresIn: 6 * 3600 }),
    ),
  );
  return { uploadId: UploadId!, urls };
}

export async function completeMultipart(key: string, uploadId: string, etags: string[]): Promise<void> {
  await storageCall((c) => c.send(
    new CompleteMultipartUploadCommand({
      Bucket: bucket(),
      Key: key,
      UploadId: uploadId,
      MultipartUpload: { Parts: etags.map((ETag, i) => ({ ETag, PartNumber: i + 1 })) },
    }),
  ));
}

export async function abortMultipart(key: string, uploadId: string): Promise<void> {
  await storageCall((c) => c.send(new AbortMultipartUploadCommand({ Bucket: bucket(), Key: key, UploadId: uploadId }))).catch(() => {});
}

/** Size of the stored object, or null when it is not there (yet). */
export async function objectSize(key: string): Promise<number | null> {
  try {
    const h = await storageCall((c) => c.send(new HeadObjectCommand({ Bucket: bucket(), Key: key })));
    return h.ContentLength ?? 0;
  } catch (e) {
    const status = (e as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
    if (status === 404 || (e as Error).name === "NotFound") return null;
    throw e;
  }
}

/** Streams an object's bytes (optionally a byte range, inclusive). */
export async function readObject(key: string, range?: { start: number; end: number }): Promise<Readable> {
  const r = await storageCall((c) => c.send(
    new GetObjectCommand({ Bucket: bucket(), Key: key, Range: range ? `bytes=${range.start}-${range.end}` : undefined }),
  ));
  return r.Body as Readable;
}

export async function putObject(key: string, body: Buffer | string, contentType: string): Promise<void> {
  await storageCall((c) => c.send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType })));
}

export async function deleteObject(key: string): Promise<void> {
  await storageCall((c) => c.send(new DeleteObjectCommand({ Bucket: bucket(), Key: key })));
}
