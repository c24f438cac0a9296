/**
 * Issue 12, point 3 — "RSSI often travels on a spare RC channel" (DESIGN.md §10, common
 * practice: 1000–2000 µs = 0–100 %). The log has no RSSI or LQ column; the receiver puts RSSI on
 * channel 12, which the build's link sheet names "rssi". The link is lost for 6 s (channel 12 at
 * 1000 µs); channel 8 (RTH) reaches its planned failsafe value 1900 µs 0.5 s into the loss; the
 * controller's mode turns RTH 1.0 s into it (plan: return to home within 2 s).
 *
 * Expected values from the scenario's timeline and the channel values as written.
 * Tolerances: event and failsafe times one sample interval (0.1 s at 10 Hz); RSSI figures 0.1 %
 * (one µs step of the channel is 0.1 %).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { rssiChannelScenario } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, csvRows, type AnalysedLog } from "./analyse-log";
import { expectWithin } from "./expect-within";

/** Median by sorting, linear interpolation between the middle two (R type 7). */
function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const h = (s.length - 1) / 2;
  return s[Math.floor(h)] + (s[Math.ceil(h)] - s[Math.floor(h)]) * (h - Math.floor(h));
}

describe("scenario: RSSI only on RC channel 12, one 6 s link loss", () => {
  const sc = rssiChannelScenario();
  const tl = sc.timeline;
  const sampleS = 1 / tl.hz;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("reads the link metric as RSSI % from channel 12, the link sheet's RSSI channel", () => {
    expect(a.summary.link.metric).toBe("rssi-pct");
    expect(a.summary.link.unit).toBe("%");
    expect(a.summary.link.source).toEqual({ kind: "rc-channel", channel: tl.rssiChannel });
    expect(a.summary.link.note ?? null).toBeNull();
  });

  it("derives its figures from the channel's µs: (µs − 1000) / 10", () => {
    const pct = csvRows(sc.log.text).map((r) => (Number(r[`ch${tl.rssiChannel}`]) - 1000) / 10);
    expect(a.summary.link.min).toBe(0);
    expectWithin(a.summary.link.median, median(pct), 0.1, "link.median");
  });

  it("finds exactly one link-lost event over the loss, and no separate fade for the same outage", () => {
    const lost = a.of("link-lost");
    expect(lost).toHaveLength(1);
    expectWithin(lost[0].startS, tl.lossStartS, sampleS, "link-lost start");
    expectWithin(lost[0].endS, tl.lossEndS, sampleS, "link-lost end");
    expect(a.of("link-fade")).toHaveLength(0);
    expect(a.summary.link.lostCount).toBe(1);
    expect(a.summary.link.fadeCount).toBe(0);
  });

  it("audits the failsafe: commanded by channel 8 at 0.5 s, flown as RTH by mode at 1.0 s, pass", () => {
    const fs = a.summary.failsafe;
    expect(fs.commanded).toMatchObject({ by: "rc-channel", channel: tl.rthChannel });
    expectWithin(fs.commanded.atS, tl.commandS, sampleS, "commanded.atS");
    expectWithin(fs.commanded.latencyS, tl.commandS - tl.lossStartS, sampleS, "commanded.latencyS");
    expect(fs.flown).toMatchObject({ state: "seen", by: "mode", action: "return-to-home", mode: "RTH" });
    expectWithin(fs.flown.latencyS, tl.rthModeS - tl.lossStartS, sampleS, "flown.latencyS");
    expect(fs.result).toBe("pass");
  });

  it("lists the loss in the verdict, once; the link is neither held nor not assessed", () => {
    expect(a.summary.verdict.level).toBe("act");
    expect(a.summary.verdict.reasons).toContain("Link lost once");
    expect(a.summary.verdict.reasons.filter((r: string) => /fade/i.test(r))).toEqual([]);
    expect(a.summary.verdict.held).not.toContain("link");
    expect(a.summary.verdict.notAssessed.map((x: { what: string }) => x.what)).not.toContain("link");
  });
});

describe("scenario: the same log with an RSSI % column as well as channel 12", () => {
  const sc = rssiChannelScenario({ withRssiColumn: true });
  const tl = sc.timeline;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("prefers the column and says that channel 12 also carries RSSI", () => {
    expect(a.summary.link.metric).toBe("rssi-pct");
    expect(a.summary.link.source).toEqual({ kind: "column" });
    expect(a.summary.link.note).toMatch(/channel 12/);
  });

  it("still finds the one loss at the same times, as one incident", () => {
    const lost = a.of("link-lost");
    expect(lost).toHaveLength(1);
    expect(a.of("link-fade")).toHaveLength(0);
    expectWithin(lost[0].startS, tl.lossStartS, 1 / tl.hz, "link-lost start");
    expectWithin(lost[0].endS, tl.lossEndS, 1 / tl.hz, "link-lost end");
  });
});
