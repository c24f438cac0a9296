import { customType, int, mysqlEnum, mysqlTable, primaryKey, varchar } from "drizzle-orm/mysql-core";
import { ref } from "./util/columns";

const longblob = customType<{ data: Buffer }>({ dataType: () => "longblob" });

export const seriesBlobKinds = ["meta", "tindex", "level", "raw", "points", "presence", "track"] as const;

/**
 * Display levels of a run's samples (lib/series/levels.ts): min/max pyramids, the track overview,
 * a scatter sample and derived per-sample values, as little-endian typed arrays in chunks. Written
 * in the ingest transaction with the samples. No foreign key, like samples: whoever deletes a
 * run's samples deletes these too.
 */
export const seriesLevels = mysqlTable(
  "series_levels",
  {
    runId: ref().notNull(),
    kind: mysqlEnum(seriesBlobKinds).notNull(),
    /** Samples per bucket for kind "level", 1 for per-sample "raw", 0 otherwise. */
    bucketSize: int({ unsigned: true }).notNull(),
    /** A series field, or an internal array ("_tFirst", "_seq", …). */
    field: varchar({ length: 32 }).notNull(),
    chunk: int({ unsigned: true }).notNull(),
    data: longblob().notNull(),
  },
  (t) => [primaryKey({ name: "series_levels_pk", columns: [t.runId, t.kind, t.bucketSize, t.field, t.chunk] })],
);
