import { apiJson, putWithProgress } from "./put-with-progress";
import type { UploadRunLink } from "./run-parts";

export interface UploadOptions {
  crewId: number;
  buildId?: number;
  routePlanId?: number;
  columnMapId?: number;
  note?: string;
}

export type UploadPhase =
  | { phase: "waiting" }
  | { phase: "sending"; sent: number }
  | { phase: "parsing"; runId: number; progress: number }
  | {
      phase: "done";
      runId: number;
      status: "ready" | "failed";
      duplicate: boolean;
      message?: string;
      /** Every run made from the file (one per part when it held several separate runs). */
      runs: UploadRunLink[];
    }
  | { phase: "error"; message: string };

interface CreateAnswer {
  uploadId: number;
  contentType: string;
  putUrl?: string;
  multipart?: { partSize: number; parts: { partNumber: number; url: string }[] };
}

interface RunAnswer {
  run: { status: string; progress: number; error: string | null; upload: { runs: UploadRunLink[] } };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Sends one file straight to storage, finishes the upload and follows parsing until the run settles. */
export async function uploadOne(file: File, opts: UploadOptions, report: (p: UploadPhase) => void): Promise<void> {
  try {
    const created = await apiJson<CreateAnswer>("/api/uploads", {
      method: "POST",
      body: { crewId: opts.crewId, fileName: file.name, size: file.size, contentType: file.type, buildId: opts.buildId, routePlanId: opts.routePlanId, note: opts.note || undefined },
    });
    report({ phase: "sending", sent: 0 });
    let parts: string[] | undefined;
    if (created.multipart) {
      parts = [];
      let done = 0;
      for (const p of created.multipart.parts) {
        const start = (p.partNumber - 1) * created.multipart.partSize;
        const blob = file.slice(start, start + created.multipart.partSize);
        const { etag } = await putWithProgress(p.url, blob, null, (n) => report({ phase: "sending", sent: done + n }));
        if (!etag) throw new Error("Storage did not confirm a part (no ETag)");
        parts.push(etag);
        done += blob.size;
      }
    } else {
      await putWithProgress(created.putUrl!, file, created.contentType, (n) => report({ phase: "sending", sent: n }));
    }
    report({ phase: "sending", sent: file.size });
    const done = await apiJson<{ runId: number; status: string; duplicate: boolean }>(`/api/uploads/${created.uploadId}/complete`, {
      method: "POST",
      body: { columnMapId: opts.columnMapId, parts },
    });
    for (;;) {
      const { run } = await apiJson<RunAnswer>(`/api/runs/${done.runId}`);
      if (run.status === "ready" || run.status === "failed") {
        report({ phase: "done", runId: done.runId, status: run.status, duplicate: done.duplicate, message: run.error ?? undefined, runs: run.upload.runs });
        return;
      }
      report({ phase: "parsing", runId: done.runId, progress: run.progress });
      await sleep(500);
    }
  } catch (e) {
    report({ phase: "error", message: (e as Error).message });
  }
}
