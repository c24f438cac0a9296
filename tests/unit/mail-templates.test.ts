import { describe, expect, it } from "vitest";
import { escapeHtml, invitationMail } from "@/lib/mail/templates";

describe("invitationMail", () => {
  it("escapes crew and person names in the HTML part", () => {
    const m = invitationMail({
      to: "x@crew.example",
      crewName: "<script>alert(1)</script>",
      role: "pilot",
      invitedByName: 'Eve "the lead"',
      url: "http://localhost:3000/invite/abc",
      expiresAt: new Date("2026-12-08T00:00:00Z"),
    });
    expect(m.html).not.toContain("<script>");
    expect(m.html).toContain("&lt;script&gt;");
    expect(m.html).toContain("Eve &quot;the lead&quot;");
    expect(m.text).toContain("http://localhost:3000/invite/abc");
  });
});

describe("escapeHtml", () => {
  it("escapes the five HTML-special characters", () => {
    expect(escapeHtml(`&<>"'`)).toBe("&amp;&lt;&gt;&quot;&#39;");
  });
});
