/**
 * Download names (RFC 6266 Content-Disposition with an RFC 5987 `filename*`): no path can survive,
 * an ASCII fallback always exists, and the UTF-8 name is percent-encoded attr-chars only.
 */
import { describe, expect, it } from "vitest";
import { asciiStem, contentDisposition, unicodeStem } from "@/lib/exports/file-name";

describe("export file names", () => {
  it("keeps a plain title", () => {
    expect(contentDisposition("mudlark-flats-loop", ".gpx", "run-1")).toBe(`attachment; filename="mudlark-flats-loop.gpx"; filename*=UTF-8''mudlark-flats-loop.gpx`);
  });

  it("cannot carry a path or escape the quoted string", () => {
    for (const title of ["../../etc/passwd", "..\\..\\windows\\system32", '/abs"; filename="x.exe', "\u0000\r\n..", "...."]) {
      const d = contentDisposition(title, ".csv", "run-7");
      const ascii = /filename="([^"]*)"/.exec(d)![1];
      expect(ascii).not.toMatch(/[/\\"]|\.\./);
      expect(ascii.startsWith(".")).toBe(false);
      const utf8 = decodeURIComponent(/filename\*=UTF-8''(.*)$/.exec(d)![1]);
      expect(utf8).not.toMatch(/[/\\"\u0000-\u001f]/);
      expect(utf8.startsWith(".")).toBe(false);
      expect(d.split("\r").length).toBe(1);
    }
    expect(asciiStem("../../etc/passwd", "run-7")).toBe("etc-passwd");
    expect(asciiStem("....", "run-7")).toBe("run-7");
  });

  it("gives an ASCII fallback for other scripts and keeps them in filename* (RFC 5987)", () => {
    const d = contentDisposition("Überflug Nord – 北の浜 (2)", "-events.csv", "run-3");
    expect(d).toContain(`filename="Uberflug-Nord-2-events.csv"`);
    // attr-char excludes ( ) ' *: they are percent-encoded too.
    expect(d).toContain("filename*=UTF-8''%C3%9Cberflug%20Nord%20%E2%80%93%20%E5%8C%97%E3%81%AE%E6%B5%9C%20%282%29-events.csv");
    expect(asciiStem("北の浜", "run-3")).toBe("run-3");
    expect(unicodeStem("北の浜", "run-3")).toBe("北の浜");
  });

  it("bounds the length", () => {
    expect(asciiStem("a".repeat(500), "x").length).toBeLessThanOrEqual(80);
    expect([...unicodeStem("é".repeat(500), "x")].length).toBeLessThanOrEqual(80);
  });
});
