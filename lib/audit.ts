import { db, type Database } from "@/db/client";
import { auditLog } from "@/db/schema";

export interface AuditInput {
  crewId?: number | null;
  actorId?: number | null;
  action: string;
  targetType?: string;
  targetId?: string | number;
  detail?: Record<string, unknown>;
  ip?: string | null;
}

/** Appends one audit entry. Never throws: a failed audit write must not undo the action it records. */
export async function audit(entry: AuditInput, dbx?: Database): Promise<void> {
  try {
    await (dbx ?? db()).insert(auditLog).values({
      crewId: entry.crewId ?? null,
      actorId: entry.actorId ?? null,
      action: entry.action,
      targetType: entry.targetType ?? null,
      targetId: entry.targetId === undefined ? null : String(entry.targetId),
      detail: entry.detail ?? null,
      ip: entry.ip?.slice(0, 64) ?? null,
    });
  } catch (e) {
    // Inside a caller's transaction a failed write may have ended the transaction: the caller decides.
    if (dbx) throw e;
    console.error(`[audit] could not record ${entry.action}: ${(e as Error).message}`);
  }
}
