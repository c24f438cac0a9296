/**
 * Issue 12, point 7 — "One incident, one event" (DESIGN.md §10): LQ slides below the 70 % fade
 * threshold (DESIGN.md §5 default), stays low, and runs into a 4 s loss (LQ 0); after the loss it
 * comes back at 50 % and climbs past 75 % (threshold + 5 points hysteresis) over 2 s. That is one
 * incident: one link-lost event whose detail keeps the fade's onset (`fadeStartS`) and where the
 * recovery ended (`fadeEndS`); no link-fade over the same span; "Link lost once", no "faded".
 * A second run adds an earlier, unrelated fade that recovers before the loss: it stays a fade.
 *
 * Times from the scenario's timeline (the true crossings of the LQ ramps). Tolerances: loss start
 * and end one sample interval (0.1 s at 10 Hz); fade onset and recovery one sample plus 0.1 s for
 * the LQ noise (σ 1 point on ramps of 17.7 and 24 points/s move a crossing by ≤ 0.06 s per σ).
 */
import { beforeAll, describe, expect, it } from "vitest";
import { fadeIntoLossScenario } from "@/scripts/simulator/practice-scenarios";
import { analyseLog, type AnalysedLog } from "./analyse-log";
import { expectWithin } from "./expect-within";

describe("scenario: a fade that runs into a loss", () => {
  const sc = fadeIntoLossScenario();
  const tl = sc.timeline;
  const sampleS = 1 / tl.hz;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("gives exactly one link-lost event over the loss and no link-fade", () => {
    const lost = a.of("link-lost");
    expect(lost).toHaveLength(1);
    expectWithin(lost[0].startS, tl.lossStartS, sampleS, "link-lost start");
    expectWithin(lost[0].endS, tl.lossEndS, sampleS, "link-lost end");
    expect(a.of("link-fade")).toHaveLength(0);
  });

  it("keeps the fade's onset and the end of the recovery in the loss event's detail", () => {
    const [lost] = a.of("link-lost");
    expectWithin(lost?.detail.fadeStartS, tl.fadeOnsetS, sampleS + 0.1, "detail.fadeStartS");
    expectWithin(lost?.detail.fadeEndS, tl.fadeExitS, sampleS + 0.1, "detail.fadeEndS");
  });

  it("counts one incident: lostCount 1, fadeCount 0; the verdict says 'Link lost once' and nothing about fading", () => {
    expect(a.summary.link.lostCount).toBe(1);
    expect(a.summary.link.fadeCount).toBe(0);
    expect(a.summary.verdict.reasons).toContain("Link lost once");
    expect(a.summary.verdict.reasons.filter((r: string) => /fade/i.test(r))).toEqual([]);
  });

  it("still reports the time below the fade threshold, fade and loss together", () => {
    // Below 70 % from the onset until LQ passes 70 % again on the recovery ramp (40 + 2·20/48 s).
    const backAbove70 = tl.lossEndS + ((tl.recoveredS - tl.lossEndS) * (tl.fadeThresholdPct - tl.recoverLq)) / (tl.highLq - tl.recoverLq);
    expectWithin(a.summary.link.timeBelowFadeS, backAbove70 - tl.fadeOnsetS, 2 * sampleS, "link.timeBelowFadeS");
  });
});

describe("scenario: an unrelated fade before a fade that runs into a loss", () => {
  const sc = fadeIntoLossScenario({ separateFade: true });
  const tl = sc.timeline;
  const sampleS = 1 / tl.hz;
  let a: AnalysedLog;
  beforeAll(async () => {
    a = await analyseLog(sc.log, sc.build);
  });

  it("keeps the unrelated fade as its own event, and folds only the one that ran into the loss", () => {
    const fades = a.of("link-fade");
    expect(fades).toHaveLength(1);
    expectWithin(fades[0].startS, tl.separateFade!.startS, sampleS, "link-fade start");
    expectWithin(fades[0].endS, tl.separateFade!.endS, sampleS, "link-fade end");
    expect(a.of("link-lost")).toHaveLength(1);
    expect(a.summary.link.fadeCount).toBe(1);
    expect(a.summary.link.lostCount).toBe(1);
  });

  it("says 'Link lost once' and 'Link faded once': two incidents", () => {
    expect(a.summary.verdict.reasons).toEqual(expect.arrayContaining(["Link lost once", "Link faded once"]));
    expect(a.summary.verdict.reasons.filter((r: string) => /fade/i.test(r))).toEqual(["Link faded once"]);
  });
});
