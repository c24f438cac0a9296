/**
 * A simulator of our own for the invented demo scenario: a rover follows a route plan with GPS
 * noise; RSSI follows a log-distance path-loss model with shadowing; the link fades behind an
 * obstacle, is lost once (failsafe → return-to-home), and the battery sags under load.
 * This is demo data, not a reference for tests of the analysis.
 */
import { Geodesic } from "geographiclib-geodesic";
import { rng } from "./random";

export interface SimSample {
  t: number; lat: number; lon: number; alt: number; speed: number; heading: number; sats: number; hdop: number; fix: number;
  rssiDbm: number; lq: number; snr: number; voltage: number; current: number; usedMah: number; mode: string; armed: boolean;
  failsafe: boolean; ch: number[];
}

export interface SimOptions {
  seed: number;
  waypoints: { lat: number; lon: number }[];
  hz?: number;
  speedMps?: number;
  cells?: number;
  /** Transmitter power (dBm), antenna gains (dBi), band (MHz), receiver sensitivity (dBm). */
  radio?: { txDbm: number; gainsDbi: number; bandMhz: number; sensitivityDbm: number; exponent: number };
  /** Fraction of the route (0–1) where an obstacle adds loss, and where the link is lost for a while. */
  fadeAt?: [number, number];
  lossAt?: number;
  lossSeconds?: number;
  /** State of charge at the start (0–1) and pack internal resistance (Ω): a tired pack sags. */
  startSoc?: number;
  resistanceOhm?: number;
}

const geod = Geodesic.WGS84;

export function simulateRun(o: SimOptions): SimSample[] {
  const r = rng(o.seed);
  const hz = o.hz ?? 10;
  const dt = 1 / hz;
  const speed = o.speedMps ?? 2.5;
  const cells = o.cells ?? 4;
  const radio = o.radio ?? { txDbm: 14, gainsDbi: 4, bandMhz: 868, sensitivityDbm: -112, exponent: 3.2 };
  const home = o.waypoints[0];
  // Free-space loss at 1 m (ITU-R P.525 with d = 0.001 km) anchors the log-distance model.
  const pl1m = 32.45 + 20 * Math.log10(radio.bandMhz) + 20 * Math.log10(0.001);
  const legs = o.waypoints.slice(1).map((w, i) => ({ from: o.waypoints[i], to: w, ...geod.Inverse(o.waypoints[i].lat, o.waypoints[i].lon, w.lat, w.lon) }));
  const routeLength = legs.reduce((s, l) => s + (l.s12 ?? 0), 0);
  const fadeAt = o.fadeAt ?? [0.42, 0.5];
  const lossAt = o.lossAt ?? 0.72;
  const lossSeconds = o.lossSeconds ?? 3;
  const startSoc = o.startSoc ?? 0.9;
  const resistance = o.resistanceOhm ?? 0.045;

  const out: SimSample[] = [];
  let t = 0, along = 0, leg = 0, legPos = 0, used = 0, shadow = 0, noiseN = 0, noiseE = 0;
  let mode = "MANUAL", lossUntil = -1, failsafeSince = -1, rth = false, pos = { ...home };
  const push = (armed: boolean, v: number, heading: number, current: number, extraLoss: number, lost: boolean) => {
    const d = Math.max(1, geod.Inverse(home.lat, home.lon, pos.lat, pos.lon).s12 ?? 1);
    shadow = 0.9 * shadow + r.normal(1.2); // correlated shadowing, σ ≈ 2.8 dB
    const rssi = radio.txDbm + radio.gainsDbi - (pl1m + 10 * radio.exponent * Math.log10(d)) + shadow - extraLoss;
    const margin = rssi - radio.sensitivityDbm;
    const lq = lost ? 0 : Math.max(0, Math.min(100, Math.round(100 - Math.max(0, 12 - margin) * 9 + r.normal(1))));
    const ocv = cells * (3.55 + 0.62 * Math.max(0, startSoc - used / 5000));
    noiseN = 0.95 * noiseN + r.normal(0.12);
    noiseE = 0.95 * noiseE + r.normal(0.12);
    const p = geod.Direct(pos.lat, pos.lon, 0, noiseN);
    const q = geod.Direct(p.lat2!, p.lon2!, 90, noiseE);
    out.push({
      t: Math.round(t * 1000) / 1000, lat: q.lat2!, lon: q.lon2!, alt: 4 + r.normal(0.3), speed: Math.max(0, v + r.normal(0.05)), heading: (heading + 360) % 360,
      sats: 11 + Math.round(r.next() * 3), hdop: Math.round((0.8 + r.next() * 0.4) * 100) / 100, fix: 3,
      rssiDbm: lost ? NaN : Math.round(rssi * 10) / 10, lq, snr: lost ? NaN : Math.round(Math.min(12, margin - 8) * 10) / 10,
      voltage: Math.round((ocv - current * resistance + r.normal(0.02)) * 100) / 100, current: Math.round(current * 100) / 100, usedMah: Math.round(used * 10) / 10,
      mode, armed, failsafe: failsafeSince >= 0,
      ch: [1500 + Math.round(r.normal(40)), armed ? 1500 + Math.round(v * 80) : 1000, 1500, 1500, armed ? 2000 : 1000, mode === "AUTO" ? 1500 : 1000, rth ? 2000 : 1000, 1500],
    });
    used += (current * dt * 1000) / 3600;
    t += dt;
  };

  for (let i = 0; i < 3 * hz; i++) push(false, 0, 0, 0.4, 0, false); // disarmed on the bench
  mode = "AUTO";
  while (leg < legs.length && !rth) {
    const l = legs[leg];
    const frac = along / routeLength;
    const behindObstacle = frac > fadeAt[0] && frac < fadeAt[1];
    if (lossUntil < 0 && frac >= lossAt) lossUntil = t + lossSeconds;
    const lost = lossUntil > 0 && t < lossUntil;
    if (lost && failsafeSince < 0 && t > lossUntil - lossSeconds + 0.8) failsafeSince = t; // receiver holds 0.8 s
    if (failsafeSince >= 0 && t - failsafeSince > 0.4) {
      mode = "RTH";
      rth = true;
    }
    const v = lost && failsafeSince < 0 ? speed : speed + r.normal(0.1);
    const wander = 0.8 * Math.sin(along / 9);
    legPos += v * dt;
    along += v * dt;
    const base = geod.Direct(l.from.lat, l.from.lon, l.azi1!, Math.min(legPos, l.s12!));
    const side = geod.Direct(base.lat2!, base.lon2!, l.azi1! + 90, wander);
    pos = { lat: side.lat2!, lon: side.lon2! };
    const burst = frac > 0.85 ? 2.2 : 1; // last stretch up the shingle: hard work for the battery
    push(true, v, l.azi1!, 9 * burst + r.normal(0.6), behindObstacle ? 19 : lost ? 60 : 0, lost);
    if (legPos >= l.s12!) {
      leg += 1;
      legPos = 0;
    }
  }
  if (rth) {
    // Straight line home at cruise speed, link back after the outage.
    for (;;) {
      const back = geod.Inverse(pos.lat, pos.lon, home.lat, home.lon);
      if ((back.s12 ?? 0) < 1.5) break;
      const step = geod.Direct(pos.lat, pos.lon, back.azi1!, Math.min(speed * dt, back.s12!));
      pos = { lat: step.lat2!, lon: step.lon2! };
      const lost = t < lossUntil;
      if (!lost) failsafeSince = -1;
      push(true, speed, back.azi1!, 20 + r.normal(0.8), lost ? 60 : 0, lost);
    }
  }
  mode = "HOLD";
  for (let i = 0; i < 2 * hz; i++) push(true, 0, 0, 1, 0, false);
  for (let i = 0; i < 2 * hz; i++) push(false, 0, 0, 0.4, 0, false);
  return out;
}
