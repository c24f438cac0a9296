import { describe, expect, it } from "vitest";
import { extraLines, MAX_LINE_CHARS, RecordSplitter } from "@/lib/parsers/csv-records";
import { ParseError } from "@/lib/parsers/types";

/** Pushes text in pieces of `size` characters and returns every block plus the rest. */
function split(text: string, size: number, delimiter = ",", newline: "\n" | "\r\n" | "\r" = "\n") {
  const s = new RecordSplitter(delimiter, newline);
  const blocks: string[] = [];
  for (let i = 0; i < text.length; i += size) blocks.push(...s.push(text.slice(i, i + size)));
  return { blocks, rest: s.end() };
}

describe("RecordSplitter", () => {
  it("ends every block just after a record, whatever the piece size", () => {
    const text = 'a,b\n1,"x\ny"\n2,"say ""hi"""\n3,z';
    for (const size of [1, 2, 3, 5, 7, 100]) {
      const { blocks, rest } = split(text, size);
      expect(blocks.join("") + rest, `size ${size}`).toBe(text);
      for (const b of blocks) expect(b.endsWith("\n"), `size ${size}: ${JSON.stringify(b)}`).toBe(true);
      expect(rest).toBe("3,z");
    }
  });

  it("does not end a record at a line break inside quotes", () => {
    const { blocks } = split('t,m\n0,"A\nB"\n', 1);
    expect(blocks).toEqual(["t,m\n", '0,"A\nB"\n']);
  });

  it("waits for the LF of a CRLF split across pieces", () => {
    const { blocks, rest } = split("a\r\nb\r\n", 2, ",", "\r\n");
    expect(blocks).toEqual(["a\r\n", "b\r\n"]);
    expect(rest).toBe("");
  });

  it("reads a quote inside an unquoted field as data", () => {
    const { blocks } = split('t,m\n0,5"\n1,x\n', 1);
    expect(blocks).toEqual(["t,m\n", '0,5"\n', "1,x\n"]);
  });

  it("refuses a line longer than 1 MB and names it", () => {
    const s = new RecordSplitter(",", "\n");
    s.push("a,b\n1,2\n");
    let e: unknown;
    try {
      for (let i = 0; i < 3; i++) s.push("x".repeat(MAX_LINE_CHARS / 2));
    } catch (err) {
      e = err;
    }
    expect(e).toBeInstanceOf(ParseError);
    expect((e as ParseError).line).toBe(3);
    expect((e as ParseError).describe()).toBe("line 3: This line is longer than 1 MB; this is not a CSV telemetry log");
  });

  it("refuses a quoted field left open for more than 1 MB", () => {
    const s = new RecordSplitter(",", "\n");
    expect(() => {
      for (let i = 0; i < 30; i++) s.push(i === 0 ? 'a,b\n1,"open\n' : "line\n".repeat(10_000));
    }).toThrow(/A quoted field is not closed within 1 MB/);
  });
});

describe("extraLines", () => {
  it("counts line breaks inside the fields of a record", () => {
    expect(extraLines(["a", "b"])).toBe(0);
    expect(extraLines(["a", "x\ny"])).toBe(1);
    expect(extraLines(["x\r\ny", "p\rq\nr"])).toBe(3);
  });
});
