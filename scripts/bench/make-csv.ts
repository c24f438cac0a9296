import fs from "node:fs";
import { once } from "node:events";
import { rng } from "../simulator/random";

export const BENCH_HEADER = "time_s,latitude,longitude,altitude_m,ground_speed_ms,heading_deg,gps_sats,hdop,rssi_dbm,link_quality,snr_db,battery_v,current_a,used_mah,mode";

/** Rows of plausible 15-column telemetry (10 Hz), from a seed; lines without the header. */
function* benchRows(rows: number, seed: number): Generator<string> {
  const r = rng(seed);
  let lat = 53.47, lon = -3.05, used = 0;
  const modes = ["MANUAL", "AUTO", "RTH", "HOLD"];
  for (let i = 0; i < rows; i++) {
    lat += r.normal(2e-6);
    lon += r.normal(3e-6);
    used += 0.025;
    yield `${(i / 10).toFixed(2)},${lat.toFixed(7)},${lon.toFixed(7)},${(4 + r.normal(0.3)).toFixed(1)},${(2.5 + r.normal(0.1)).toFixed(2)},${(r.next() * 360).toFixed(1)},${11 + Math.floor(r.next() * 4)},${(0.8 + r.next() * 0.4).toFixed(2)},${(-80 + r.normal(6)).toFixed(1)},${Math.min(100, Math.round(95 + r.normal(3)))},${(8 + r.normal(2)).toFixed(1)},${(15.8 - used / 2000).toFixed(2)},${(9 + r.normal(0.6)).toFixed(2)},${used.toFixed(1)},${modes[Math.floor(i / 250000) % 4]}\n`;
  }
}

/** The same telemetry as one string, for load tests that upload many different logs. */
export function benchCsvText(rows: number, seed: number): string {
  const parts = [BENCH_HEADER + "\n"];
  for (const line of benchRows(rows, seed)) parts.push(line);
  return parts.join("");
}

/** Writes `rows` rows of plausible 15-column telemetry (10 Hz) to `file`; streamed, not built in memory. */
export async function writeBenchCsv(file: string, rows: number, seed = 7): Promise<number> {
  const out = fs.createWriteStream(file);
  out.write(BENCH_HEADER + "\n");
  let buf = "";
  for (const line of benchRows(rows, seed)) {
    buf += line;
    if (buf.length > 1 << 20) {
      if (!out.write(buf)) await once(out, "drain");
      buf = "";
    }
  }
  out.write(buf);
  out.end();
  await once(out, "finish");
  return fs.statSync(file).size;
}
