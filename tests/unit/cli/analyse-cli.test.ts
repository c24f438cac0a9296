/**
 * The command-line analyser, run as a user would: on our simulator's demo logs (our own data) and on
 * every real GPX recording in ../shared/reference/gpx (open-source GPX libraries' test suites, see
 * SOURCES.md there), which must all be analysed without an error.
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { demoCrew } from "@/db/demo-crew";
import { demoLogs } from "@/scripts/simulator/demo-runs";

const tsx = path.resolve("node_modules/.bin/tsx");
const run = (...args: string[]) => spawnSync(tsx, ["scripts/analyse.ts", ...args, "--json"], { encoding: "utf8", timeout: 60_000 });
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sortie-cli-"));
const refDir = path.resolve(process.cwd(), "../shared/reference/gpx");

describe("npm run analyse", () => {
  beforeAll(() => {
    for (const log of demoLogs()) fs.writeFileSync(path.join(dir, log.fileName), log.body);
    fs.writeFileSync(path.join(dir, "plan.json"), JSON.stringify({ waypoints: demoCrew.routePlans[0].waypoints }));
    const b = demoCrew.builds[0];
    fs.writeFileSync(
      path.join(dir, "build.json"),
      JSON.stringify({ vehicleType: b.vehicleType, cells: b.batteryCells, bandMhz: b.bandMhz, rxSensitivityDbm: b.rxSensitivityDbm, failsafe: { action: b.failsafeAction, expectedWithinS: b.failsafeWithinS } }),
    );
  });

  it("prints one JSON document with the summary and events of the demo rover log", () => {
    const r = run(path.join(dir, "mudlark-flats-loop.csv"), "--route", path.join(dir, "plan.json"), "--build", path.join(dir, "build.json"));
    expect(r.status, r.stderr).toBe(0);
    const doc = JSON.parse(r.stdout);
    expect(doc.format).toBe("csv");
    expect(doc.samples).toBe(demoLogs()[0].body.trim().split("\n").length - 1);
    const kinds = new Set(doc.events.map((e: { kind: string }) => e.kind));
    // The simulator puts a fade behind the dune, one link loss with failsafe return-to-home and a sag.
    for (const k of ["link-fade", "link-lost", "failsafe", "return-to-home", "low-voltage", "waypoint-reached", "armed", "disarmed"]) expect(kinds.has(k), k).toBe(true);
    expect(doc.summary.failsafe.action).toBe("return-to-home");
    expect(doc.summary.verdict.level).toBe("act");
    expect(doc.summary.link.metric).toBe("lq");
    expect(doc.summary.power.cells).toBe(4);
    expect(doc.summary.range.label).toMatch(/estimate/);
  });

  it("reads the GPX and NMEA demo logs", () => {
    for (const f of ["sandpiper-flats-loop.gpx", "heron-gps.nmea"]) {
      const r = run(path.join(dir, f));
      expect(r.status, `${f}: ${r.stderr}`).toBe(0);
      expect(JSON.parse(r.stdout).summary.distanceM).toBeGreaterThan(100);
    }
  });

  it.each(fs.existsSync(refDir) ? fs.readdirSync(refDir).filter((f) => f.endsWith(".gpx")) : [])("analyses the reference recording %s or refuses it in one line", (f) => {
    const r = run(path.join(refDir, f));
    if (r.status === 2) {
      // Files without track points (routes, empty tracks) are refused with a clear reason.
      expect(r.stderr.trim().split("\n")).toHaveLength(1);
      expect(r.stderr).toMatch(/track points/);
    } else {
      expect(r.status, r.stderr).toBe(0);
      expect(JSON.parse(r.stdout).format).toBe("gpx");
    }
  });

  it("exits 2 with a one-line message, no stack trace, for bad input", () => {
    fs.writeFileSync(path.join(dir, "junk.csv"), Buffer.from([0, 1, 2, 3, 255, 254, 0, 0]));
    const r = run(path.join(dir, "junk.csv"));
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).not.toMatch(/\bat .*\.ts:\d+/);
    expect(run(path.join(dir, "missing.csv")).status).toBe(2);
  });
});
