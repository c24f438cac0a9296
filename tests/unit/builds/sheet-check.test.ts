/**
 * Sheet check rules: each one fires on a sheet made to break it and stays quiet on one correct
 * reference sheet (our own invented rover set-up, not any product's defaults). Position values
 * (1000 / 1500 / 2000 µs ± 100) are common practice, as lib/builds/sheet-check.ts says.
 */
import { describe, expect, it } from "vitest";
import { summariseRc } from "@/lib/builds/rc-facts";
import {
  checkSheet,
  countIn,
  RULE_IDS,
  SHEET_RULES,
  switchPositions,
  type RuleId,
  type RunEvidence,
  type SheetChannel,
  type SheetInput,
} from "@/lib/builds/sheet-check";

const ch = (channel: number, fn: SheetChannel["function"], more: Partial<SheetChannel> = {}): SheetChannel => ({
  channel,
  function: fn,
  switchLabel: null,
  positions: null,
  engageMinUs: null,
  engageMaxUs: null,
  failsafeUs: null,
  ...more,
});

/** The one correct sheet every rule is checked against. */
function reference(): SheetInput {
  const channels: SheetChannel[] = [
    ch(1, "roll"),
    ch(2, "pitch"),
    ch(3, "throttle"),
    ch(4, "yaw"),
    // Stays armed on link loss, so the vehicle can carry out the planned return.
    ch(5, "arm", { switchLabel: "SA", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 }),
    ch(6, "mode", { switchLabel: "SB", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 1000 }),
    // One 3-position switch: low off, middle mission, high return to home.
    ch(7, "mission", { switchLabel: "SC", positions: 3, engageMinUs: 1400, engageMaxUs: 1600, failsafeUs: 1000 }),
    ch(8, "return-to-home", { switchLabel: "SC", positions: 3, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 }),
    ch(9, "rssi"),
    ch(10, "aux"),
  ];
  for (let c = 11; c <= 18; c++) channels.push(ch(c, "unused"));
  return { channels, failsafeAction: "return-to-home", failsafeWithinS: 1.5, bandMhz: 868, rxSensitivityDbm: -112 };
}

/** Deterministic noise in [-1, 1) (a linear congruential generator; Numerical Recipes constants). */
function noise(seed: number) {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32) * 2 - 1;
}

/** 1000 logged rows in which every switch visits its range and RSSI wanders on its own. */
function rows(tweak?: (row: number[], i: number) => void): number[][] {
  const r = noise(7);
  const out: number[][] = [];
  for (let i = 0; i < 1000; i++) {
    const row = new Array(18).fill(0);
    row[0] = 1500 + Math.round(300 * Math.sin(i / 10));
    row[1] = 1500 + Math.round(300 * Math.cos(i / 7));
    row[2] = 1000 + (i % 500);
    row[3] = 1500 + Math.round(200 * Math.sin(i / 13));
    row[4] = i < 100 ? 1000 : 2000;
    row[5] = i % 200 < 100 ? 1000 : 2000;
    row[6] = i % 300 < 150 ? 1500 : 1000;
    row[7] = i > 900 ? 2000 : 1000;
    row[8] = 1500 + Math.round(150 * r());
    tweak?.(row, i);
    out.push(row);
  }
  return out;
}

function evidence(opts: { rows?: number[][]; action?: string | null } = {}): RunEvidence[] {
  return [
    {
      runId: 41,
      title: "rover-flats",
      failsafe: { result: "pass", action: opts.action === undefined ? "return-to-home" : opts.action, planAction: "return-to-home" },
      rc: summariseRc(opts.rows ?? rows()),
    },
  ];
}

const ids = (s: SheetInput, ev: RunEvidence[] = evidence()) => checkSheet(s, ev).findings.map((f) => f.rule);
const at = (s: SheetInput, channel: number) => s.channels.find((c) => c.channel === channel)!;

/** How to break each rule; every rule of SHEET_RULES must have one. */
const breakers: Record<RuleId, { sheet?: (s: SheetInput) => void; evidence?: () => RunEvidence[] }> = {
  "arm-duplicate": { sheet: (s) => Object.assign(at(s, 10), { function: "arm", switchLabel: "SD", positions: 2, engageMinUs: 1800, engageMaxUs: 2100 }) },
  "arm-missing": { sheet: (s) => Object.assign(at(s, 5), ch(5, "unused")) },
  "rth-duplicate": { sheet: (s) => Object.assign(at(s, 10), { function: "return-to-home", switchLabel: "SD", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 }) },
  "rth-missing": { sheet: (s) => Object.assign(at(s, 8), ch(8, "unused")) },
  "mission-duplicate": { sheet: (s) => Object.assign(at(s, 10), { function: "mission", switchLabel: "SD", positions: 2, engageMinUs: 1800, engageMaxUs: 2100 }) },
  "mission-missing": { sheet: (s) => Object.assign(at(s, 7), ch(7, "unused")) },
  "rssi-on-stick": {
    sheet: (s) => {
      at(s, 3).function = "rssi";
      at(s, 9).function = "throttle";
    },
  },
  "rssi-duplicate": { sheet: (s) => (at(s, 10).function = "rssi") },
  "rssi-has-switch": { sheet: (s) => (at(s, 9).switchLabel = "SE") },
  "failsafe-plan-incomplete": { sheet: (s) => (s.failsafeWithinS = null) },
  "failsafe-no-channel": {
    sheet: (s) => {
      s.failsafeAction = "hold";
      Object.assign(at(s, 6), ch(6, "unused"));
    },
  },
  "failsafe-value-missing": { sheet: (s) => (at(s, 8).failsafeUs = null) },
  "failsafe-value-outside": { sheet: (s) => (at(s, 8).failsafeUs = 1000) },
  "engage-range-invalid": { sheet: (s) => Object.assign(at(s, 5), { engageMinUs: 2100, engageMaxUs: 1800 }) },
  "engage-range-missing": { sheet: (s) => Object.assign(at(s, 7), { engageMinUs: null, engageMaxUs: null }) },
  "engage-overlap": { sheet: (s) => (at(s, 7).engageMaxUs = 1850) },
  "switch-never-engages": { sheet: (s) => Object.assign(at(s, 6), { engageMinUs: 1400, engageMaxUs: 1600 }) },
  "switch-position-unassigned": { sheet: (s) => (at(s, 6).positions = 3) },
  "switch-position-edge": { sheet: (s) => (at(s, 5).engageMinUs = 1950) },
  "band-missing": { sheet: (s) => (s.bandMhz = null) },
  "sensitivity-missing": { sheet: (s) => (s.rxSensitivityDbm = null) },
  // RSSI that is really the pitch stick (plus a little noise).
  "logs-rssi-follows-sticks": { evidence: () => evidence({ rows: rows((row) => (row[8] = row[1] + (row[0] % 7))) }) },
  "logs-failsafe-action": { evidence: () => evidence({ action: "hold" }) },
  // The return-to-home switch reads 1000 µs whenever it was flipped: reversed.
  "logs-engage-unreached": { evidence: () => evidence({ rows: rows((row) => (row[7] = 1000)) }) },
};

describe("the reference sheet", () => {
  it("passes every rule, with and without evidence", () => {
    expect(checkSheet(reference()).findings).toEqual([]);
    const res = checkSheet(reference(), evidence());
    expect(res.findings).toEqual([]);
    expect(res.counts).toEqual({ error: 0, warning: 0, info: 0 });
    expect(res.evidence).toEqual({ runs: 1, runsWithRc: 1 });
  });

  it("has a way to break every rule", () => {
    expect(Object.keys(breakers).sort()).toEqual([...RULE_IDS].sort());
  });
});

describe("each rule", () => {
  for (const rule of RULE_IDS) {
    it(`${rule} fires on a sheet that breaks it and stays quiet on the reference`, () => {
      const b = breakers[rule];
      const s = reference();
      b.sheet?.(s);
      const res = checkSheet(s, b.evidence ? b.evidence() : evidence());
      const found = res.findings.filter((f) => f.rule === rule);
      expect(found.length, `${rule} should fire`).toBeGreaterThan(0);
      for (const f of found) {
        expect(f.severity).toBe(SHEET_RULES[rule].severity);
        expect(f.why.length).toBeGreaterThan(40);
        expect(f.fix.length).toBeGreaterThan(20);
        expect(f.detail.length).toBeGreaterThan(10);
      }
      expect(ids(reference())).not.toContain(rule);
    });
  }
});

describe("details that matter", () => {
  it("names the channels of a duplicate and sorts errors before warnings", () => {
    const s = reference();
    breakers["rth-duplicate"].sheet!(s);
    s.bandMhz = null;
    const res = checkSheet(s);
    const f = res.findings.find((x) => x.rule === "rth-duplicate")!;
    expect(f.channels).toEqual([8, 10]);
    expect(f.detail).toContain("channels 8 and 10");
    expect(res.findings.map((x) => x.severity)).toEqual([...res.findings.map((x) => x.severity)].sort((a, b) => ["error", "warning", "info"].indexOf(a) - ["error", "warning", "info"].indexOf(b)));
  });

  it("plans hold and land through the mode channel", () => {
    const s = reference();
    s.failsafeAction = "land";
    // Mode's failsafe value (1000 µs) is outside its range 1800–2100.
    expect(ids(s)).toContain("failsafe-value-outside");
    at(s, 6).failsafeUs = 2000;
    expect(ids(s)).not.toContain("failsafe-value-outside");
  });

  it("says a switch may be reversed when the mirrored range is reached", () => {
    const f = checkSheet(reference(), breakers["logs-engage-unreached"].evidence!()).findings.find((x) => x.rule === "logs-engage-unreached")!;
    expect(f.channels).toEqual([8]);
    expect(f.runIds).toEqual([41]);
    expect(f.detail).toMatch(/reversed/);
  });

  it("ignores logs without RC and failsafes that did nothing", () => {
    const ev: RunEvidence[] = [{ runId: 1, title: "gps only", failsafe: { result: "not-triggered", action: "none", planAction: "return-to-home" }, rc: null }];
    const res = checkSheet(reference(), ev);
    expect(res.findings).toEqual([]);
    expect(res.evidence).toEqual({ runs: 1, runsWithRc: 0 });
  });

  it("spaces switch positions evenly from 1000 to 2000 µs", () => {
    expect(switchPositions(2)).toEqual({ values: [1000, 2000], toleranceUs: 100 });
    expect(switchPositions(3)).toEqual({ values: [1000, 1500, 2000], toleranceUs: 100 });
    expect(switchPositions(6)).toEqual({ values: [1000, 1200, 1400, 1600, 1800, 2000], toleranceUs: 50 });
  });
});

describe("RC facts from logged rows", () => {
  it("counts values and presence per channel", () => {
    const facts = summariseRc([[1000, 0, ...new Array(16).fill(0)], [2000, 1500, ...new Array(16).fill(0)], null]);
    expect(facts.rows).toBe(2);
    expect(facts.channels[0].present).toBe(2);
    expect(facts.channels[1].present).toBe(1);
    expect(countIn(facts.channels[0], 1900, 2100)).toBe(1);
    expect(countIn(facts.channels[0], 900, 2100)).toBe(2);
  });

  it("gives Pearson's r with the sticks: +1, −1, and nothing for a flat channel", () => {
    const data = Array.from({ length: 100 }, (_, i) => {
      const row = new Array(18).fill(0);
      row[0] = 1000 + i * 10;
      row[4] = 1200 + i * 5; // follows channel 1
      row[5] = 2000 - i * 3; // mirrors channel 1
      row[6] = 1500; // flat
      return row;
    });
    const f = summariseRc(data);
    expect(f.channels[4].stickR[0]).toBeCloseTo(1, 12);
    expect(f.channels[5].stickR[0]).toBeCloseTo(-1, 12);
    expect(f.channels[6].stickR[0]).toBeNull();
    // Channel 2 is absent: no pairs, no r.
    expect(f.channels[4].stickR[1]).toBeNull();
  });
});
