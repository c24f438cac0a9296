/**
 * Scenario: RSSI only on an RC channel (DESIGN.md §10 "RSSI often travels on a spare RC
 * channel"). The receiver puts RSSI on channel 12 (1000–2000 µs = 0–100 %); the log has no RSSI
 * or LQ column. The rover drives out, the link is lost for 6 s (channel 12 → 1000 µs), the RTH
 * channel 8 goes to its failsafe value 1900 µs 0.5 s into the loss, the controller switches to
 * RTH 1.0 s into it and drives home. Variant `withRssiColumn`: the log also has an RSSI % column.
 */
import type { BuildConfig } from "@/lib/analysis/types";
import { toColumnsCsv } from "../write-logs";
import { rng } from "../random";
import { columns, type ColumnName } from "./columns";
import { packV, pctToUs, setGoodFix } from "./fix";
import { driveThrough, endOf, place, positionAt, PRACTICE_FIELD, speedAt, type Keyframe, type LatLon, type XY } from "./motion";
import { blankSample, sampleTimes, type PracticeScenario } from "./sample";

export interface RssiChannelTimeline {
  hz: number;
  armS: number;
  driveStartS: number;
  /** Channel 12 at 1000 µs (0 %) from lossStartS until lossEndS (the first sample with the link back). */
  lossStartS: number;
  lossEndS: number;
  /** Channel 8 at its failsafe value 1900 µs from here until lossEndS. */
  commandS: number;
  /** Mode RTH from here; the rover turns for home. */
  rthModeS: number;
  homeS: number;
  disarmS: number;
  endS: number;
  home: LatLon;
  rssiChannel: number;
  rthChannel: number;
  failsafeUs: number;
}

const HZ = 10;
const RSSI_CH = 12;
const RTH_CH = 8;
const OUT: XY = [80 * Math.sin((70 * Math.PI) / 180), 80 * Math.cos((70 * Math.PI) / 180)]; // heading 070°

export function rssiChannelScenario(o: { seed?: number; withRssiColumn?: boolean } = {}): PracticeScenario<RssiChannelTimeline> {
  const r = rng(o.seed ?? 303);
  const origin = PRACTICE_FIELD;
  const tl = { armS: 5, driveStartS: 10, lossStartS: 40, commandS: 40.5, rthModeS: 41, lossEndS: 46 };
  const out = driveThrough([[0, 0], OUT], 2, tl.driveStartS);
  const turn = positionAt(out, tl.rthModeS); // it keeps going until the controller switches mode
  const back = driveThrough([turn, [0, 0]], 2, tl.rthModeS);
  const keys: Keyframe[] = [{ t: 0, at: [0, 0] }, { t: tl.driveStartS, at: [0, 0] }, { t: tl.rthModeS, at: turn }, ...back.slice(1)];
  const homeS = endOf(back);
  const disarmS = Math.ceil(homeS) + 3;
  const endS = disarmS + 2;

  const samples = sampleTimes(HZ, endS).map((t) => {
    const s = blankSample(t);
    const at = positionAt(keys, t);
    setGoodFix(s, r, origin, at, 0.3);
    const lost = t >= tl.lossStartS && t < tl.lossEndS;
    // Near the pilot 97 %, falling a quarter point per metre; receiver noise σ 1 point.
    s.rssiPct = lost ? 0 : Math.max(1, Math.min(100, 97 - 0.25 * Math.hypot(at[0], at[1]) + r.normal(1)));
    s.rc[RSSI_CH - 1] = pctToUs(s.rssiPct);
    s.rssiPct = (s.rc[RSSI_CH - 1] - 1000) / 10; // the column, when written, carries what the channel carries
    s.rc[RTH_CH - 1] = t >= tl.commandS && t < tl.lossEndS ? 1900 : 1000;
    s.armed = t >= tl.armS && t < disarmS;
    s.rc[4] = s.armed ? 2000 : 1000;
    s.mode = t >= tl.rthModeS && t < homeS ? "RTH" : t >= homeS ? "HOLD" : "MANUAL";
    const moving = speedAt(keys, t) > 0;
    s.currentA = moving ? 8 + r.normal(0.5) : 0.5;
    s.voltageV = packV(r, 4, moving ? 3.8 : 3.95);
    return s;
  });

  const names: ColumnName[] = ["time", "lat", "lon", "sats", "hdop", "fix", ...(o.withRssiColumn ? (["rssiPct"] as const) : []), "voltage", "current", "mode", "armed"];
  const build: BuildConfig = {
    vehicleType: "ground",
    cells: 4,
    failsafe: { action: "return-to-home", expectedWithinS: 2 },
    channels: [
      { channel: 5, function: "arm", engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: RTH_CH, function: "return-to-home", failsafeUs: 1900, engageMinUs: 1800, engageMaxUs: 2100 },
      { channel: RSSI_CH, function: "rssi" },
    ],
  };
  const variant = o.withRssiColumn ? "rssi-column-and-channel" : "rssi-channel";
  return {
    name: variant,
    story: "RSSI on channel 12 only; the link lost for 6 s; channel 8 to its failsafe value, mode RTH, home.",
    samples,
    log: { fileName: `${variant}.csv`, format: "csv", text: toColumnsCsv(samples, columns(names, [5, RTH_CH, RSSI_CH])) },
    timeline: { hz: HZ, ...tl, homeS, disarmS, endS, home: place(origin, [0, 0]), rssiChannel: RSSI_CH, rthChannel: RTH_CH, failsafeUs: 1900 },
    build,
  };
}
