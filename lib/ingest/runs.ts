import { and, eq, notInArray } from "drizzle-orm";
import { db } from "@/db/client";
import { getRun, getRunWithUpload } from "@/db/queries/runs";
import { runs } from "@/db/schema";
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
import { enqueueIngest } from "@/lib/jobs/enqueue";
import { resolveColumnMap } from "./resolve-column-map";

/** The run as the API and the status page show it. */
const loadRun = (runId: number) => () => getRunWithUpload(runId).then((r) => r && { ...r, crewId: r.run.crewId });

export async function viewRun(actor: Actor, runId: number) {
  const { record, access } = await requireRecordPermission(actor, loadRun(runId), "read", "Run");
  const { run, upload } = record;
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
    upload: { id: upload.id, fileName: upload.fileName, sizeBytes: upload.sizeBytes, sha256: upload.sha256, note: upload.note },
  };
}

export type RunView = Awaited<ReturnType<typeof viewRun>>;

/** Pilots may re-parse their own runs, leads any run of the crew. */
async function requireRunEdit(actor: Actor, runId: number) {
  const { record, access } = await requireRecordPermission(actor, () => getRun(runId), "editOwnRun", "Run");
  if (!can(access.role, "delete") && record.pilotId !== actor.user.id) throw new ForbiddenError("Only the run's pilot or a lead can re-parse it");
  return record;
}

/** Parses the stored original again, optionally with another column map; the old samples are replaced atomically. */
export async function reparseRun(actor: Actor, runId: number, input: { columnMapId?: number; columnMap?: ColumnMap }) {
  const run = await requireRunEdit(actor, runId);
  const busy = "This run is being read right now; wait for it to finish";
  const columnMap = await resolveColumnMap(actor, run.crewId, input);
  // Conditional, so two re-parse requests cannot both queue the run.
  const [claim] = await db()
    .update(runs)
    .set({ status: "queued", progress: 0, error: null, ...(columnMap ? { columnMap: columnMap as unknown as Record<string, unknown> } : {}) })
    .where(and(eq(runs.id, runId), notInArray(runs.status, ["queued", "parsing", "analysing"])));
  if ((claim as unknown as { affectedRows: number }).affectedRows === 0) throw new ConflictError(busy);
  await audit({ crewId: run.crewId, actorId: actor.user.id, action: "run.reparsed", targetType: "run", targetId: runId });
  await enqueueIngest(runId);
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
