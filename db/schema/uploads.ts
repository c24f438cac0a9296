import { bigint, char, index, mysqlEnum, mysqlTable, text, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { builds } from "./builds";
import { crews } from "./crews";
import { routePlans } from "./route-plans";
import { createdAt, id, ms, ref } from "./util/columns";
import { users } from "./users";

/** One uploaded file. The object in S3 is kept until its run is deleted, so it can be re-parsed. */
export const uploads = mysqlTable(
  "uploads",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    uploadedBy: ref().references(() => users.id, { onDelete: "set null" }),
    fileName: varchar({ length: 255 }).notNull(),
    sizeBytes: bigint({ mode: "number", unsigned: true }).notNull(),
    contentType: varchar({ length: 120 }).notNull(),
    objectKey: varchar({ length: 512 }).notNull(),
    /** Filled after the object lands; the same hash in the same crew leads to the existing run. */
    sha256: char({ length: 64 }),
    status: mysqlEnum(["pending", "stored", "failed"]).notNull().default("pending"),
    multipartUploadId: varchar({ length: 255 }),
    buildId: ref().references(() => builds.id, { onDelete: "set null" }),
    routePlanId: ref().references(() => routePlans.id, { onDelete: "set null" }),
    note: text(),
    error: text(),
    createdAt: createdAt(),
    storedAt: ms(),
  },
  (t) => [
    uniqueIndex("uploads_object_key_uq").on(t.objectKey),
    index("uploads_crew_sha_idx").on(t.crewId, t.sha256),
  ],
);

export type Upload = typeof uploads.$inferSelect;
