import { describe, expect, it } from "vitest";
import { unavailablePage } from "@/lib/api/unavailable-page";

// OWASP ASVS 4.0.3 V7.4.1: a generic message, no internals, when a dependency fails.
describe("unavailablePage", () => {
  const html = unavailablePage();

  it("says what is wrong and that nothing is lost", () => {
    expect(html).toContain("cannot reach its database");
    expect(html).toContain("Nothing is lost");
  });

  it("retries by itself and carries no script (it is served under the same CSP as every page)", () => {
    expect(html).toMatch(/<meta http-equiv="refresh" content="\d+">/);
    expect(html).not.toMatch(/<script/i);
  });

  it("names no host, port or error code", () => {
    expect(html).not.toMatch(/127\.0\.0\.1|localhost|ECONN|:\d{4}\b/);
  });
});
