/**
 * The pure half of failsafe bench tests: what a bench run's summary lets a lead record (issue 12's
 * analysis contract, /work/issue12-contract.md), when a recorded test goes stale (DESIGN.md §10:
 * "a link-sheet change after it makes it stale"), and the words used for it.
 */
import { describe, expect, it } from "vitest";
import {
  benchCommandedWords,
  benchFlownWords,
  benchTestFacts,
  benchTestLine,
  benchTestStanding,
  dayWords,
  dayWordsBeside,
  isBenchTestStale,
} from "@/lib/builds/bench-test-facts";

/** A bench log's summary as the contract describes it: RTH channel 8 at its failsafe value 0.4 s after the loss, no mode column. */
const bench = (failsafe: Record<string, unknown> = {}) => ({
  bench: true,
  failsafe: {
    result: "pass",
    why: null,
    plan: { action: "return-to-home", expectedWithinS: 1.5 },
    commanded: { by: "rc-channel", channel: 8, atS: 15.4, latencyS: 0.4 },
    flown: { state: "not-logged" },
    latencyS: 0.4,
    actionLatencyS: null,
    action: null,
    ...failsafe,
  },
});

describe("benchTestFacts", () => {
  it("reads the result, the commanded latency and the flown state of a bench run", () => {
    const r = benchTestFacts(bench());
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.facts).toMatchObject({ result: "pass", commandedLatencyS: 0.4, flownLatencyS: null, flownState: "not-logged", action: null });
    expect(r.facts.failsafe.commanded).toEqual({ by: "rc-channel", channel: 8, atS: 15.4, latencyS: 0.4 });
  });

  it("takes the flown action and latency when a mode change showed it", () => {
    const r = benchTestFacts(
      bench({ result: "late", flown: { state: "seen", by: "mode", action: "return-to-home", atS: 17.5, latencyS: 2.5, mode: "RTH", evidence: null } }),
    );
    expect(r.ok && r.facts).toMatchObject({ result: "late", flownState: "seen", flownLatencyS: 2.5, action: "return-to-home" });
  });

  it("refuses a run that is not a bench log, whatever its failsafe says", () => {
    for (const s of [{ ...bench(), bench: false }, { failsafe: bench().failsafe }, null, undefined, "garbage", { bench: "yes" }]) {
      const r = benchTestFacts(s);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.problem).toBe("not-bench");
    }
  });

  it("refuses a bench log whose failsafe was not exercised, giving the analysis' reason", () => {
    const r = benchTestFacts(bench({ result: "not-assessed", why: "no link loss in this run to exercise it", commanded: null, flown: null }));
    expect(r).toMatchObject({ ok: false, problem: "not-exercised" });
    if (!r.ok) expect(r.message).toContain("(no link loss in this run to exercise it)");
    // Results an older analysis stored count as not exercised too.
    for (const result of ["not-tested", "no-plan", "something-new"]) expect(benchTestFacts(bench({ result })).ok).toBe(false);
    expect(benchTestFacts({ bench: true }).ok).toBe(false);
  });

  it("keeps a recordable result even when the commanded or flown halves are malformed", () => {
    const r = benchTestFacts(bench({ result: "not-triggered", commanded: { by: "smoke" }, flown: { state: "odd" } }));
    expect(r.ok && r.facts).toMatchObject({ result: "not-triggered", commandedLatencyS: null, flownState: null });
  });

  it("does not change the summary it reads", () => {
    const s = Object.freeze(bench());
    const before = JSON.stringify(s);
    benchTestFacts(s);
    expect(JSON.stringify(s)).toBe(before);
  });
});

describe("isBenchTestStale", () => {
  const tested = new Date("2026-11-14T10:00:00Z");
  it("is stale only when the link sheet changed after the test", () => {
    expect(isBenchTestStale(tested, null)).toBe(false);
    expect(isBenchTestStale(tested, new Date("2026-11-13T10:00:00Z"))).toBe(false);
    // The same instant is not "after".
    expect(isBenchTestStale(tested, new Date(tested))).toBe(false);
    expect(isBenchTestStale(tested, new Date(tested.getTime() + 1))).toBe(true);
  });
});

describe("benchTestStanding and benchTestLine", () => {
  const tested = new Date("2026-11-14T10:00:00Z");
  const changed = new Date("2026-11-20T08:30:00Z");
  it("says a missing test is missing", () => {
    expect(benchTestLine(benchTestStanding(null, changed))).toBe("No failsafe bench test recorded for this build: bench-test it before the run.");
  });
  it("says a test from before the last link-sheet change is stale, with both dates", () => {
    const s = benchTestStanding({ testedAt: tested, result: "pass" }, changed);
    expect(s.state).toBe("stale");
    expect(benchTestLine(s)).toBe("The failsafe bench test of 14 Nov 2026 is stale: the link sheet changed on 20 Nov 2026. Bench-test it again before the run.");
  });
  it("says a current test that did not pass did not pass", () => {
    const s = benchTestStanding({ testedAt: tested, result: "late" }, null);
    expect(s.state).toBe("failed");
    expect(benchTestLine(s)).toMatch(/^The failsafe bench test of 14 Nov 2026 did not pass \(acted late\)/);
  });
  it("says a current passed test holds", () => {
    const s = benchTestStanding({ testedAt: tested, result: "pass" }, new Date("2026-11-01T00:00:00Z"));
    expect(s.state).toBe("current");
    expect(benchTestLine(s)).toBe("Failsafe bench test of 14 Nov 2026: acted as planned, and the link sheet has not changed since.");
  });
});

describe("dayWords", () => {
  it("writes the UTC day, month name and year", () => {
    expect(dayWords(new Date("2026-01-02T23:59:59Z"))).toBe("2 Jan 2026");
    expect(dayWords(new Date("2026-12-31T00:00:00Z"))).toBe("31 Dec 2026");
  });
});

describe("dayWordsBeside", () => {
  it("adds the time only when both fall on the same UTC day", () => {
    const tested = new Date("2026-12-05T09:01:30Z");
    expect(dayWordsBeside(new Date("2026-12-05T09:02:10Z"), tested)).toBe("5 Dec 2026 at 09:02 UTC");
    expect(dayWordsBeside(new Date("2026-12-06T00:00:00Z"), tested)).toBe("6 Dec 2026");
  });
  it("writes both times in a same-day stale line", () => {
    const s = benchTestStanding({ testedAt: new Date("2026-12-05T09:01:30Z"), result: "pass" }, new Date("2026-12-05T14:20:00Z"));
    expect(benchTestLine(s)).toBe(
      "The failsafe bench test of 5 Dec 2026 at 09:01 UTC is stale: the link sheet changed on 5 Dec 2026 at 14:20 UTC. Bench-test it again before the run.",
    );
  });
});

describe("benchCommandedWords and benchFlownWords", () => {
  it("use the debrief's words from the recorded audit (lib/analysis/evidence.ts)", () => {
    const r = benchTestFacts(bench());
    if (!r.ok) throw new Error("expected a bench test");
    expect(benchCommandedWords(r.facts)).toBe("0.4 s after the loss (channel 8 at its failsafe value)");
    expect(benchFlownWords(r.facts)).toBe("not logged (no mode column, no track)");
  });
  it("fall back to the stored figures without an audit", () => {
    expect(benchCommandedWords({ commandedLatencyS: 0.42, failsafe: null })).toBe("0.4 s after the loss");
    expect(benchCommandedWords({ commandedLatencyS: null, failsafe: null })).toBe("not seen");
    expect(benchFlownWords({ flownState: "seen", flownLatencyS: 1.25, action: "hold", failsafe: null })).toBe("hold 1.3 s after the loss");
    expect(benchFlownWords({ flownState: null, flownLatencyS: null, action: null, failsafe: null })).toBe("—");
  });
});
