/** The map's home and mission-start words (components/map/map-words.ts), from lib/analysis/evidence.ts. */
import { describe, expect, it } from "vitest";
import { homeTitle, missionStartTitle } from "@/components/map/map-words";

describe("homeTitle", () => {
  it("says which rule placed home", () => {
    expect(homeTitle({ source: "arming" })).toBe("Home: where the vehicle was armed (first good fix after arming)");
    expect(homeTitle({ source: "before-arming" })).toBe("Home: the last good fix before arming (no good fix came after it)");
  });

  it("is plain Home for an older summary without a source", () => {
    expect(homeTitle({})).toBe("Home");
    expect(homeTitle({ source: null })).toBe("Home");
  });
});

describe("missionStartTitle", () => {
  it("gives the time and what showed the mission starting", () => {
    expect(missionStartTitle({ source: "channel", startS: 63.4 })).toBe("Mission start at 1:03, when the link sheet's mission channel entered its engage range");
    expect(missionStartTitle({ source: "mode", startS: 3 })).toBe("Mission start at 0:03, when a mission mode was engaged");
  });
});
