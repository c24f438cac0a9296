import { z } from "zod";

const pct = z.number().min(0).max(100);
const seconds = z.number().min(0).max(600);

/** Crew- or build-level overrides of the analysis thresholds (lib/analysis/thresholds.ts). */
export const thresholdsSchema = z
  .object({
    lqFadePct: pct,
    rssiFadePct: pct,
    dbmFadeMarginDb: z.number().min(0).max(60),
    defaultSensitivityDbm: z.number().min(-150).max(0),
    fadeMinS: seconds,
    hysteresisPct: z.number().min(0).max(50),
    hysteresisDb: z.number().min(0).max(30),
    lostMinS: seconds,
    hdopWarn: z.number().min(0.5).max(50),
    minSats: z.number().int().min(0).max(40),
    homeMinSats: z.number().int().min(0).max(40),
    homeMaxHdop: z.number().min(0.5).max(50),
    jumpSpeedMps: z.number().positive().max(1000),
    acceptanceRadiusM: z.number().positive().max(10_000),
    corridorM: z.number().positive().max(10_000),
    offRouteMinS: seconds,
    offRouteExitMarginM: z.number().min(0).max(1000),
    lowCellV: z.number().min(2).max(4.5),
    lowVoltageMinS: seconds,
    lowVoltageWindowS: z.number().min(0).max(30),
    runSplitGapS: z.number().min(60).max(30 * 86_400),
  })
  .partial()
  .strict();

export type ThresholdOverrides = z.infer<typeof thresholdsSchema>;
