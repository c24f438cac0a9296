/**
 * Issue 12, points 4 and 5 — "Failsafe is set in two places" and "Bench failsafe test" (DESIGN.md
 * §10, common practice): wheels lifted, indoors, no GPS fix; armed; transmitter off for 10 s. RSSI
 * on channel 14 drops to 0 %; the receiver puts channel 8 (RTH) at its planned failsafe value
 * 1900 µs 0.4 s after the loss begins; the plan is return to home within 1 s. The crew attached
 * its usual route plan, which a bench log cannot be judged against.
 *
 * Expected values from the scenario's timeline. Tolerance for every time and latency: one sample
 * interval (0.1 s at 10 Hz) — the loss, the channel and the mode change are each seen at a sample.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { benchFailsafeScenario, launchPointScenario, type BenchVariant } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, type AnalysedLog } from "./analyse-log";
import { expectWithin, notAssessedParts } from "./expect-within";

const plan = launchPointScenario().plan; // the crew's usual plan at the field

describe.each<[BenchVariant, string]>([
  ["rc-rssi", "RSSI on channel 14, no mode column, no position columns"],
  ["no-fix", "RSSI on channel 14, no mode column, GPS columns reporting no fix"],
  ["rc-rssi-mode", "RSSI on channel 14 and a mode column switching to RTH"],
  ["rssi-column", "an RSSI % column instead of channel 14, no mode column"],
])("scenario: bench failsafe test, %s", (variant, what) => {
  const sc = benchFailsafeScenario({ variant });
  const tl = sc.timeline;
  const sampleS = 1 / tl.hz;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build, plan);
  });

  it(`is a bench log (${what}): no home, GPS and route not assessed, no route events`, () => {
    expect(a.summary.bench).toBe(true);
    expect(a.summary.home).toBeNull();
    expect(notAssessedParts(a.summary)).toEqual(expect.arrayContaining(["gps", "route"]));
    for (const x of a.summary.verdict.notAssessed) expect(x.why, x.what).toMatch(/\w/);
    expect(a.summary.verdict.held).not.toContain("gps");
    expect(a.summary.verdict.held).not.toContain("route");
    for (const k of ["off-route", "waypoint-missed", "waypoint-reached", "fix-lost", "position-jump"] as const) expect(a.of(k), k).toHaveLength(0);
  });

  it("reads the link from the right source and finds one loss while the transmitter was off", () => {
    expect(a.summary.link.metric).toBe("rssi-pct");
    expect(a.summary.link.source).toEqual(variant === "rssi-column" ? { kind: "column" } : { kind: "rc-channel", channel: tl.rssiChannel });
    const lost = a.of("link-lost");
    expect(lost).toHaveLength(1);
    expectWithin(lost[0].startS, tl.txOffS, sampleS, "link-lost start");
    expectWithin(lost[0].endS, tl.txOnS, sampleS, "link-lost end");
    expect(a.of("link-fade")).toHaveLength(0);
  });

  it("sees the failsafe commanded by channel 8 at its planned value 0.4 s into the loss", () => {
    const fs = a.summary.failsafe;
    expect(fs.plan).toEqual(sc.build.failsafe);
    expect(fs.commanded).toMatchObject({ by: "rc-channel", channel: tl.rthChannel });
    expectWithin(fs.commanded.atS, tl.commandS, sampleS, "commanded.atS");
    expectWithin(fs.commanded.latencyS, tl.commandS - tl.txOffS, sampleS, "commanded.latencyS");
  });

  if (variant === "rc-rssi-mode") {
    it("sees the flown action by the mode change to RTH, 0.9 s into the loss: pass", () => {
      const fs = a.summary.failsafe;
      expect(fs.flown).toMatchObject({ state: "seen", by: "mode", action: "return-to-home", mode: "RTH" });
      expectWithin(fs.flown.atS, tl.modeRthS, sampleS, "flown.atS");
      expectWithin(fs.flown.latencyS, tl.modeRthS - tl.txOffS, sampleS, "flown.latencyS");
      expect(fs.result).toBe("pass");
    });
  } else {
    it("says the flown action was not logged (no mode column, no track) and judges the commanded latency: pass, never wrong action", () => {
      const fs = a.summary.failsafe;
      expect(fs.result).not.toBe("wrong-action");
      expect(fs.result).toBe("pass");
      expect(fs.flown).toEqual({ state: "not-logged" });
      expect(a.summary.verdict.reasons.filter((r: string) => /wrong action|did not trigger|later than planned/i.test(r))).toEqual([]);
    });
  }
});
