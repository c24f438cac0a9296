import { HeadBucketCommand, S3Client } from "@aws-sdk/client-s3";
import { isDatabaseDown as isConnectionFault } from "@/lib/api/database-down";
import { env } from "@/lib/env";
import { StorageUnavailableError } from "@/lib/errors";

const g = globalThis as unknown as { sortieS3?: S3Client; sortieS3Public?: S3Client };

function makeClient(endpoint: string | undefined): S3Client {
  const e = env();
  return new S3Client({
    region: e.S3_REGION,
    endpoint,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    // Without these the SDK frames streamed bodies as aws-chunked and signs an empty-body
    // checksum into presigned PUTs; s3rver stores the framing, real S3 rejects the checksum.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
}

/** Server-side client (S3_ENDPOINT; unset means AWS itself). */
export function s3(): S3Client {
  return (g.sortieS3 ??= makeClient(env().S3_ENDPOINT));
}

/** Client for URLs handed to browsers, when they reach the store by another address. */
export function s3ForBrowser(): S3Client {
  const e = env();
  if (!e.S3_PUBLIC_ENDPOINT) return s3();
  return (g.sortieS3Public ??= makeClient(e.S3_PUBLIC_ENDPOINT));
}

/**
 * Runs one call on the object store; a store that is down becomes a 503 with a plain message
 * (after the SDK's own retries), never a stack trace or a "database" error.
 */
export async function storageCall<T>(call: (client: S3Client) => Promise<T>): Promise<T> {
  try {
    return await call(s3());
  } catch (e) {
    if (isConnectionFault(e) || (e as Error)?.name === "TimeoutError") throw new StorageUnavailableError(e);
    throw e;
  }
}

export function bucket(): string {
  return env().S3_BUCKET;
}

export async function objectStoreReachable(): Promise<boolean> {
  try {
    await storageCall((c) => c.send(new HeadBucketCommand({ Bucket: bucket() })));
    return true;
  } catch {
    return false;
  }
}
