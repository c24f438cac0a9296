import { HeadBucketCommand, S3Client } from "@aws-sdk/client-s3";
import { env } from "@/lib/env";

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

export function bucket(): string {
  return env().S3_BUCKET;
}

export async function objectStoreReachable(): Promise<boolean> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
    return true;
  } catch {
    return false;
  }
}
