/**
 * The command-line analyser on practice-shaped logs (our own simulator, invented data), run as a
 * crew would: `npm run analyse -- <log> --build build.json [--route plan.json] --json`. The build
 * files carry the link sheet with failsafe values and engage ranges (lib/validations/analysis-input.ts).
 * The expected facts are issue 12's (see tests/unit/scenarios for the same logs in detail).
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { benchFailsafeScenario, gpxNoLinkScenario, launchPointScenario, rssiChannelScenario, type PracticeScenario } from "@/scripts/simulator/practice-scenarios";

const tsx = path.resolve("node_modules/.bin/tsx");
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "sortie-cli-practice-"));
// Generous: tsx compiles the analyser on each start, which is slow on a loaded machine.
const run = (...args: string[]) => spawnSync(tsx, ["scripts/analyse.ts", ...args, "--json"], { encoding: "utf8", timeout: 120_000 });

/** Writes the scenario's log, build.json and (given) plan.json; returns the analyser's JSON. */
function analyse(s: PracticeScenario<unknown>, plan = s.plan) {
  const log = path.join(dir, s.log.fileName);
  const build = path.join(dir, `${s.name}.build.json`);
  fs.writeFileSync(log, s.log.text);
  fs.writeFileSync(build, JSON.stringify(s.build));
  const args = [log, "--build", build];
  if (plan) {
    const file = path.join(dir, `${s.name}.plan.json`);
    fs.writeFileSync(file, JSON.stringify(plan));
    args.push("--route", file);
  }
  const r = run(...args);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

const parts = (doc: { summary: { verdict: { notAssessed?: { what: string }[] } } }) => (doc.summary.verdict.notAssessed ?? []).map((x) => x.what);

describe("npm run analyse on practice-shaped logs", () => {
  let bench: ReturnType<typeof analyse>;
  let gpx: ReturnType<typeof analyse>;
  let rssi: ReturnType<typeof analyse>;
  beforeAll(() => {
    // The bench log with the crew's usual route plan attached, as the upload form would.
    bench = analyse(benchFailsafeScenario({ variant: "rc-rssi" }), launchPointScenario().plan);
    gpx = analyse(gpxNoLinkScenario());
    rssi = analyse(rssiChannelScenario());
  }, 360_000);

  it("accepts build.json with a link sheet carrying failsafe values and engage ranges", () => {
    expect(benchFailsafeScenario().build.channels!.some((c) => c.engageMinUs !== undefined && c.failsafeUs !== undefined)).toBe(true);
    expect(bench.format).toBe("csv");
    expect(bench.samples).toBe(benchFailsafeScenario().samples.length);
  });

  it("bench test: bench, failsafe commanded by channel 8 after 0.4 s, flown not logged, pass; GPS and route not assessed", () => {
    const s = bench.summary;
    expect(s.bench).toBe(true);
    expect(s.failsafe.flown?.state).toBe("not-logged");
    expect(s.failsafe.commanded).toMatchObject({ by: "rc-channel", channel: 8 });
    expect(Math.abs(s.failsafe.commanded.latencyS - 0.4)).toBeLessThanOrEqual(0.1 + 1e-6); // one sample at 10 Hz
    expect(s.failsafe.result).toBe("pass");
    expect(parts(bench)).toEqual(expect.arrayContaining(["gps", "route"]));
    expect(s.link.source).toEqual({ kind: "rc-channel", channel: 14 });
    expect(bench.events.filter((e: { kind: string }) => e.kind === "link-lost")).toHaveLength(1);
  });

  it("GPX with no link data: no link metric; link and failsafe not assessed, and never held", () => {
    const s = gpx.summary;
    expect(gpx.format).toBe("gpx");
    expect(s.bench).toBe(false);
    expect(s.link.metric).toBeNull();
    expect(parts(gpx)).toEqual(expect.arrayContaining(["link", "failsafe"]));
    expect(s.verdict.held).not.toContain("link");
    expect(s.failsafe.result).toBe("not-assessed");
  });

  it("RSSI on a channel: the link metric comes from channel 12, and the loss is in the verdict", () => {
    expect(rssi.summary.link.metric).toBe("rssi-pct");
    expect(rssi.summary.link.source).toEqual({ kind: "rc-channel", channel: 12 });
    expect(rssi.summary.verdict.reasons).toContain("Link lost once");
  });
});
