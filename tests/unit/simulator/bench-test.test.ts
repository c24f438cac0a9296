/**
 * The demo bench failsafe test (scripts/simulator/bench-test.ts, our own generator) and the demo
 * quad's link sheet (db/demo-crew.ts) agree: parsed and analysed with the server's code, the log
 * reads as a bench run with RSSI from channel 14 and return to home commanded on channel 8. The
 * expected times are the generator's own timeline (transmitter off at 20 s, hold 0.4 s, 10 Hz).
 */
import { describe, expect, it } from "vitest";
import { demoCrew } from "@/db/demo-crew";
import { analyseRun } from "@/lib/analysis/analyse-run";
import { SeriesCollector } from "@/lib/analysis/series-collector";
import type { BuildConfig } from "@/lib/analysis/types";
import { parseLog } from "@/lib/parsers/parse-log";
import { benchChannels, benchTestCsv, simulateBenchTest } from "@/scripts/simulator/bench-test";
import { demoLogs, heronBench } from "@/scripts/simulator/demo-runs";
import { chunksOf } from "../../helpers/byte-source";

const heron = demoCrew.builds.find((b) => b.name === "Heron")!;
const build: BuildConfig = {
  vehicleType: heron.vehicleType,
  cells: heron.batteryCells,
  failsafe: { action: heron.failsafeAction, expectedWithinS: heron.failsafeWithinS },
  channels: heron.linkSheet.map((c) => ({ channel: c.channel, function: c.function, failsafeUs: c.failsafeUs, engageMinUs: c.engageMinUs, engageMaxUs: c.engageMaxUs })),
};

describe("simulateBenchTest", () => {
  const samples = simulateBenchTest(heronBench);
  const at = (t: number) => samples.find((s) => Math.abs(s.t - t) < 1e-6)!;

  it("drops the RSSI channel to its floor while the transmitter is off, and puts out the failsafe value after the hold", () => {
    expect(at(19.9).ch[13]).toBeGreaterThan(1900);
    expect(at(20).ch[13]).toBe(1000);
    expect(at(29.9).ch[13]).toBe(1000);
    expect(at(30).ch[13]).toBeGreaterThan(1900);
    expect(at(20.3).ch[7]).toBe(1000);
    expect(at(20.4).ch[7]).toBe(heronBench.rthFailsafeUs);
    expect(at(29.9).ch[7]).toBe(heronBench.rthFailsafeUs);
    expect(at(30).ch[7]).toBe(1000);
  });

  it("matches the demo quad's link sheet", () => {
    const sheet = (fn: string) => heron.linkSheet.find((c) => c.function === fn)!;
    expect(sheet("rssi").channel).toBe(heronBench.rssiChannel);
    expect(sheet("return-to-home").channel).toBe(heronBench.rthChannel);
    expect(sheet("return-to-home").failsafeUs).toBe(heronBench.rthFailsafeUs);
    expect(benchChannels(heronBench)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 14]);
  });

  it("writes no position, mode or RSSI column", () => {
    const header = benchTestCsv(samples, heronBench).split("\n")[0];
    expect(header).toBe("time_s,armed,battery_v,current_a,ch1,ch2,ch3,ch4,ch5,ch6,ch7,ch8,ch14");
  });

  it("reads as a bench run with RSSI from channel 14 and return to home commanded on channel 8", async () => {
    const log = demoLogs().find((l) => l.fileName === "heron-bench-failsafe.csv")!;
    expect(log.build).toBe("Heron");
    expect(log.routePlan).toBeUndefined();
    const c = new SeriesCollector();
    const parsed = await parseLog("csv", chunksOf(log.body), { onBatch: (b) => c.add(b) });
    const { summary } = analyseRun(c.series(parsed.modeNames), { build });
    expect(summary.bench).toBe(true);
    expect(summary.link.source).toEqual({ kind: "rc-channel", channel: 14 });
    expect(summary.failsafe.commanded).toMatchObject({ by: "rc-channel", channel: 8 });
    // The hold time, within one 0.1 s sample.
    expect(Math.abs(summary.failsafe.commanded!.latencyS - heronBench.holdS)).toBeLessThanOrEqual(0.1 + 1e-9);
    expect(summary.failsafe.flown).toEqual({ state: "not-logged" });
    expect(summary.failsafe.result).toBe("pass");
  });
});
