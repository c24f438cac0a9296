import type { Thresholds, VehicleType } from "./types";

/**
 * Defaults from the product brief (DESIGN.md §5). LQ 70 %, RSSI 40 %, sensitivity + 10 dB, 0.5 s
 * fade, 5-point / 3 dB hysteresis, 0.1 s loss; HDOP 2.5 and 5 satellites; 3.5 V per LiPo cell for
 * ≥ 2 s (LiPo common practice); acceptance radius 2 m ground / 5 m air, corridor 3 m / 10 m.
 * Home's good fix, ≥ 6 satellites and HDOP ≤ 2.5, is DESIGN.md §10 (common practice).
 * The -100 dBm fallback sensitivity and the jump speeds are common practice, not from a source.
 * Our own choices, against the 0.5–3 m GPS scatter and tens of mV of loaded-voltage jitter that
 * DESIGN.md §10 describes: an off-route ends only 0.5 m (ground) / 2 m (air) back inside the
 * corridor, and loaded voltage is judged on a 1 s centred mean. Recordings 30 min apart are
 * separate runs (DESIGN.md §10 "A file holding several separate runs is several runs").
 */
export function defaultThresholds(vehicle: VehicleType): Thresholds {
  const air = vehicle === "multirotor" || vehicle === "fixed-wing";
  return {
    lqFadePct: 70,
    rssiFadePct: 40,
    dbmFadeMarginDb: 10,
    defaultSensitivityDbm: -100,
    fadeMinS: 0.5,
    hysteresisPct: 5,
    hysteresisDb: 3,
    lostMinS: 0.1,
    hdopWarn: 2.5,
    minSats: 5,
    homeMinSats: 6,
    homeMaxHdop: 2.5,
    jumpSpeedMps: vehicle === "fixed-wing" ? 120 : air ? 60 : 30,
    acceptanceRadiusM: air ? 5 : 2,
    corridorM: air ? 10 : 3,
    offRouteMinS: 2,
    offRouteExitMarginM: air ? 2 : 0.5,
    lowCellV: 3.5,
    lowVoltageMinS: 2,
    lowVoltageWindowS: 1,
    runSplitGapS: 1800,
  };
}

export function withOverrides(base: Thresholds, ...overrides: (Partial<Thresholds> | null | undefined)[]): Thresholds {
  const out = { ...base };
  for (const o of overrides) {
    if (!o) continue;
    for (const [k, v] of Object.entries(o)) if (typeof v === "number" && Number.isFinite(v) && k in out) (out as Record<string, number>)[k] = v;
  }
  return out;
}
