/**
 * `npm run bench:analysis [-- samples]` — the full analysis of a run of 1,000,000 samples (default),
 * beside a baseline measured in the same run on the same arrays: one pass that only sums every
 * column. Prints seconds for each and the ratio. The series tiles our simulator's demo rover run
 * (demo data), with a route plan and a build, so every module does its real work.
 */
import { demoCrew } from "@/db/demo-crew";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { defaultThresholds } from "@/lib/analysis/thresholds";
import type { RunSeries } from "@/lib/analysis/types";
import { RC_CHANNELS } from "@/lib/parsers/types";
import { simulateRun } from "../simulator/simulate-run";

const fields = ["tS", "lat", "lon", "altM", "speedMps", "headingDeg", "sats", "hdop", "fixType", "rssiDbm", "rssiPct", "lqPct", "snrDb", "voltageV", "currentA", "usedMah", "modeIndex", "armed", "failsafe"] as const;

function tiledSeries(n: number): RunSeries {
  const sim = simulateRun({ seed: 11, waypoints: demoCrew.routePlans[0].waypoints, startSoc: 0.35, resistanceOhm: 0.06 });
  const modes = ["MANUAL", "AUTO", "RTH", "HOLD"];
  const cols = Object.fromEntries(fields.map((f) => [f, new Float64Array(n)])) as Record<(typeof fields)[number], Float64Array>;
  const rc = new Uint16Array(n * RC_CHANNELS);
  const period = sim[sim.length - 1].t + 0.1;
  for (let i = 0; i < n; i++) {
    const s = sim[i % sim.length];
    const lap = Math.floor(i / sim.length);
    cols.tS[i] = s.t + lap * period;
    cols.lat[i] = s.lat;
    cols.lon[i] = s.lon;
    cols.altM[i] = s.alt;
    cols.speedMps[i] = s.speed;
    cols.headingDeg[i] = s.heading;
    cols.sats[i] = s.sats;
    cols.hdop[i] = s.hdop;
    cols.fixType[i] = s.fix;
    cols.rssiDbm[i] = s.rssiDbm;
    cols.rssiPct[i] = NaN;
    cols.lqPct[i] = s.lq;
    cols.snrDb[i] = s.snr;
    cols.voltageV[i] = s.voltage;
    cols.currentA[i] = s.current;
    cols.usedMah[i] = s.usedMah + lap * 800;
    cols.modeIndex[i] = modes.indexOf(s.mode);
    cols.armed[i] = s.armed ? 1 : 0;
    cols.failsafe[i] = s.failsafe ? 1 : 0;
    for (let c = 0; c < 8; c++) rc[i * RC_CHANNELS + c] = s.ch[c];
  }
  const segmentStart = new Uint8Array(n);
  segmentStart[0] = 1;
  return { n, ...cols, rc, segmentStart, modeNames: modes };
}

function baseline(s: RunSeries): number {
  let sum = 0;
  for (const f of fields) {
    const a = s[f];
    for (let i = 0; i < s.n; i++) {
      const v = a[i];
      if (v === v) sum += v;
    }
  }
  return sum;
}

const n = Number(process.argv[2] ?? 1_000_000);
const series = tiledSeries(n);
const plan = { waypoints: demoCrew.routePlans[0].waypoints };
const b = demoCrew.builds[0];
const build = { vehicleType: b.vehicleType, cells: b.batteryCells, bandMhz: b.bandMhz, rxSensitivityDbm: b.rxSensitivityDbm, failsafe: { action: b.failsafeAction, expectedWithinS: b.failsafeWithinS } };
const th = defaultThresholds("ground");

baseline(series); // warm-up
analyseRun(tiledSeries(20_000), { build, plan, thresholds: th });
let t = process.hrtime.bigint();
const checksum = baseline(series);
const base = Number(process.hrtime.bigint() - t) / 1e9;
t = process.hrtime.bigint();
const result = analyseRun(series, { build, plan, thresholds: th });
const full = Number(process.hrtime.bigint() - t) / 1e9;
console.log(`samples                      ${n.toLocaleString("en")}`);
console.log(`baseline (sum every column)  ${base.toFixed(3)} s  (checksum ${checksum.toExponential(3)})`);
console.log(`full analysis                ${full.toFixed(3)} s  (${result.events.length} events, verdict ${result.summary.verdict.level})`);
console.log(`ratio analysis / baseline    ${(full / base).toFixed(1)}×   target: full analysis ≤ 2 s`);
