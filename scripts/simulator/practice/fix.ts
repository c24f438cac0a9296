/**
 * GPS and radio values shared by the practice scenarios: a good fix with white position noise, a
 * link that is healthy near the pilot, and a LiPo pack's loaded voltage. Our own simple models.
 */
import { rng } from "../random";
import { place, type LatLon, type XY } from "./motion";
import type { PracticeSample } from "./sample";

export type Rng = ReturnType<typeof rng>;

/** Writes a good 3-D fix at `xy` (m from `origin`) with white noise of `sigmaM` per axis, 10–12 satellites, HDOP 0.8–1.1. */
export function setGoodFix(s: PracticeSample, r: Rng, origin: LatLon, xy: XY, sigmaM: number): void {
  const p = place(origin, [xy[0] + r.normal(sigmaM), xy[1] + r.normal(sigmaM)]);
  s.lat = p.lat;
  s.lon = p.lon;
  s.sats = 10 + Math.floor(r.next() * 3);
  s.hdop = Math.round((0.8 + r.next() * 0.3) * 100) / 100;
  s.fix = 3;
}

/** LQ of a healthy link near the pilot: 97–100 %. */
export const healthyLq = (r: Rng) => Math.min(100, Math.round(99 + r.normal(1)));

/** Pack voltage of `cells` LiPo cells at `perCellV` with white jitter of `sigmaV` on the pack. */
export const packV = (r: Rng, cells: number, perCellV: number, sigmaV = 0.02) => cells * perCellV + r.normal(sigmaV);

/** An RC channel's µs for a 0–100 % value (1000–2000 µs = 0–100 %, common practice for RSSI on a channel). */
export const pctToUs = (pct: number) => Math.round(1000 + 10 * Math.max(0, Math.min(100, pct)));
