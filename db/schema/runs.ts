import {
  boolean, double, float, index, int, json, mysqlEnum, mysqlTable, primaryKey, smallint, text, tinyint, uniqueIndex, varbinary, varchar,
} from "drizzle-orm/mysql-core";
import { builds } from "./builds";
import { crews } from "./crews";
import { routePlans } from "./route-plans";
import { uploads } from "./uploads";
import { createdAt, id, lifecycleDates, ms, ref } from "./util/columns";
import { users } from "./users";

export const runStatuses = ["queued", "parsing", "analysing", "ready", "failed"] as const;
export const logFormats = ["csv", "gpx", "nmea"] as const;
export const verdictLevels = ["clear", "watch", "act"] as const;
export type RunStatus = (typeof runStatuses)[number];
export type VerdictLevel = (typeof verdictLevels)[number];

export interface RunWarning {
  code: string;
  message: string;
  line?: number;
  column?: string;
  count?: number;
}

/** One analysed log. Summary figures live in `summary` (shape owned by lib/analysis). */
export const runs = mysqlTable(
  "runs",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    uploadId: ref().notNull().references(() => uploads.id, { onDelete: "restrict" }),
    /**
     * Which run of its upload this is, from 1: a file holding several separate runs (GPX tracks or
     * armed periods far apart, lib/parsers/run-splitter.ts) gives one run per part. Part 1 is the
     * run the upload created; its ingest job reads the file for every part.
     */
    part: smallint({ unsigned: true }).notNull().default(1),
    buildId: ref().references(() => builds.id, { onDelete: "set null" }),
    routePlanId: ref().references(() => routePlans.id, { onDelete: "set null" }),
    pilotId: ref().references(() => users.id, { onDelete: "set null" }),
    title: varchar({ length: 160 }).notNull(),
    format: mysqlEnum(logFormats),
    status: mysqlEnum(runStatuses).notNull().default("queued"),
    /** 0–1 while parsing/analysing, readable by polling clients. */
    progress: float().notNull().default(0),
    error: text(),
    warnings: json().$type<RunWarning[]>(),
    columnMap: json().$type<Record<string, unknown>>(),
    sampleCount: int({ unsigned: true }).notNull().default(0),
    /** Absolute time of the first sample when the log carries one. */
    startedAt: ms(),
    durationS: double(),
    distanceM: double(),
    verdict: mysqlEnum(verdictLevels),
    summary: json().$type<Record<string, unknown>>(),
    /** Mode texts seen in the log; samples store an index into this list. */
    modeNames: json().$type<string[]>(),
    signedOffBy: ref().references(() => users.id, { onDelete: "set null" }),
    signedOffAt: ms(),
    ...lifecycleDates(),
  },
  (t) => [
    index("runs_crew_created_idx").on(t.crewId, t.createdAt),
    index("runs_crew_build_idx").on(t.crewId, t.buildId),
    index("runs_crew_verdict_idx").on(t.crewId, t.verdict),
    // The queue's reconcile pass looks for runs still marked in progress (lib/jobs/ingest-jobs.ts).
    index("runs_status_idx").on(t.status),
    // One run per part of an upload: a second "complete" of the same upload can never make another
    // part 1, and a re-read updates its parts in place by number.
    uniqueIndex("runs_upload_part_uq").on(t.uploadId, t.part),
  ],
);

/**
 * Telemetry samples. Millions of rows per crew: the clustered key (run_id, seq) keeps a run's
 * samples together on disk so a series read is one range scan; FLOAT (4 bytes) for sensor
 * values, DOUBLE only for coordinates and time. RC channels 1–18 are packed as 18 × uint16 LE.
 * No foreign key: runs delete their samples explicitly (a cascade over millions of rows would
 * hold one huge transaction), and bulk loads skip per-row FK checks.
 */
export const samples = mysqlTable(
  "samples",
  {
    runId: ref().notNull(),
    seq: int({ unsigned: true }).notNull(),
    /** Seconds from the first sample. */
    tS: double().notNull(),
    lat: double(),
    lon: double(),
    altM: float(),
    speedMps: float(),
    headingDeg: float(),
    sats: tinyint({ unsigned: true }),
    hdop: float(),
    fixType: tinyint({ unsigned: true }),
    rssiDbm: float(),
    rssiPct: float(),
    lqPct: float(),
    snrDb: float(),
    voltageV: float(),
    currentA: float(),
    usedMah: float(),
    modeIndex: smallint({ unsigned: true }),
    armed: boolean(),
    failsafe: boolean(),
    rc: varbinary({ length: 36 }),
  },
  (t) => [primaryKey({ name: "samples_pk", columns: [t.runId, t.seq] })],
);

export const eventKinds = [
  "link-fade", "link-lost", "failsafe", "return-to-home", "off-route", "waypoint-reached", "waypoint-missed",
  "fix-lost", "position-jump", "low-voltage", "armed", "disarmed",
] as const;
export type EventKind = (typeof eventKinds)[number];

export const events = mysqlTable(
  "events",
  {
    id: id(),
    runId: ref().notNull().references(() => runs.id, { onDelete: "cascade" }),
    kind: mysqlEnum(eventKinds).notNull(),
    startS: double().notNull(),
    endS: double().notNull(),
    lat: double(),
    lon: double(),
    distanceFromHomeM: double(),
    peak: double(),
    threshold: double(),
    detail: json().$type<Record<string, unknown>>(),
  },
  (t) => [index("events_run_start_idx").on(t.runId, t.startS)],
);

export const runNotes = mysqlTable(
  "run_notes",
  {
    id: id(),
    runId: ref().notNull().references(() => runs.id, { onDelete: "cascade" }),
    authorId: ref().references(() => users.id, { onDelete: "set null" }),
    body: text().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("run_notes_run_idx").on(t.runId, t.createdAt)],
);

export type Run = typeof runs.$inferSelect;
export type NewRun = typeof runs.$inferInsert;
export type RunEvent = typeof events.$inferSelect;
