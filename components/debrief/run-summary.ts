import type { FailsafeCommanded, FailsafeFlown, HomeInfo, LinkSource, MissionStart } from "@/lib/analysis/evidence";
import type { StoredVerdict } from "./verdict-words";

/**
 * The analysis summary as stored on the run (lib/analysis/analyse-run.ts), read loosely: runs
 * analysed before a field existed do not have it, so every newer field is optional.
 */
export interface RunSummary {
  /** Null when the log's times cannot pace it (see `timing`). */
  durationS?: number | null;
  /** Extent of the sample clock, s: the charts' axis even when the times are not usable. */
  timelineS?: number | null;
  timing?: { usable: boolean; why: string | null };
  track?: { movingS: number | null; meanSpeedMps: number | null; jumpBoundMps: number | null; jumpBoundFrom: string; staleFixes: number };
  distanceM?: number | null;
  maxDistanceFromHomeM?: number | null;
  maxSpeedMps?: number | null;
  /** No usable GPS fix: analysed for link and failsafe only. */
  bench?: boolean;
  home?: HomeInfo | null;
  link?: {
    metric: string | null;
    unit: string | null;
    source?: LinkSource | null;
    note?: string | null;
    min: number | null;
    median: number | null;
    timeBelowFadeS: number | null;
    fadeThreshold: number | null;
    /** Incidents: a fade that ran into a loss is counted once, as the loss. */
    fadeCount?: number;
    lostCount?: number;
  };
  failsafe?: {
    result: string;
    why?: string | null;
    latencyS: number | null;
    actionLatencyS: number | null;
    action: string | null;
    plan: { action: string; expectedWithinS: number } | null;
    commanded?: FailsafeCommanded | null;
    flown?: FailsafeFlown | null;
  };
  route?: {
    start?: MissionStart | null;
    xteRmsM: number | null;
    xteMaxM: number | null;
    waypointsReached: string[];
    waypointsMissed: string[];
    waypointsNotReached: string[];
  } | null;
  power?: { cells: number | null; cellsFrom: string | null; minCellV: number | null; sagV: number | null; capacityUsedMah: number | null };
  range?: { estimatedRangeM: number | null; pathLossExponent: number | null; r2?: number | null; credible?: boolean; notCredibleWhy?: string | null; label?: string; reason?: string; p0Dbm?: number; thresholdDbm?: number; freeSpaceRangeM?: number | null; farthestM?: number | null };
  gps?: { fixLostS: number | null; hdopWarnS: number | null; maxHdop: number | null };
  verdict?: StoredVerdict;
}
