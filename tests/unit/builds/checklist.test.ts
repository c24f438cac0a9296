/**
 * The pre-run checklist generator (lib/builds/checklist.ts, pure): the failsafe part says when the
 * build's bench test is missing or stale (DESIGN.md §10), and the bench-test steps make the
 * vehicle safe first (DESIGN.md §8). The build is our own invented rover, not any product's.
 */
import { describe, expect, it } from "vitest";
import type { BuildWithChannels } from "@/db/queries/builds";
import { buildChecklist } from "@/lib/builds/checklist";

const t0 = new Date("2026-11-01T09:00:00Z");

function rover(over: Partial<BuildWithChannels> = {}): BuildWithChannels {
  const channels = Array.from({ length: 18 }, (_, i) => ({
    buildId: 1,
    channel: i + 1,
    function: (["roll", "pitch", "throttle", "yaw", "arm", "mission", "return-to-home"] as const)[i] ?? ("unused" as const),
    switchLabel: i >= 4 && i <= 6 ? "SC" : null,
    positions: i >= 4 && i <= 6 ? 3 : null,
    engageMinUs: i === 6 ? 1800 : null,
    engageMaxUs: i === 6 ? 2100 : null,
    failsafeUs: i === 6 ? 2000 : null,
  }));
  return {
    id: 1,
    crewId: 1,
    name: "Invented rover",
    vehicleType: "ground",
    frame: null,
    flightController: null,
    firmware: null,
    firmwareVersion: null,
    receiver: "868 receiver",
    transmitter: "Hand radio",
    bandMhz: 868,
    txPowerMw: 25,
    rxSensitivityDbm: -112,
    antennas: "Dipole",
    batteryCells: 4,
    batteryCapacityMah: 5000,
    notes: null,
    failsafeAction: "return-to-home",
    failsafeWithinS: 1.5,
    thresholds: null,
    retiredAt: null,
    linkSheetChangedAt: null,
    createdBy: null,
    createdAt: t0,
    updatedAt: t0,
    channels,
    ...over,
  };
}

const th = { lowCellV: 3.5 };

describe("buildChecklist", () => {
  it("lists a missing bench test", () => {
    const c = buildChecklist(rover(), th);
    expect(c.benchTestRecord).toEqual({ state: "missing", line: "No failsafe bench test recorded for this build: bench-test it before the run." });
    expect(buildChecklist(rover(), th, null).benchTestRecord.state).toBe("missing");
  });

  it("lists a bench test the link sheet changed after as stale, with both days", () => {
    const c = buildChecklist(rover({ linkSheetChangedAt: new Date("2026-11-20T08:00:00Z") }), th, { testedAt: new Date("2026-11-14T16:00:00Z"), result: "pass" });
    expect(c.benchTestRecord.state).toBe("stale");
    expect(c.benchTestRecord.line).toBe("The failsafe bench test of 14 Nov 2026 is stale: the link sheet changed on 20 Nov 2026. Bench-test it again before the run.");
  });

  it("says a current bench test holds, and a failed one must be done again", () => {
    const changed = { linkSheetChangedAt: new Date("2026-11-10T08:00:00Z") };
    expect(buildChecklist(rover(changed), th, { testedAt: new Date("2026-11-14T16:00:00Z"), result: "pass" }).benchTestRecord.state).toBe("current");
    const failed = buildChecklist(rover(changed), th, { testedAt: new Date("2026-11-14T16:00:00Z"), result: "not-triggered" }).benchTestRecord;
    expect(failed.state).toBe("failed");
    expect(failed.line).toContain("did not pass (did not trigger)");
  });

  it("makes the vehicle safe before the bench-test steps, per vehicle type (DESIGN.md §8)", () => {
    expect(buildChecklist(rover(), th).benchTest[0]).toMatch(/^Lift the wheels/);
    expect(buildChecklist(rover({ vehicleType: "multirotor" }), th).benchTest[0]).toMatch(/^Remove the propellers/);
    expect(buildChecklist(rover({ vehicleType: "boat" }), th).benchTest[0]).toMatch(/out of the water/);
  });

  it("names the channels the receiver should output on loss, and the plan's action and time", () => {
    const c = buildChecklist(rover(), th);
    expect(c.benchTest).toContain("The receiver should now output: channel 7 (return to home) 2000 µs.");
    expect(c.failsafePlan).toBe("On link loss the vehicle should return to home within 1.5 s.");
  });

  it("does not change the build it reads", () => {
    const b = rover({ linkSheetChangedAt: new Date("2026-11-20T08:00:00Z") });
    const before = JSON.stringify(b);
    buildChecklist(b, th, { testedAt: new Date("2026-11-14T16:00:00Z"), result: "pass" });
    expect(JSON.stringify(b)).toBe(before);
  });
});
