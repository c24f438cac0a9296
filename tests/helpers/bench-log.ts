/**
 * A failsafe bench test's log, shaped like everyday practice (DESIGN.md §10 "Bench failsafe
 * test"; issue 12): vehicle on the stand, no GPS at all, armed, the transmitter switched off for
 * 10 s. RSSI (%) reads 95–100 and drops to 0 for the outage; the receiver moves the
 * return-to-home channel 8 to its failsafe value 1900 µs 0.4 s after the loss; no mode column.
 * Invented numbers throughout.
 */
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { runs } from "@/db/schema";

/** When the transmitter goes off and on again, s from the first sample; the RTH channel's delay. */
export const BENCH = { lossStartS: 15, lossEndS: 25, commandDelayS: 0.4, rthChannel: 8, failsafeUs: 1900, hz: 10, durationS: 40 } as const;

/** The CSV (ISO 8601 times from `start`, so the run's start time is the test's date). */
export function benchCsv(start: Date = new Date()): string {
  const { lossStartS, lossEndS, commandDelayS, failsafeUs, hz, durationS } = BENCH;
  const rows = ["time,armed,voltage_v,rssi_pct,rc1,rc2,rc3,rc4,rc5,rc6,rc7,rc8"];
  for (let i = 0; i <= durationS * hz; i++) {
    const t = i / hz;
    const lost = t >= lossStartS && t < lossEndS;
    const armed = t >= 2 && t < durationS - 2;
    const rssi = lost ? 0 : 95 + (i % 6);
    const rc8 = t >= lossStartS + commandDelayS && t < lossEndS ? failsafeUs : 1000;
    rows.push([new Date(start.getTime() + t * 1000).toISOString(), armed ? 1 : 0, (16.6 - 0.002 * i).toFixed(2), rssi, 1500, 1500, 1000, 1500, armed ? 2000 : 1000, 1000, 1000, rc8].join(","));
  }
  return rows.join("\n") + "\n";
}

export interface SheetChannel {
  channel: number;
  function: string;
  switchLabel?: string | null;
  positions?: number | null;
  engageMinUs?: number | null;
  engageMaxUs?: number | null;
  failsafeUs?: number | null;
}

/** The bench sheet: channel 8 returns home (failsafe 1900 µs), channel 5 arms; the plan: return to home within 1.5 s. */
export function benchSheet(): { channels: SheetChannel[]; failsafeAction: string; failsafeWithinS: number } {
  return {
    channels: Array.from({ length: 18 }, (_, i): SheetChannel => {
      const channel = i + 1;
      if (channel === 5) return { channel, function: "arm", switchLabel: "SA", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 };
      if (channel === 8) return { channel, function: "return-to-home", switchLabel: "SC", positions: 3, engageMinUs: 1800, engageMaxUs: 2000, failsafeUs: BENCH.failsafeUs };
      return { channel, function: channel <= 4 ? (["roll", "pitch", "throttle", "yaw"] as const)[i] : "unused" };
    }),
    failsafeAction: "return-to-home",
    failsafeWithinS: 1.5,
  };
}

/**
 * What issue 12's analysis stores for `benchCsv` (/work/issue12-contract.md), written onto a ready
 * run. For tests of the recording rules, independent of the analysis: the tests that need the
 * analysis itself upload `benchCsv` and read what it produced.
 */
export async function markAsBenchRun(runId: number, failsafe: Record<string, unknown> = {}): Promise<void> {
  const [row] = await db().select({ summary: runs.summary }).from(runs).where(eq(runs.id, runId));
  const { lossStartS, commandDelayS, rthChannel } = BENCH;
  const summary = {
    ...(row?.summary ?? {}),
    bench: true,
    failsafe: {
      result: "pass",
      why: null,
      plan: { action: "return-to-home", expectedWithinS: 1.5 },
      commanded: { by: "rc-channel", channel: rthChannel, atS: lossStartS + commandDelayS, latencyS: commandDelayS },
      flown: { state: "not-logged" },
      latencyS: commandDelayS,
      actionLatencyS: null,
      action: null,
      ...failsafe,
    },
  };
  await db().update(runs).set({ summary }).where(eq(runs.id, runId));
}
