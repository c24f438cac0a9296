import { and, count, desc, eq, inArray, isNull, or, sql, type SQL } from "drizzle-orm";
import { z } from "zod";
import { db } from "@/db/client";
import { auditLog, memberships, users } from "@/db/schema";

export const AUDIT_PER_PAGE = 50;

/** ?page=&action= from the page URL or the API; anything unreadable falls back to page 1, no filter. */
export const auditQuerySchema = z.object({
  page: z.coerce.number().int().min(1).max(100_000).catch(1),
  action: z
    .string()
    .max(64)
    .regex(/^[a-z0-9.\-]+$/)
    .optional()
    .catch(undefined)
    .transform((v) => v || undefined),
});
export type AuditQuery = z.infer<typeof auditQuerySchema>;

export function readAuditQuery(params: Record<string, string | string[] | undefined>): AuditQuery {
  const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  return auditQuerySchema.parse({ page: one(params.page), action: one(params.action) });
}

/**
 * What a crew's leads review (ASVS V7.1.3, V7.2.1, V7.2.2): the crew's own entries, plus the
 * account entries without a crew (sign-ins, failed sign-ins, password resets, API tokens) of the
 * people who are members now, by actor or by the account they targeted.
 */
function crewScope(crewId: number): SQL {
  const memberIds = db().select({ id: memberships.userId }).from(memberships).where(eq(memberships.crewId, crewId));
  const memberIdText = db()
    .select({ id: sql<string>`CAST(${memberships.userId} AS CHAR)` })
    .from(memberships)
    .where(eq(memberships.crewId, crewId));
  return or(
    eq(auditLog.crewId, crewId),
    and(isNull(auditLog.crewId), or(inArray(auditLog.actorId, memberIds), and(eq(auditLog.targetType, "user"), inArray(auditLog.targetId, memberIdText)))),
  )!;
}

/** One page of the crew's audit log, newest first, with the actor's name. */
export async function listAuditPage(crewId: number, q: AuditQuery) {
  const where = q.action ? and(crewScope(crewId), eq(auditLog.action, q.action))! : crewScope(crewId);
  const [rows, [{ n }]] = await Promise.all([
    db()
      .select({
        id: auditLog.id,
        createdAt: auditLog.createdAt,
        action: auditLog.action,
        actorId: auditLog.actorId,
        actorName: users.name,
        targetType: auditLog.targetType,
        targetId: auditLog.targetId,
        detail: auditLog.detail,
        ip: auditLog.ip,
      })
      .from(auditLog)
      .leftJoin(users, eq(users.id, auditLog.actorId))
      .where(where)
      .orderBy(desc(auditLog.createdAt), desc(auditLog.id))
      .limit(AUDIT_PER_PAGE)
      .offset((q.page - 1) * AUDIT_PER_PAGE),
    db().select({ n: count() }).from(auditLog).where(where),
  ]);
  return { entries: rows, total: n, page: q.page, pages: Math.max(1, Math.ceil(n / AUDIT_PER_PAGE)) };
}

/** The actions that occur in the crew's log, for the filter. */
export async function listAuditActions(crewId: number): Promise<string[]> {
  const rows = await db().selectDistinct({ action: auditLog.action }).from(auditLog).where(crewScope(crewId)).orderBy(auditLog.action);
  return rows.map((r) => r.action);
}
