import { double, float, index, int, json, mysqlEnum, mysqlTable, primaryKey, smallint, text, tinyint, uniqueIndex, varchar } from "drizzle-orm/mysql-core";
// Relative, not "@/…": drizzle-kit loads the schema without the app's path aliases.
import { failsafeResults } from "../../lib/analysis/evidence";
import { crews } from "./crews";
import { runs } from "./runs";
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
    /**
     * When the link sheet (channels or failsafe plan) last changed; a failsafe bench test from
     * before it is stale. Null: not changed since this column was added (or since creation).
     */
    linkSheetChangedAt: ms(),
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

/** What a bench test's log showed the vehicle doing (lib/analysis/evidence.ts FailsafeFlown). */
export const flownStates = ["seen", "none", "not-logged"] as const;
export type FlownState = (typeof flownStates)[number];

/**
 * Failsafe bench tests (DESIGN.md §10): a lead records a bench run's failsafe audit on its build.
 * A test belongs to the build; its run may be deleted later (the figures stay). `testedAt` is when
 * the test happened (the log's start, else the upload), so a link-sheet change after it makes it
 * stale. One row per build and run: recording the same run again returns the existing row.
 */
export const benchTests = mysqlTable(
  "bench_tests",
  {
    id: id(),
    buildId: ref().notNull().references(() => builds.id, { onDelete: "cascade" }),
    runId: ref().references(() => runs.id, { onDelete: "set null" }),
    recordedBy: ref().references(() => users.id, { onDelete: "set null" }),
    testedAt: ms().notNull(),
    recordedAt: createdAt(),
    result: mysqlEnum(failsafeResults).notNull(),
    /** From the link loss's start to the receiver's failsafe output (channel or flag), s. */
    commandedLatencyS: float(),
    /** From the link loss's start to the action the vehicle took, s (when seen). */
    flownLatencyS: float(),
    flownState: mysqlEnum(flownStates),
    /** The action the vehicle took, when the log shows one. */
    action: mysqlEnum(failsafeActions),
    /** The run's failsafe audit as recorded (plan, commanded, flown), so its words can be shown later. */
    failsafe: json().$type<Record<string, unknown>>(),
    note: varchar({ length: 500 }),
  },
  (t) => [
    index("bench_tests_build_tested_idx").on(t.buildId, t.testedAt),
    uniqueIndex("bench_tests_build_run_uq").on(t.buildId, t.runId),
    index("bench_tests_run_idx").on(t.runId),
  ],
);

export type Build = typeof builds.$inferSelect;
export type NewBuild = typeof builds.$inferInsert;
export type BuildChannel = typeof buildChannels.$inferSelect;
export type BuildChange = typeof buildChanges.$inferSelect;
export type BuildPhoto = typeof buildPhotos.$inferSelect;
export type BenchTest = typeof benchTests.$inferSelect;
