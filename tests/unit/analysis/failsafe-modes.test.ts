import { describe, expect, it } from "vitest";
import { FAILSAFE_MODE_TABLE, classifyModeName } from "@/lib/analysis/failsafe-modes";

// Mode names below are generic spellings written for these tests (our own data).
describe("classifyModeName", () => {
  it("reads return-to-home from RTH, RTL, return and home in any case and spelling", () => {
    for (const name of ["RTH", "nav rth", "GPS_RTH", "SMART_RTL", "SmartRTL", "Return", "return to home", "GO HOME", "GPS Rescue"])
      expect(classifyModeName(name), name).toEqual({ failsafe: false, action: "return-to-home" });
  });

  it("reads land and hold (loiter) actions", () => {
    expect(classifyModeName("LAND")).toEqual({ failsafe: false, action: "land" });
    expect(classifyModeName("Landing")).toEqual({ failsafe: false, action: "land" });
    expect(classifyModeName("HOLD")).toEqual({ failsafe: false, action: "hold" });
    expect(classifyModeName("loiter")).toEqual({ failsafe: false, action: "hold" });
  });

  it("marks failsafe text, with its action when the name gives one", () => {
    expect(classifyModeName("FAILSAFE")).toEqual({ failsafe: true, action: null });
    expect(classifyModeName("Failsafe RTH")).toEqual({ failsafe: true, action: "return-to-home" });
  });

  it("leaves pilot modes alone, including altitude/position hold assists and words merely containing 'rth'", () => {
    for (const name of ["MANUAL", "ACRO", "ANGLE", "AUTO", "ALT_HOLD", "PosHold", "NORTH", "", "CRUISE"]) expect(classifyModeName(name), name).toBeNull();
  });

  it("keeps every table word lower case so matching stays case-insensitive", () => {
    for (const r of FAILSAFE_MODE_TABLE) expect(r.match).toBe(r.match.toLowerCase());
  });
});
