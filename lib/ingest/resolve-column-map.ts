import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { columnMaps } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { NotFoundError } from "@/lib/errors";
import { columnMapSchema, type ColumnMap } from "@/lib/parsers/column-map";

/** A column map given inline, or a saved one of the same crew (another crew's id is not found). */
export async function resolveColumnMap(
  _actor: Actor,
  crewId: number,
  input: { columnMapId?: number; columnMap?: ColumnMap },
): Promise<ColumnMap | undefined> {
  if (input.columnMap) return input.columnMap;
  if (!input.columnMapId) return undefined;
  const [row] = await db()
    .select({ mapping: columnMaps.mapping })
    .from(columnMaps)
    .where(and(eq(columnMaps.id, input.columnMapId), eq(columnMaps.crewId, crewId)));
  if (!row) throw new NotFoundError("Column map");
  return columnMapSchema.parse(row.mapping);
}
