/**
 * Scenario: a bench failsafe test (DESIGN.md §10 "Bench failsafe test"). Wheels lifted, indoors,
 * no GPS fix: armed, the transmitter switched off for 10 s; RSSI on channel 14 drops to 0 %, the
 * receiver puts channel 8 (RTH) at its planned failsafe value 1900 µs 0.4 s later; where the
 * controller logs its mode, it switches to RTH 0.9 s after the loss. Then transmitter on, mode
 * back, disarmed.
 *
 * Variants (what the logger wrote):
 * - "rc-rssi": time, voltage, current, armed, channels 5, 8, 14 — no mode, no position;
 * - "rc-rssi-mode": the same plus the mode column;
 * - "rssi-column": an RSSI % column instead of channel 14, no mode;
 * - "no-fix": "rc-rssi" plus GPS columns that report no fix (0,0, fix 0, 0–3 satellites).
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toColumnsCsv } from "../write-logs";
import { rng } from "../random";
import { columns, type ColumnName } from "./columns";
import { packV, pctToUs } from "./fix";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export type BenchVariant = "rc-rssi" | "rc-rssi-mode" | "rssi-column" | "no-fix";

export interface BenchFailsafeTimeline {
  hz: number;
  armS: number;
  /** Transmitter off: RSSI 0 % from here until txOnS (the first sample with the link back). */
  txOffS: number;
  txOnS: number;
  /** Channel 8 at 1900 µs from here until txOnS. */
  commandS: number;
  /** Mode RTH from here until modeBackS (variant "rc-rssi-mode" only). */
  modeRthS: number;
  modeBackS: number;
  disarmS: number;
  endS: number;
  rssiChannel: number;
  rthChannel: number;
  failsafeUs: number;
  variant: BenchVariant;
}

const HZ = 10;
const RSSI_CH = 14;
const RTH_CH = 8;

export function benchFailsafeScenario(o: { seed?: number; variant?: BenchVariant } = {}): PracticeScenario<BenchFailsafeTimeline> {
  const r = rng(o.seed ?? 404);
  const variant = o.variant ?? "rc-rssi";
  const tl = { armS: 5, txOffS: 15, commandS: 15.4, modeRthS: 15.9, txOnS: 25, modeBackS: 26, disarmS: 30, endS: 32 };
  const samples = sampleTimes(HZ, tl.endS).map((t) => {
    const s = blankSample(t);
    const off = t >= tl.txOffS && t < tl.txOnS;
    s.rssiPct = off ? 0 : Math.min(100, Math.round(98 + r.normal(1)));
    s.rc[RSSI_CH - 1] = pctToUs(s.rssiPct);
    s.rc[RTH_CH - 1] = t >= tl.commandS && t < tl.txOnS ? 1900 : 1000;
    s.armed = t >= tl.armS && t < tl.disarmS;
    s.rc[4] = s.armed ? 2000 : 1000; // the receiver holds the arm channel in failsafe
    s.mode = t >= tl.modeRthS && t < tl.modeBackS ? "RTH" : "MANUAL";
    s.currentA = s.armed ? 0.9 + r.normal(0.05) : 0.3; // wheels lifted: no load
    s.voltageV = packV(r, 4, 4.05);
    if (variant === "no-fix") {
      // Indoors: the receiver reports no fix as 0,0 with fix type 0.
      s.lat = 0;
      s.lon = 0;
      s.fix = 0;
      s.sats = Math.floor(r.next() * 4);
      s.hdop = 99.99;
    }
    return s;
  });
  const base: ColumnName[] = ["time", ...(variant === "no-fix" ? (["lat", "lon", "sats", "hdop", "fix"] as const) : []), "voltage", "current"];
  const cols =
    variant === "rc-rssi-mode" ? columns([...base, "mode", "armed"], [5, RTH_CH, RSSI_CH])
    : variant === "rssi-column" ? columns([...base, "rssiPct", "armed"], [5, RTH_CH])
    : columns([...base, "armed"], [5, RTH_CH, RSSI_CH]);
  const build: BuildConfig = {
    vehicleType: "ground",
    cells: 4,
    failsafe: { action: "return-to-home", expectedWithinS: 1 },
    channels: [
      { channel: 5, function: "arm", engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: RTH_CH, function: "return-to-home", failsafeUs: 1900, engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: RSSI_CH, function: "rssi" },
    ],
  };
  return {
    name: `bench-failsafe-${variant}`,
    story: "Bench test, wheels lifted, no fix: armed, transmitter off for 10 s, channel 8 to 1900 µs after 0.4 s, back on.",
    samples,
    log: { fileName: `bench-failsafe-${variant}.csv`, format: "csv", text: toColumnsCsv(samples, cols) },
    timeline: { hz: HZ, ...tl, rssiChannel: RSSI_CH, rthChannel: RTH_CH, failsafeUs: 1900, variant },
    build,
  };
}
