import { getRun, getRunWithUpload, listUploadParts } from "@/db/queries/runs";
import { audit } from "@/lib/audit";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { can } from "@/lib/auth/roles";
import { ConflictError, ForbiddenError } from "@/lib/errors";
import type { ColumnMap } from "@/lib/parsers/column-map";
import { sniffCsv } from "@/lib/parsers/csv-sniff";
import { detectFormat } from "@/lib/parsers/detect-format";
import { ParseError } from "@/lib/parsers/types";
import { presignGet, readObject } from "@/lib/storage/objects";
import { queueUploadOfRun } from "./queue-upload";
import { resolveColumnMap } from "./resolve-column-map";

/** The run as the API and the status page show it. */
const loadRun = (runId: number) => () => getRunWithUpload(runId).then((r) => r && { ...r, crewId: r.run.crewId });

export async function viewRun(actor: Actor, runId: number) {
  const { record, access } = await requireRecordPermission(actor, loadRun(runId), "read", "Run");
  const { run, upload } = record;
  // The other runs of the same file are in the same crew, so the read check above covers them.
  const parts = await listUploadParts(upload.id);
  return {
    id: run.id,
    /** The caller's role in the run's own crew (not in whichever crew is active). */
    viewerRole: access.role,
    mayEdit: can(access.role, "delete") || (can(access.role, "editOwnRun") && run.pilotId === actor.user.id),
    crewId: run.crewId,
    title: run.title,
    status: run.status,
    progress: run.progress,
    format: run.format,
    sampleCount: run.sampleCount,
    durationS: run.durationS,
    startedAt: run.startedAt,
    warnings: run.warnings ?? [],
    error: run.error,
    columnMap: run.columnMap,
    summary: run.summary,
    buildId: run.buildId,
    routePlanId: run.routePlanId,
    pilotId: run.pilotId,
    createdAt: run.createdAt,
    /** Which run of its upload this is (1 unless the file held several separate runs). */
    part: run.part,
    upload: {
      id: upload.id,
      fileName: upload.fileName,
      sizeBytes: upload.sizeBytes,
      sha256: upload.sha256,
      note: upload.note,
      /** Every run made from the file, in part order (this one included). */
      runs: parts.map((p) => ({ id: p.id, part: p.part, status: p.status, verdict: p.verdict, durationS: p.durationS, startedAt: p.startedAt })),
    },
  };
}

export type RunView = Awaited<ReturnType<typeof viewRun>>;

/** Pilots may re-parse their own runs, leads any run of the crew. */
async function requireRunEdit(actor: Actor, runId: number) {
  const { record, access } = await requireRecordPermission(actor, () => getRun(runId), "editOwnRun", "Run");
  if (!can(access.role, "delete") && record.pilotId !== actor.user.id) throw new ForbiddenError("Only the run's pilot or a lead can re-parse it");
  return record;
}

/**
 * Parses the stored original again, optionally with another column map; the old samples are
 * replaced atomically. A file holding several runs is read again as a whole: every part is updated.
 */
export async function reparseRun(actor: Actor, runId: number, input: { columnMapId?: number; columnMap?: ColumnMap }) {
  const run = await requireRunEdit(actor, runId);
  const busy = "This run is being read right now; wait for it to finish";
  const columnMap = await resolveColumnMap(actor, run.crewId, input);
  // Conditional, so two re-parse requests cannot both queue the upload. The column map is the
  // file's, so every part of it takes the new one.
  const queued = await queueUploadOfRun(runId, columnMap ? { setAll: { columnMap: columnMap as unknown as Record<string, unknown> } } : {});
  if (!queued) throw new ConflictError(busy);
  await audit({ crewId: run.crewId, actorId: actor.user.id, action: "run.reparsed", targetType: "run", targetId: runId });
  return { runId, status: "queued" as const };
}

/** First rows of a CSV log with the detected column map, for the column-map form. */
export async function previewRun(actor: Actor, runId: number) {
  const { record } = await requireRecordPermission(actor, loadRun(runId), "read", "Run");
  const end = Math.min(record.upload.sizeBytes, 64 * 1024) - 1;
  const chunks: Buffer[] = [];
  for await (const c of await readObject(record.upload.objectKey, { start: 0, end })) chunks.push(c as Buffer);
  const head = Buffer.concat(chunks).toString("utf8");
  try {
    const format = detectFormat(head, record.upload.fileName);
    if (format !== "csv") return { format, csv: null };
    return { format, csv: sniffCsv(head) };
  } catch (e) {
    if (e instanceof ParseError) return { format: null, csv: null, error: e.describe() };
    throw e;
  }
}

/** A short-lived download link for the original file, exactly as uploaded. */
export async function originalDownloadUrl(actor: Actor, runId: number): Promise<string> {
  const { record } = await requireRecordPermission(actor, loadRun(runId), "read", "Run");
  await audit({ crewId: record.run.crewId, actorId: actor.user.id, action: "run.original-downloaded", targetType: "run", targetId: runId });
  return presignGet(record.upload.objectKey, record.upload.fileName);
}
