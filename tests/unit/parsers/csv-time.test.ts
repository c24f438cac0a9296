import { describe, expect, it } from "vitest";
import { parseClockTime, parseIsoTime, TimeReader } from "@/lib/parsers/csv-time";

const readAll = (unit: string, values: string[], decimal: "." | "," = ".") => {
  const r = new TimeReader(unit, decimal);
  return { t: values.map((v) => r.read(v)), reader: r };
};

describe("parseIsoTime", () => {
  // ISO 8601-1:2019 §4.3.8 / RFC 3339 §5.6: local time = UTC + offset, so UTC = local − offset.
  it("subtracts the UTC offset", () => {
    const utc = Date.UTC(2024, 4, 1, 10, 0, 0) / 1000;
    expect(parseIsoTime("2024-05-01T12:00:00+02:00")).toEqual({ whole: utc, frac: 0, hasOffset: true });
    expect(parseIsoTime("2024-05-01T05:30:00-04:30")!.whole).toBe(utc);
    expect(parseIsoTime("2024-05-01T10:00:00Z")!.whole).toBe(utc);
    expect(parseIsoTime("2024-05-01t10:00:00z")!.whole).toBe(utc);
    expect(parseIsoTime("2024-05-01T12:00:00+0200")!.whole).toBe(utc);
    expect(parseIsoTime("2024-05-01T12:00:00+02")!.whole).toBe(utc);
  });

  it("keeps fractional seconds written with a dot or a comma", () => {
    expect(parseIsoTime("2024-05-01T12:00:00.250+02:00")!.frac).toBe(0.25);
    expect(parseIsoTime("2024-05-01T12:00:00,5Z")!.frac).toBe(0.5);
    expect(parseIsoTime("2024-05-01 12:00:00.123456Z")!.frac).toBe(0.123456);
  });

  it("reads a time without offset as UTC and says so", () => {
    expect(parseIsoTime("2024-05-01T10:00:00")).toEqual({ whole: Date.UTC(2024, 4, 1, 10) / 1000, frac: 0, hasOffset: false });
  });

  it("crosses a date when the offset says so", () => {
    expect(parseIsoTime("2024-01-01T00:30:00+01:00")!.whole).toBe(Date.UTC(2023, 11, 31, 23, 30) / 1000);
  });

  it("refuses dates and times that do not exist", () => {
    for (const s of ["2024-13-01T00:00:00Z", "2023-02-29T00:00:00Z", "2024-05-01T25:00:00Z", "2024-05-01T12:60:00Z", "2024-05-01T12:00:00+24:00", "2024-05-01", "12:00:00", "abc"]) {
      expect(parseIsoTime(s), s).toBeNull();
    }
    expect(parseIsoTime("2024-02-29T00:00:00Z")).not.toBeNull();
  });
});

describe("parseClockTime", () => {
  it("reads hh:mm:ss with an optional fraction into seconds of the day", () => {
    expect(parseClockTime("12:34:56.789")).toEqual({ whole: 45296, frac: 0.789 });
    expect(parseClockTime("7:05:00")).toEqual({ whole: 25500, frac: 0 });
    expect(parseClockTime("23:59:59,5")).toEqual({ whole: 86399, frac: 0.5 });
  });

  it("refuses out-of-range parts and other text", () => {
    for (const s of ["24:00:00", "12:60:00", "12:00", "1234", ""]) expect(parseClockTime(s), s).toBeNull();
  });
});

describe("TimeReader", () => {
  it("counts seconds from the first row", () => {
    expect(readAll("s", ["10", "10.5", "12"]).t).toEqual([0, 0.5, 2]);
    expect(readAll("s", ["0,0", "0,1"], ",").t).toEqual([0, 0.1]);
  });

  it("divides milliseconds by 1000 without losing digits of epoch times", () => {
    expect(readAll("ms", ["0", "100", "250"]).t).toEqual([0, 0.1, 0.25]);
    expect(readAll("ms", ["1714557600000", "1714557600123"]).t).toEqual([0, 0.123]);
  });

  it("rolls clock times over at midnight", () => {
    expect(readAll("clock", ["23:59:58.500", "23:59:59.500", "00:00:00.500", "00:00:01.250"]).t).toEqual([0, 1, 2, 2.75]);
  });

  it("treats a clock step back of less than 12 hours as going backwards, not as a new day", () => {
    expect(readAll("clock", ["12:00:00", "11:59:00"]).t).toEqual([0, -60]);
  });

  it("gives ISO times with different offsets on one time line", () => {
    const { t, reader } = readAll("iso", ["2024-05-01T12:00:00.000+02:00", "2024-05-01T10:00:00.250Z", "2024-05-01T05:30:01.1-04:30"]);
    expect(t[0]).toBe(0);
    expect(t[1]).toBeCloseTo(0.25, 12);
    expect(t[2]).toBeCloseTo(1.1, 12);
    expect(reader.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
    expect(reader.allOffsets).toBe(true);
  });

  it("gives NaN for a value it cannot read and keeps the first row as origin", () => {
    const { t } = readAll("s", ["5", "x", "6"]);
    expect(t[0]).toBe(0);
    expect(t[1]).toBeNaN();
    expect(t[2]).toBe(1);
  });

  it("knows the start date only from ISO or epoch times", () => {
    expect(readAll("s", ["0", "1"]).reader.startedAt).toBeNull();
    expect(readAll("clock", ["12:00:00"]).reader.startedAt).toBeNull();
    expect(readAll("ms", ["1714557600000"]).reader.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
    expect(readAll("s", ["1714557600"]).reader.startedAt?.toISOString()).toBe("2024-05-01T10:00:00.000Z");
  });
});
