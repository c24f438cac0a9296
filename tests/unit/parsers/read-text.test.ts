import { describe, expect, it } from "vitest";
import { lines, readAllText } from "@/lib/parsers/read-text";
import { ParseError } from "@/lib/parsers/types";
import { byteChunks, chunksOf, textChunks } from "@/tests/helpers/byte-source";

async function allLines(source: AsyncIterable<Uint8Array | string>, opts?: { maxLineChars?: number }) {
  const out: { text: string; line: number }[] = [];
  for await (const l of lines(source, opts)) out.push(l);
  return out;
}

// "Grüße, Đuro — 北京 🚁": 1-, 2-, 3- and 4-byte UTF-8 characters, so 7-byte chunks split some.
const MIXED = "Grüße, Đuro — 北京 🚁";

describe("readAllText", () => {
  it("joins 7-byte chunks without breaking multi-byte characters", async () => {
    expect(await readAllText(byteChunks(MIXED, 7), 1024)).toBe(MIXED);
  });

  it("joins 1-byte chunks without breaking multi-byte characters", async () => {
    expect(await readAllText(byteChunks(MIXED, 1), 1024)).toBe(MIXED);
  });

  it("strips a UTF-8 BOM given as bytes", async () => {
    const bytes = new Uint8Array([0xef, 0xbb, 0xbf, ...new TextEncoder().encode("<gpx/>")]);
    expect(await readAllText(byteChunks(bytes, 2), 1024)).toBe("<gpx/>");
  });

  it("strips a BOM at the start of text chunks but keeps U+FEFF later in the text", async () => {
    expect(await readAllText(chunksOf("\uFEFFa", "\uFEFFb"), 1024)).toBe("a\uFEFFb");
  });

  it("accepts input of exactly maxBytes", async () => {
    expect(await readAllText(byteChunks("x".repeat(100)), 100)).toHaveLength(100);
  });

  it("throws a ParseError naming the limit when the input is one byte over it", async () => {
    const err = await readAllText(byteChunks("x".repeat(101)), 100).catch((e) => e);
    expect(err).toBeInstanceOf(ParseError);
    expect(err.message).toMatch(/^GPX files larger than 100 bytes are not supported;/);
  });

  it("counts UTF-8 bytes, not characters, of text chunks against the limit", async () => {
    // "é" is 2 bytes in UTF-8: 60 characters are 120 bytes.
    await expect(readAllText(textChunks("é".repeat(60)), 100)).rejects.toBeInstanceOf(ParseError);
    expect(await readAllText(textChunks("é".repeat(50)), 100)).toBe("é".repeat(50));
  });

  it("states a limit of whole megabytes in MB", async () => {
    const big = await readAllText(chunksOf(new Uint8Array(3 * 1024 * 1024)), 2 * 1024 * 1024).catch((e) => e);
    expect(big.message).toContain("larger than 2 MB");
  });
});

describe("lines", () => {
  it("splits LF, CRLF and lone CR line ends and numbers lines from 1", async () => {
    expect(await allLines(chunksOf("a\nb\r\nc\rd"))).toEqual([
      { text: "a", line: 1 },
      { text: "b", line: 2 },
      { text: "c", line: 3 },
      { text: "d", line: 4 },
    ]);
  });

  it("treats a CRLF split across two chunks as one line end", async () => {
    expect(await allLines(chunksOf("a\r", "\nb"))).toEqual([
      { text: "a", line: 1 },
      { text: "b", line: 2 },
    ]);
  });

  it("treats a CR at the end of one chunk followed by text as a lone CR line end", async () => {
    expect((await allLines(chunksOf("a\r", "b"))).map((l) => l.text)).toEqual(["a", "b"]);
  });

  it("keeps empty lines and does not add one for a final line end", async () => {
    expect((await allLines(chunksOf("a\n\nb\n"))).map((l) => l.text)).toEqual(["a", "", "b"]);
    expect((await allLines(chunksOf("a\r\r"))).map((l) => l.text)).toEqual(["a", ""]);
  });

  it("gives the same lines for every chunk size from 1 to 13 bytes", async () => {
    const text = `\uFEFF${MIXED}\r\nline two\rline three\n\nlast`;
    const expected = [MIXED, "line two", "line three", "", "last"];
    for (let size = 1; size <= 13; size++) {
      expect((await allLines(byteChunks(text, size))).map((l) => l.text)).toEqual(expected);
    }
  });

  it("strips the BOM from line 1 only", async () => {
    expect((await allLines(textChunks("\uFEFFa\n\uFEFFb", 3))).map((l) => l.text)).toEqual(["a", "\uFEFFb"]);
  });

  it("yields nothing for empty input", async () => {
    expect(await allLines(chunksOf())).toEqual([]);
    expect(await allLines(chunksOf(""))).toEqual([]);
  });

  it("yields lines before the whole input has been read", async () => {
    let pulled = 0;
    async function* slow() {
      for (const c of ["one\ntw", "o\nthree\n"]) {
        pulled++;
        yield c;
      }
    }
    const it = lines(slow());
    expect((await it.next()).value).toEqual({ text: "one", line: 1 });
    expect(pulled).toBe(1);
  });

  it("throws a ParseError for a line longer than maxLineChars", async () => {
    const err = await allLines(byteChunks("x".repeat(50), 7), { maxLineChars: 20 }).catch((e) => e);
    expect(err).toBeInstanceOf(ParseError);
    expect(err.line).toBe(1);
  });
});
