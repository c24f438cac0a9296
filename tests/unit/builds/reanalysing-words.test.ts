/** The status line after a save that re-analyses a build's runs (components/builds/api.ts). */
import { describe, expect, it } from "vitest";
import { reanalysingWords } from "@/components/builds/api";

describe("reanalysingWords", () => {
  it("says nothing when no run was queued", () => {
    expect(reanalysingWords(0)).toBe("");
    expect(reanalysingWords(undefined)).toBe("");
  });
  it("counts one run and several runs in words", () => {
    expect(reanalysingWords(1)).toBe(" 1 run of this build is being analysed again.");
    expect(reanalysingWords(3)).toBe(" 3 runs of this build are being analysed again.");
  });
});
