/** The "act" alert mail (lib/mail/run-alert-mail.ts): what it says, and that user text is escaped in HTML. */
import { describe, expect, it } from "vitest";
import { runAlertMail, type RunAlertArgs } from "@/lib/mail/run-alert-mail";

const base: RunAlertArgs = {
  to: "lead@crew.example",
  name: "Maren",
  units: "metric",
  crewName: "Tidewater Robotics",
  run: {
    id: 7,
    title: "Mudlark flats loop",
    startedAt: new Date("2026-11-14T10:00:00Z"),
    summary: {
      durationS: 235.6,
      distanceM: 659.5,
      maxDistanceFromHomeM: 198,
      link: { metric: "lq", unit: "%", min: 0, median: 99, timeBelowFadeS: 14, fadeThreshold: 70 },
      power: { cells: 4, cellsFrom: "build", minCellV: 3.35, sagV: 1.66, capacityUsedMah: 762 },
    },
  },
  reasons: ["Link lost twice", "Low voltage once"],
  buildName: "Mudlark",
  pilotName: "Jonah Reyes",
  url: "http://localhost:3000/runs/7",
  settingsUrl: "http://localhost:3000/settings",
};

describe("runAlertMail", () => {
  it("names the run and the verdict, gives the reasons, key figures, the link and how to turn it off", () => {
    const m = runAlertMail(base);
    expect(m.to).toBe("lead@crew.example");
    expect(m.subject).toBe("Act before the next run: Mudlark flats loop");
    for (const part of [m.text, m.html]) {
      expect(part).toContain("Link lost twice");
      expect(part).toContain("Low voltage once");
      expect(part).toContain("3 min 56 s");
      expect(part).toContain("660 m");
      expect(part).toContain("3.35 V");
      expect(part).toContain("http://localhost:3000/runs/7");
      expect(part).toContain("Turn these off in Settings");
    }
    expect(m.text).toContain("http://localhost:3000/settings");
  });

  it("lists what the log could not show, and the failsafe's commanded and flown halves", () => {
    const m = runAlertMail({
      ...base,
      run: {
        ...base.run,
        summary: {
          ...base.run.summary,
          failsafe: {
            result: "late",
            why: null,
            plan: { action: "return-to-home", expectedWithinS: 1 },
            commanded: { by: "rc-channel", channel: 8, atS: 20.4, latencyS: 0.4 },
            flown: { state: "seen", by: "mode", action: "return-to-home", atS: 21.8, latencyS: 1.8, mode: "RTH", evidence: null },
            latencyS: 0.4,
            actionLatencyS: 1.8,
            action: "return-to-home",
          },
          verdict: { level: "act", reasons: ["Link lost once", "Failsafe acted later than planned"], held: [], notAssessed: [{ what: "route", why: "no route plan is attached to the run" }] },
        },
      },
    });
    for (const part of [m.text, m.html]) {
      expect(part).toContain("Not assessed: route — no route plan is attached to the run");
      expect(part).toContain("Acted late");
      expect(part).toContain("commanded: 0.4 s after the loss (channel 8 at its failsafe value)");
      expect(part).toContain("flown: return to home 1.8 s after the loss (mode RTH)");
    }
  });

  it("uses the lead's units", () => {
    const m = runAlertMail({ ...base, units: "imperial" });
    // 659.5 m / 1609.344 m per mi = 0.41 mi (NIST SP 811, Appendix B).
    expect(m.text).toContain("0.41 mi");
  });

  it("escapes every user text in the HTML part and keeps headers on one line", () => {
    const m = runAlertMail({
      ...base,
      name: "<b>Eve</b>",
      crewName: 'Crew "<img src=x onerror=alert(1)>"',
      run: { ...base.run, title: "<script>alert(1)</script>\r\nBcc: x@evil.example" },
      reasons: ["1 waypoint missed: <i>Dune</i> & post"],
      buildName: "<u>Mud</u>",
      pilotName: "O'Neil",
    });
    expect(m.html).not.toMatch(/<script|<img|<i>|<u>|<b>Eve/);
    expect(m.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(m.html).toContain("&lt;i&gt;Dune&lt;/i&gt; &amp; post");
    expect(m.html).toContain("O&#39;Neil");
    expect(m.subject).not.toMatch(/[\r\n]/);
    expect(m.subject).toContain("<script>alert(1)</script> Bcc: x@evil.example");
    // The plain-text part is plain text: the title as written.
    expect(m.text).toContain("<script>alert(1)</script>");
  });
});
