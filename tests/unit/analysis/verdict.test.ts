import { describe, expect, it } from "vitest";
import { judgeRun, type VerdictInput } from "@/lib/analysis/verdict";

/* Rules: DESIGN.md §5 "Verdict" — clear (nothing fired), watch (fades, off-route, warnings),
 * act (link lost, failsafe wrong or late, low voltage, missed waypoints). */
const QUIET: VerdictInput = Object.freeze({
  linkLost: 0,
  linkFades: 0,
  offRoute: 0,
  waypointsMissed: Object.freeze([]) as unknown as string[],
  lowVoltage: 0,
  fixLost: 0,
  positionJumps: 0,
});
const judge = (over: Partial<VerdictInput>) => judgeRun({ ...QUIET, ...over });

describe("judgeRun", () => {
  it("is clear with no reasons when nothing fired", () => {
    expect(judgeRun(QUIET)).toEqual({ level: "clear", reasons: [], held: ["link", "route", "battery", "gps"], notAssessed: [] });
    expect(judge({ failsafeResult: "pass", hdopWarnS: 0 })).toMatchObject({ level: "clear", reasons: [] });
  });

  it("acts when the link was lost", () => {
    expect(judge({ linkLost: 1 })).toMatchObject({ level: "act", reasons: ["Link lost once"] });
    expect(judge({ linkLost: 2 })).toMatchObject({ level: "act", reasons: ["Link lost twice"] });
    expect(judge({ linkLost: 3 }).reasons).toEqual(["Link lost 3 times"]);
  });

  it("acts when the failsafe took the wrong action", () => {
    expect(judge({ failsafeResult: "wrong-action" })).toMatchObject({ level: "act", reasons: ["Failsafe took the wrong action"] });
    expect(judge({ failsafeResult: "Wrong action" }).level).toBe("act");
  });

  it("acts when the failsafe was late", () => {
    expect(judge({ failsafeResult: "late" })).toMatchObject({ level: "act", reasons: ["Failsafe acted later than planned"] });
  });

  it("acts when the failsafe did not trigger", () => {
    expect(judge({ failsafeResult: "not_triggered" })).toMatchObject({
      level: "act",
      reasons: ["Failsafe did not trigger when the link was lost"],
    });
  });

  it("ignores a failsafe result it does not know", () => {
    expect(judge({ failsafeResult: "toString" }).level).toBe("clear");
    expect(judge({ failsafeResult: "" }).level).toBe("clear");
  });

  it("acts on low voltage", () => {
    expect(judge({ lowVoltage: 1 })).toMatchObject({ level: "act", reasons: ["Low voltage once"] });
  });

  it("acts on missed waypoints, naming them", () => {
    expect(judge({ waypointsMissed: ["Dune post"] })).toMatchObject({ level: "act", reasons: ["1 waypoint missed: Dune post"] });
    expect(judge({ waypointsMissed: ["WP2", "Dune post"] }).reasons).toEqual(["2 waypoints missed: WP2, Dune post"]);
  });

  it("watches link fades", () => {
    expect(judge({ linkFades: 4 })).toMatchObject({ level: "watch", reasons: ["Link faded 4 times"] });
  });

  it("watches off-route", () => {
    expect(judge({ offRoute: 2 })).toMatchObject({ level: "watch", reasons: ["Off route twice"] });
  });

  it("watches GPS fix lost", () => {
    expect(judge({ fixLost: 1 })).toMatchObject({ level: "watch", reasons: ["GPS fix lost once"] });
  });

  it("watches position jumps", () => {
    expect(judge({ positionJumps: 1 })).toMatchObject({ level: "watch", reasons: ["1 position jump"] });
    expect(judge({ positionJumps: 5 }).reasons).toEqual(["5 position jumps"]);
  });

  it("watches time with HDOP above the warning", () => {
    expect(judge({ hdopWarnS: 12.4 })).toMatchObject({ level: "watch", reasons: ["HDOP above the warning level for 12 s"] });
    expect(judge({ hdopWarnS: 3.25 }).reasons).toEqual(["HDOP above the warning level for 3.3 s"]);
  });

  it("acts when act and watch rules both fire, listing act reasons first", () => {
    expect(judge({ linkFades: 3, linkLost: 2, waypointsMissed: ["Dune post"] })).toMatchObject({
      level: "act",
      reasons: ["Link lost twice", "1 waypoint missed: Dune post", "Link faded 3 times"],
    });
  });

  it("does not fire on zero, negative or NaN counts", () => {
    expect(judge({ linkLost: NaN, linkFades: -1, lowVoltage: 0, hdopWarnS: NaN }).level).toBe("clear");
  });

  // DESIGN.md §10 "Evidence, not absence": clear only for what was assessed.
  it("lists the parts assessed with nothing fired as held, and never a part that was not assessed", () => {
    expect(judge({ failsafeResult: "pass" }).held).toEqual(["link", "failsafe", "route", "battery", "gps"]);
    const gaps = [
      { what: "link" as const, why: "the log has no link metric" },
      { what: "failsafe" as const, why: "no link loss in this run to exercise it" },
    ];
    const v = judge({ notAssessed: gaps });
    expect(v).toEqual({ level: "clear", reasons: [], held: ["route", "battery", "gps"], notAssessed: gaps });
  });

  it("does not call a part held when one of its rules fired", () => {
    expect(judge({ linkFades: 1, offRoute: 1, failsafeResult: "pass" }).held).toEqual(["failsafe", "battery", "gps"]);
    expect(judge({ hdopWarnS: 2, failsafeResult: "late" }).held).toEqual(["link", "route", "battery"]);
  });

  it("does not mutate its input", () => {
    const input = Object.freeze({ ...QUIET, waypointsMissed: Object.freeze(["A"]) as unknown as string[] });
    expect(judgeRun(input).reasons).toEqual(["1 waypoint missed: A"]);
    expect(input.waypointsMissed).toEqual(["A"]);
  });
});
