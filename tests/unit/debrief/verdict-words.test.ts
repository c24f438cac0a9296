/**
 * The verdict in words (components/debrief/verdict-words.ts, lib/analysis/evidence.ts): reasons,
 * what held, what was not assessed, and older stored summaries that carry neither list.
 * Expected sentences are DESIGN.md §10 "Evidence, not absence" worded with evidence.ts.
 */
import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { VerdictStrip } from "@/components/debrief/verdict-strip";
import { verdictLines, type StoredVerdict } from "@/components/debrief/verdict-words";
import { CLEAR_FOR_ASSESSED_WORDS, heldWords, LEGACY_CLEAR_WORDS, notAssessedWords } from "@/lib/analysis/evidence";

const OLD_BLANKET = "No rule fired: the link held";

describe("heldWords", () => {
  it("joins the parts that held into one sentence", () => {
    expect(heldWords(["link", "failsafe", "gps"])).toBe("The link held, the failsafe acted as planned and the GPS fix held.");
    expect(heldWords(["battery"])).toBe("The battery stayed above its low-voltage limit.");
  });

  it("says nothing when nothing was assessed", () => {
    expect(heldWords([])).toBeNull();
  });
});

describe("notAssessedWords", () => {
  it("names the part and why", () => {
    expect(notAssessedWords({ what: "gps", why: "the log has no usable GPS fix" })).toBe("Not assessed: GPS — the log has no usable GPS fix");
  });
});

describe("verdictLines", () => {
  it("keeps the reasons that fired, then what held and what was not assessed", () => {
    const v: StoredVerdict = {
      level: "act",
      reasons: ["Link lost once"],
      held: ["failsafe", "battery"],
      notAssessed: [{ what: "route", why: "no route plan is attached to the run" }],
    };
    const w = verdictLines(v);
    expect(w.title).toBe("Act before the next run");
    expect(w.reasons).toEqual(["Link lost once"]);
    expect(w.held).toBe("The failsafe acted as planned and the battery stayed above its low-voltage limit.");
    expect(w.notAssessed).toEqual(["Not assessed: route — no route plan is attached to the run"]);
    expect(w.legacy).toBeNull();
  });

  it("is clear only for what was assessed when parts were not", () => {
    const w = verdictLines({ level: "clear", reasons: [], held: ["gps"], notAssessed: [{ what: "link", why: "the log has no link metric" }] });
    expect(w.title).toBe(CLEAR_FOR_ASSESSED_WORDS);
    expect(w.held).toBe("The GPS fix held.");
    expect(w.notAssessed).toEqual(["Not assessed: link — the log has no link metric"]);
  });

  it("is plainly clear when every part was assessed and held", () => {
    const w = verdictLines({ level: "clear", reasons: [], held: ["link", "failsafe", "route", "battery", "gps"], notAssessed: [] });
    expect(w.title).toBe("Clear");
    expect(w.notAssessed).toEqual([]);
  });

  it("never claims anything held for an older summary with nothing fired", () => {
    const w = verdictLines({ level: "clear", reasons: [] });
    expect(w.title).toBe("Clear");
    expect(w.held).toBeNull();
    expect(w.notAssessed).toEqual([]);
    expect(w.legacy).toBe(LEGACY_CLEAR_WORDS);
    expect(w.legacy).not.toContain(OLD_BLANKET);
  });

  it("shows an older summary's reasons as they are", () => {
    const w = verdictLines({ level: "watch", reasons: ["Link faded twice"] });
    expect(w.reasons).toEqual(["Link faded twice"]);
    expect(w.legacy).toBeNull();
  });
});

describe("VerdictStrip", () => {
  const html = (verdict: StoredVerdict) => renderToStaticMarkup(createElement(VerdictStrip, { verdict, signOff: null }));

  it("renders the reasons, what held and each part not assessed, never the old blanket sentence", () => {
    const out = html({ level: "act", reasons: ["Link lost once"], held: ["failsafe"], notAssessed: [{ what: "gps", why: "the log has no usable GPS fix (a bench test, or indoors)" }] });
    expect(out).toContain("Link lost once");
    expect(out).toContain("The failsafe acted as planned.");
    expect(out).toContain("Not assessed: GPS — the log has no usable GPS fix (a bench test, or indoors)");
    expect(out).not.toContain(OLD_BLANKET);
  });

  it("renders an older summary without held or not-assessed lists", () => {
    const out = html({ level: "clear", reasons: [] });
    expect(out).toContain("Clear");
    expect(out).toContain("re-parse the log");
    expect(out).not.toContain(OLD_BLANKET);
  });

  it("escapes waypoint names inside reasons", () => {
    expect(html({ level: "act", reasons: ["1 waypoint missed: <b>Dune</b>"], held: [], notAssessed: [] })).toContain("&lt;b&gt;Dune&lt;/b&gt;");
  });
});
