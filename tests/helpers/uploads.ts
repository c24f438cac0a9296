import { expect } from "vitest";
import type { Client } from "./http";

export interface Uploaded {
  uploadId: number;
  runId: number;
  duplicate: boolean;
}

/** The browser's path: create the upload, PUT the bytes to the presigned URL, complete. */
export async function uploadLog(
  client: Client,
  fileName: string,
  body: Buffer | string,
  opts: { contentType?: string; crewId?: number; columnMap?: unknown; buildId?: number; routePlanId?: number } = {},
): Promise<Uploaded> {
  const bytes = typeof body === "string" ? Buffer.from(body, "utf8") : body;
  const created = await client.post("/api/uploads", {
    crewId: opts.crewId,
    fileName,
    size: bytes.length,
    contentType: opts.contentType ?? "text/csv",
    buildId: opts.buildId,
    routePlanId: opts.routePlanId,
  });
  expect(created.status, await created.clone().text()).toBe(201);
  const { uploadId, putUrl, contentType } = (await created.json()) as { uploadId: number; putUrl: string; contentType: string };
  const put = await fetch(putUrl, { method: "PUT", body: new Uint8Array(bytes), headers: { "content-type": contentType } });
  expect(put.status).toBe(200);
  const done = await client.post(`/api/uploads/${uploadId}/complete`, opts.columnMap ? { columnMap: opts.columnMap } : {});
  expect(done.status, await done.clone().text()).toBe(200);
  const { runId, duplicate } = (await done.json()) as { runId: number; duplicate: boolean };
  return { uploadId, runId, duplicate };
}

export interface RunJson {
  id: number;
  status: string;
  progress: number;
  format: string | null;
  sampleCount: number;
  durationS: number | null;
  startedAt: string | null;
  warnings: { code: string; message: string; line?: number; column?: string; count?: number }[];
  error: string | null;
  columnMap: { columns: { header: string; field: string; unit?: string }[] } | null;
}

/** Polls the run until it is ready or failed (bounded: 25 s unless told). */
export async function settledRun(client: Client, runId: number, timeoutMs = 25_000): Promise<RunJson> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await client.get(`/api/runs/${runId}`);
    expect(res.status).toBe(200);
    const { run } = (await res.json()) as { run: RunJson };
    if (run.status === "ready" || run.status === "failed") return run;
    if (Date.now() > deadline) throw new Error(`run ${runId} still ${run.status} after ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
