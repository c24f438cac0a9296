import { describe, expect, it } from "vitest";
import {
  altitudeToM, currentToA, headingTo360, M_PER_FT, MPS_PER_KN, MPS_PER_MPH, parseFlag, parseNumber, pwmToPct, speedToMps,
} from "@/lib/parsers/csv-values";

describe("parseNumber", () => {
  it("reads dot decimals, signs and exponents", () => {
    expect(parseNumber("12.5", ".")).toBe(12.5);
    expect(parseNumber(" -0.25 ", ".")).toBe(-0.25);
    expect(parseNumber("+3", ".")).toBe(3);
    expect(parseNumber(".5", ".")).toBe(0.5);
    expect(parseNumber("5.", ".")).toBe(5);
    expect(parseNumber("1e3", ".")).toBe(1000);
    expect(parseNumber("-1.5E-2", ".")).toBe(-0.015);
  });

  it("reads comma decimals only when the decimal mark is a comma", () => {
    expect(parseNumber("12,5", ",")).toBe(12.5);
    expect(parseNumber("-0,25", ",")).toBe(-0.25);
    expect(parseNumber("12,5", ".")).toBeNull();
    expect(parseNumber("12.5", ",")).toBeNull();
  });

  it("gives null for text, units, hex, thousands separators and empty text", () => {
    for (const s of ["abc", "12 m", "0x10", "1,234.5", "1.234,5", "", " ", "--1", "1e", "½"]) {
      expect(parseNumber(s, "."), s).toBeNull();
    }
  });

  it("reads nan and infinity words as NaN and ±Infinity", () => {
    expect(parseNumber("NaN", ".")).toBeNaN();
    expect(parseNumber("nan", ",")).toBeNaN();
    expect(parseNumber("inf", ".")).toBe(Infinity);
    expect(parseNumber("-Infinity", ".")).toBe(-Infinity);
  });
});

describe("parseFlag", () => {
  it("reads the usual on and off words in any case", () => {
    for (const s of ["1", "true", "YES", "on", "Armed", " armed "]) expect(parseFlag(s), s).toBe(1);
    for (const s of ["0", "False", "no", "OFF", "disarmed"]) expect(parseFlag(s), s).toBe(0);
  });

  it("gives null for anything else", () => {
    for (const s of ["2", "maybe", "", "-1", "arming"]) expect(parseFlag(s), s).toBeNull();
  });
});

describe("altitudeToM", () => {
  // 1 ft = 0.3048 m exactly: International Yard and Pound Agreement (1959); NIST SP 811 Appendix B.
  it("converts feet with the exact international foot", () => {
    expect(M_PER_FT).toBe(0.3048);
    expect(altitudeToM(1000, "ft")).toBeCloseTo(304.8, 12);
    expect(altitudeToM(10_000 / 3.048, "ft")).toBeCloseTo(1000, 9);
  });

  it("leaves metres as they are", () => {
    expect(altitudeToM(123.4, "m")).toBe(123.4);
    expect(altitudeToM(123.4, undefined)).toBe(123.4);
  });
});

describe("speedToMps", () => {
  it("converts km/h by 1000 m per 3600 s", () => {
    expect(speedToMps(36, "km/h")).toBeCloseTo(10, 12);
    expect(speedToMps(90, "km/h")).toBeCloseTo(25, 12);
  });

  // 1 kn = 1852 m/h: BIPM SI Brochure, 9th ed. (2019), Table 8.
  it("converts knots by 1852 m per hour", () => {
    expect(MPS_PER_KN * 3600).toBeCloseTo(1852, 9);
    expect(speedToMps(3600, "kn")).toBeCloseTo(1852, 9);
    expect(speedToMps(10, "kn")).toBeCloseTo(5.144444444, 8);
  });

  // 1 mph = 0.44704 m/s exactly: 1 mile = 1609.344 m (1959 agreement; NIST SP 811 Appendix B) per 3600 s.
  it("converts miles per hour with the exact international mile", () => {
    expect(MPS_PER_MPH).toBe(0.44704);
    expect(speedToMps(3600, "mph")).toBeCloseTo(1609.344, 9);
  });

  it("leaves m/s as it is", () => {
    expect(speedToMps(7.5, "m/s")).toBe(7.5);
  });
});

describe("pwmToPct", () => {
  it("maps 1000–2000 µs onto 0–100 % and clamps beyond", () => {
    expect(pwmToPct(1000)).toBe(0);
    expect(pwmToPct(1500)).toBe(50);
    expect(pwmToPct(1750)).toBe(75);
    expect(pwmToPct(2000)).toBe(100);
    expect(pwmToPct(988)).toBe(0);
    expect(pwmToPct(2012)).toBe(100);
  });
});

describe("currentToA", () => {
  it("divides milliamperes by 1000", () => {
    expect(currentToA(1500, "mA")).toBe(1.5);
    expect(currentToA(1.5, "A")).toBe(1.5);
  });
});

describe("headingTo360", () => {
  it("folds courses into 0–360", () => {
    expect(headingTo360(-90)).toBe(270);
    expect(headingTo360(370)).toBe(10);
    expect(headingTo360(359.5)).toBe(359.5);
    expect(headingTo360(0)).toBe(0);
  });
});
