/**
 * Our own generator of a bench failsafe test for the invented demo scenario (DESIGN.md §10 "Bench
 * failsafe test"): the vehicle on the bench with propellers off, armed, the transmitter switched
 * off for a while and on again. The log has no GPS (indoors) and no mode column: armed flag, pack
 * voltage and current, RC channels 1–8 and the receiver's RSSI on a spare channel (1000–2000 µs =
 * 0–100 %). When the transmitter goes off the RSSI channel falls to its floor at once; the receiver
 * holds the last values for `holdS`, then puts out its failsafe values (throttle low, sticks
 * centred, the return-to-home channel at its failsafe value). Demo data, not a test reference.
 */
import { rng } from "./random";

export interface BenchTestOptions {
  seed: number;
  hz?: number;
  /** Cells of the pack (resting about 4.1 V each). */
  cells?: number;
  /** Channel the receiver writes RSSI to, and the channel that commands return to home. */
  rssiChannel: number;
  rthChannel: number;
  /** The receiver's failsafe value on the return-to-home channel, µs. */
  rthFailsafeUs: number;
  /** When the vehicle is armed and disarmed, and when the transmitter is off, s from the first sample. */
  armAtS?: number;
  txOffAtS?: number;
  txOffForS?: number;
  disarmAtS?: number;
  endS?: number;
  /** The receiver's hold time before it puts out the failsafe values, s. */
  holdS?: number;
}

export interface BenchSample {
  t: number;
  armed: boolean;
  voltage: number;
  current: number;
  /** µs per channel, index = channel − 1. */
  ch: number[];
}

/** Channels written to the log: 1–8 and the RSSI channel. */
export function benchChannels(o: Pick<BenchTestOptions, "rssiChannel">): number[] {
  return [...new Set([1, 2, 3, 4, 5, 6, 7, 8, o.rssiChannel])].sort((a, b) => a - b);
}

export function simulateBenchTest(o: BenchTestOptions): BenchSample[] {
  const r = rng(o.seed);
  const hz = o.hz ?? 10;
  const cells = o.cells ?? 4;
  const armAt = o.armAtS ?? 5;
  const offAt = o.txOffAtS ?? 20;
  const onAt = offAt + (o.txOffForS ?? 10);
  const disarmAt = o.disarmAtS ?? onAt + 8;
  const end = o.endS ?? disarmAt + 4;
  const hold = o.holdS ?? 0.4;
  const width = Math.max(8, o.rssiChannel);
  const out: BenchSample[] = [];
  let rssiPct = 98;
  for (let i = 0; i * (1 / hz) <= end + 1e-9; i++) {
    const t = Math.round((i / hz) * 1000) / 1000;
    const armed = t >= armAt && t < disarmAt;
    const txOff = t >= offAt && t < onAt;
    const failsafe = txOff && t >= offAt + hold;
    // Near the pilot a receiver reads 95–100 %; with no packets it reports 0 at once.
    rssiPct = txOff ? 0 : Math.min(100, Math.max(94, 0.8 * rssiPct + 0.2 * 98 + r.normal(1.2)));
    const ch = new Array<number>(width).fill(1500);
    const stick = () => 1500 + Math.round(r.normal(6));
    // Before the failsafe values the receiver holds what it last received.
    const last = out.length ? out[out.length - 1].ch : null;
    if (txOff && !failsafe && last) ch.splice(0, 8, ...last.slice(0, 8));
    else {
      ch[0] = stick();
      ch[1] = stick();
      ch[2] = armed && !failsafe ? 1080 + Math.round(r.normal(4)) : 1000; // throttle a touch above idle when armed
      ch[3] = stick();
      ch[4] = armed ? 2000 : 1000; // arm switch; the failsafe keeps the vehicle armed so it can return
      ch[5] = 1000; // flight-mode switch in its first position
      ch[6] = 1000; // mission switch off
      ch[7] = 1000; // return-to-home switch off
      if (failsafe) [ch[0], ch[1], ch[3]] = [1500, 1500, 1500];
    }
    if (failsafe) ch[o.rthChannel - 1] = o.rthFailsafeUs;
    ch[o.rssiChannel - 1] = Math.round(1000 + rssiPct * 10);
    // Motors turning without propellers draw little; the pack barely sags.
    const current = armed ? (failsafe ? 0.5 : 0.9) + r.normal(0.05) : 0.25 + r.normal(0.02);
    const voltage = cells * 4.12 - current * 0.05 - (t / end) * 0.02 + r.normal(0.01);
    out.push({ t, armed, voltage: Math.round(voltage * 100) / 100, current: Math.round(Math.max(0, current) * 100) / 100, ch });
  }
  return out;
}

/** The bench log as a CSV: time, armed flag, pack, RC channels (µs). No position, no mode, no RSSI column. */
export function benchTestCsv(samples: BenchSample[], o: Pick<BenchTestOptions, "rssiChannel">): string {
  const channels = benchChannels(o);
  const header = ["time_s", "armed", "battery_v", "current_a", ...channels.map((c) => `ch${c}`)];
  const rows = samples.map((s) => [s.t.toFixed(2), s.armed ? 1 : 0, s.voltage.toFixed(2), s.current.toFixed(2), ...channels.map((c) => s.ch[c - 1])].join(","));
  return [header.join(","), ...rows].join("\n") + "\n";
}
