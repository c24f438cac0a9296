/**
 * Event words (components/debrief/event-words.ts): a loss that began as a fade, and a failsafe's
 * commanded and flown halves, worded with lib/analysis/evidence.ts. Details are shaped like the
 * analysis' events for our demo logs (npm run analyse on scripts/simulator/demo-runs.ts).
 */
import { describe, expect, it } from "vitest";
import { eventDetail, eventLabel, eventPeak, eventTone, eventWindow, fadeLeadIn, type DebriefEvent } from "@/components/debrief/event-words";

const ev = (kind: string, detail: Record<string, unknown> | null, more: Partial<DebriefEvent> = {}): DebriefEvent => ({
  id: 1, kind, startS: 111.6, endS: 111.7, lat: null, lon: null, distanceFromHomeM: null, peak: null, threshold: null, detail, ...more,
});

const benchFailsafe = ev(
  "failsafe",
  {
    commanded: { by: "rc-channel", channel: 8, atS: 20.4, latencyS: 0.4 },
    flown: { state: "not-logged" },
    outcome: "pass",
    why: null,
  },
  { startS: 20.4, endS: 30, peak: 0.4, threshold: 1 },
);

describe("eventLabel", () => {
  it("says where a loss's lead-in fade began", () => {
    const lost = ev("link-lost", { fadeStartS: 111.1, fadeEndS: 113.6 });
    expect(eventLabel(lost)).toBe("Link lost (faded from 1:51)");
    expect(eventLabel(ev("link-lost", { causes: ["floor"] }))).toBe("Link lost");
  });

  it("words a failsafe's outcome with the result words, including the ones older analyses stored", () => {
    expect(eventLabel(benchFailsafe)).toBe("Failsafe (acted as planned)");
    expect(eventLabel(ev("failsafe", { outcome: "late" }))).toBe("Failsafe (acted late)");
    expect(eventLabel(ev("failsafe", { outcome: "not-assessed" }))).toBe("Failsafe (not assessed)");
    expect(eventLabel(ev("failsafe", { outcome: "not-due" }))).toBe("Failsafe (not due: the loss ended before the planned time)");
    expect(eventLabel(ev("failsafe", { outcome: "no-plan" }))).toBe("Failsafe (not assessed)");
  });

  it("names the waypoint", () => {
    expect(eventLabel(ev("waypoint-missed", { waypoint: "Dune post" }))).toBe("Waypoint missed: Dune post");
  });
});

describe("eventDetail", () => {
  it("gives a failsafe's commanded and flown halves", () => {
    expect(eventDetail(benchFailsafe)).toBe("commanded: 0.4 s after the loss (channel 8 at its failsafe value) · flown: not logged (no mode column, no track)");
    const flown = ev("failsafe", {
      commanded: { by: "flag", channel: null, atS: 168.9, latencyS: 0.9 },
      flown: { state: "seen", by: "mode", action: "return-to-home", atS: 169.4, latencyS: 1.4, mode: "RTH", evidence: null },
      outcome: "pass",
    });
    expect(eventDetail(flown)).toBe("commanded: 0.9 s after the loss (failsafe flag) · flown: return to home 1.4 s after the loss (mode RTH)");
  });

  it("says nothing more for other events and for older failsafe details", () => {
    expect(eventDetail(ev("link-lost", { fadeStartS: 1 }))).toBeNull();
    expect(eventDetail(ev("failsafe", { outcome: "pass", latencyS: 1 }))).toBeNull();
  });
});

describe("eventTone", () => {
  it("is information for a failsafe that acted as planned, watch when nobody could judge it, act otherwise", () => {
    expect(eventTone(benchFailsafe)).toBe("info");
    expect(eventTone(ev("failsafe", { outcome: "not-assessed" }))).toBe("watch");
    expect(eventTone(ev("failsafe", { outcome: "not-due" }))).toBe("watch");
    expect(eventTone(ev("failsafe", { outcome: "wrong-action" }))).toBe("act");
  });
});

describe("eventPeak", () => {
  it("gives a failsafe's first sign against the plan", () => {
    expect(eventPeak(benchFailsafe, "metric", "%")).toBe("first sign 0.4 s after the loss (plan 1 s)");
  });
});

describe("fadeLeadIn and eventWindow", () => {
  it("shows a loss from its fade's onset", () => {
    const lost = ev("link-lost", { fadeStartS: 100 }, { startS: 130, endS: 131 });
    expect(fadeLeadIn(lost)).toBe(100);
    // 31 s from the onset to the end, padded by max(10, 0.75 × 31) = 23.25 s either side.
    expect(eventWindow(lost, 300)).toEqual({ from: 76.75, to: 154.25 });
    expect(eventWindow({ startS: 130, endS: 131 }, 300)).toEqual({ from: 120, to: 141 });
  });

  it("ignores an onset that is missing, not a number or after the loss", () => {
    expect(fadeLeadIn(ev("link-lost", null))).toBeNull();
    expect(fadeLeadIn(ev("link-lost", { fadeStartS: "soon" }))).toBeNull();
    expect(fadeLeadIn(ev("link-lost", { fadeStartS: 200 }))).toBeNull();
    expect(fadeLeadIn(ev("link-fade", { fadeStartS: 100 }))).toBeNull();
  });
});
