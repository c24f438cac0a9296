import { double, float, index, int, json, mysqlEnum, mysqlTable, primaryKey, smallint, text, tinyint, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
import { crews } from "./crews";
import { createdAt, id, lifecycleDates, ms, ref } from "./util/columns";
import { users } from "./users";

export const vehicleTypes = ["ground", "multirotor", "fixed-wing", "boat"] as const;
export type VehicleType = (typeof vehicleTypes)[number];

export const failsafeActions = ["return-to-home", "hold", "land"] as const;
export type FailsafeAction = (typeof failsafeActions)[number];

export const channelFunctions = [
  "roll", "pitch", "throttle", "yaw", "arm", "return-to-home", "mission", "mode", "rssi", "aux", "unused",
] as const;
export type ChannelFunction = (typeof channelFunctions)[number];

export const builds = mysqlTable(
  "builds",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    name: varchar({ length: 120 }).notNull(),
    vehicleType: mysqlEnum(vehicleTypes).notNull(),
    frame: varchar({ length: 120 }),
    flightController: varchar({ length: 120 }),
    firmware: varchar({ length: 120 }),
    firmwareVersion: varchar({ length: 60 }),
    receiver: varchar({ length: 120 }),
    transmitter: varchar({ length: 120 }),
    bandMhz: double(),
    txPowerMw: float(),
    rxSensitivityDbm: float(),
    antennas: varchar({ length: 200 }),
    batteryCells: tinyint({ unsigned: true }),
    batteryCapacityMah: int({ unsigned: true }),
    notes: text(),
    /** Failsafe plan: what the vehicle should do when the link is lost, and how soon. */
    failsafeAction: mysqlEnum(failsafeActions),
    failsafeWithinS: float(),
    /** Overrides of the crew's analysis thresholds for this build. */
    thresholds: json().$type<Record<string, number>>(),
    retiredAt: ms(),
    createdBy: ref().references(() => users.id, { onDelete: "set null" }),
    ...lifecycleDates(),
  },
  (t) => [index("builds_crew_idx").on(t.crewId, t.retiredAt)],
);

/** Link sheet: one row per RC channel (1–18). */
export const buildChannels = mysqlTable(
  "build_channels",
  {
    buildId: ref().notNull().references(() => builds.id, { onDelete: "cascade" }),
    channel: tinyint({ unsigned: true }).notNull(),
    function: mysqlEnum(channelFunctions).notNull().default("unused"),
    switchLabel: varchar({ length: 40 }),
    positions: tinyint({ unsigned: true }),
    /** PWM range (µs) in which the function engages. */
    engageMinUs: smallint({ unsigned: true }),
    engageMaxUs: smallint({ unsigned: true }),
    /** Value the receiver outputs on this channel when the link is lost. */
    failsafeUs: smallint({ unsigned: true }),
  },
  (t) => [primaryKey({ name: "build_channels_pk", columns: [t.buildId, t.channel] })],
);

/** Who changed what in a build record, for the build's history. */
export const buildChanges = mysqlTable(
  "build_changes",
  {
    id: id(),
    buildId: ref().notNull().references(() => builds.id, { onDelete: "cascade" }),
    changedBy: ref().references(() => users.id, { onDelete: "set null" }),
    changes: json().$type<Record<string, { from: unknown; to: unknown }>>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("build_changes_build_idx").on(t.buildId, t.createdAt)],
);

/**
 * Photos of a build, kept in object storage. A row is written when the upload is presigned and
 * counts as a photo only once `storedAt` is set (the complete step checked size and type).
 */
export const buildPhotos = mysqlTable(
  "build_photos",
  {
    id: id(),
    buildId: ref().notNull().references(() => builds.id, { onDelete: "cascade" }),
    uploadedBy: ref().references(() => users.id, { onDelete: "set null" }),
    objectKey: varchar({ length: 512 }).notNull(),
    fileName: varchar({ length: 160 }).notNull(),
    contentType: varchar({ length: 40 }).notNull(),
    sizeBytes: int({ unsigned: true }).notNull(),
    caption: varchar({ length: 200 }),
    createdAt: createdAt(),
    storedAt: ms(),
  },
  (t) => [index("build_photos_build_idx").on(t.buildId, t.createdAt), uniqueIndex("build_photos_object_key_uq").on(t.objectKey)],
);

export type Build = typeof builds.$inferSelect;
export type NewBuild = typeof builds.$inferInsert;
export type BuildChannel = typeof buildChannels.$inferSelect;
export type BuildChange = typeof buildChanges.$inferSelect;
export type BuildPhoto = typeof buildPhotos.$inferSelect;
