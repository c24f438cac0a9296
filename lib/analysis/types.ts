/**
 * Inputs and outputs of the analysis. Everything here is plain data: the analysis is pure
 * (no I/O, no clock), so the ingest pipeline, the command-line analyser and tests share it.
 */
import type { EventKind } from "@/db/schema/runs";

export type { EventKind };

/** A whole run, columnar. NaN = the log has no value at that sample. Units as in lib/parsers/types.ts. */
export interface RunSeries {
  n: number;
  tS: ArrayLike<number>;
  lat: ArrayLike<number>;
  lon: ArrayLike<number>;
  altM: ArrayLike<number>;
  speedMps: ArrayLike<number>;
  headingDeg: ArrayLike<number>;
  sats: ArrayLike<number>;
  hdop: ArrayLike<number>;
  fixType: ArrayLike<number>;
  rssiDbm: ArrayLike<number>;
  rssiPct: ArrayLike<number>;
  lqPct: ArrayLike<number>;
  snrDb: ArrayLike<number>;
  voltageV: ArrayLike<number>;
  currentA: ArrayLike<number>;
  usedMah: ArrayLike<number>;
  modeIndex: ArrayLike<number>;
  armed: ArrayLike<number>;
  failsafe: ArrayLike<number>;
  /** RC channels 1–18 in µs, row-major n × 18, 0 = absent; null when the log has none. */
  rc: ArrayLike<number> | null;
  /** 1 where a new track segment starts (a reception gap: never bridged). */
  segmentStart: ArrayLike<number>;
  modeNames: string[];
}

export type VehicleType = "ground" | "multirotor" | "fixed-wing" | "boat";
export type FailsafeAction = "return-to-home" | "hold" | "land";

/** One row of the build's link sheet as the analysis reads it (PWM values in µs). */
export interface ChannelConfig {
  channel: number;
  /** A link-sheet function: "return-to-home", "mission", "rssi", "arm", "mode", … */
  function: string;
  /** The value the receiver puts out on this channel when the link is lost. */
  failsafeUs?: number;
  /** The range in which the function engages (mission channel: the mission runs). */
  engageMinUs?: number;
  engageMaxUs?: number;
}

export interface BuildConfig {
  vehicleType: VehicleType;
  cells?: number;
  bandMhz?: number;
  rxSensitivityDbm?: number;
  failsafe?: { action: FailsafeAction; expectedWithinS: number };
  channels?: ChannelConfig[];
}

export interface RoutePlanInput {
  waypoints: { name: string; lat: number; lon: number; radiusM?: number }[];
  corridorM?: number;
}

/** Every threshold an event uses. Defaults: DESIGN.md §5; crews and builds override them. */
export interface Thresholds {
  lqFadePct: number;
  rssiFadePct: number;
  /** Fade when RSSI dBm is below receiver sensitivity + this margin. */
  dbmFadeMarginDb: number;
  /** Used when the build gives no receiver sensitivity (dBm). */
  defaultSensitivityDbm: number;
  fadeMinS: number;
  hysteresisPct: number;
  hysteresisDb: number;
  lostMinS: number;
  hdopWarn: number;
  minSats: number;
  /** Home needs a good fix: at least this many satellites (when logged)… */
  homeMinSats: number;
  /** …and HDOP at or below this (when logged). */
  homeMaxHdop: number;
  /** Implied speed between two fixes above which the second is a position jump (m/s). */
  jumpSpeedMps: number;
  acceptanceRadiusM: number;
  corridorM: number;
  offRouteMinS: number;
  /** Hysteresis: an off-route ends only when |XTE| falls below corridor − this margin (m). */
  offRouteExitMarginM: number;
  lowCellV: number;
  lowVoltageMinS: number;
  /** Loaded voltage is judged on its mean over a centred window this long (s), so jitter does not fire. */
  lowVoltageWindowS: number;
  /** Recordings (GPX tracks, armed periods) further apart than this (s) are separate runs of one upload. */
  runSplitGapS: number;
}

export interface AnalysisEvent {
  kind: EventKind;
  startS: number;
  endS: number;
  lat: number | null;
  lon: number | null;
  distanceFromHomeM: number | null;
  /** The worst value inside the event (e.g. minimum LQ), in the unit of `detail.unit` when set. */
  peak: number | null;
  /** The threshold that fired it. */
  threshold: number | null;
  detail: Record<string, unknown>;
}
