import { asc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { columnMaps } from "@/db/schema";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { isDuplicateKey } from "@/lib/db-errors";
import { ConflictError } from "@/lib/errors";
import type { ColumnMap } from "@/lib/parsers/column-map";

export async function saveColumnMap(actor: Actor, crewId: number, name: string, mapping: ColumnMap): Promise<number> {
  await requireCrewPermission(actor, crewId, "uploadLog", "Crew");
  try {
    const [{ id }] = await db()
      .insert(columnMaps)
      .values({ crewId, name, mapping: mapping as unknown as Record<string, unknown>, createdBy: actor.user.id })
      .$returningId();
    return id;
  } catch (e) {
    if (isDuplicateKey(e)) {
      throw new ConflictError(`The crew already has a column map called “${name}”`);
    }
    throw e;
  }
}

export async function listColumnMaps(actor: Actor, crewId: number) {
  await requireCrewPermission(actor, crewId, "read", "Crew");
  return db()
    .select({ id: columnMaps.id, name: columnMaps.name, mapping: columnMaps.mapping, updatedAt: columnMaps.updatedAt })
    .from(columnMaps)
    .where(eq(columnMaps.crewId, crewId))
    .orderBy(asc(columnMaps.name));
}
