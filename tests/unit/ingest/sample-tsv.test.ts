import { describe, expect, it } from "vitest";
import { BatchBuilder } from "@/lib/parsers/batch-builder";
import { batchToTsv, decodeRc, TSV_FIELDS } from "@/lib/ingest/sample-tsv";
import { TsvEncoder } from "@/lib/ingest/tsv-worker";

function batch() {
  const b = new BatchBuilder(true, 16);
  b.begin(2, true);
  b.set("tS", 0);
  b.set("lat", 53.4701194);
  b.set("lon", -3.052114);
  b.set("sats", 11.6);
  b.set("armed", 1);
  b.setRc(1, 1500);
  b.setRc(18, 2000);
  b.commit();
  b.begin(3);
  b.set("tS", 0.1);
  b.set("rssiDbm", -87.5);
  b.set("failsafe", 0);
  b.commit();
  return b.take()!;
}

describe("batchToTsv", () => {
  it("writes run id, sequence and one cell per field, with \\N for missing values", () => {
    const lines = batchToTsv(7, 40, batch()).toString("latin1").trimEnd().split("\n");
    expect(lines).toHaveLength(2);
    const first = lines[0].split("\t");
    expect(first).toHaveLength(2 + TSV_FIELDS.length + 1);
    expect(first.slice(0, 5)).toEqual(["7", "40", "0", "53.4701194", "-3.052114"]);
    expect(first[2 + TSV_FIELDS.indexOf("sats")]).toBe("12"); // integers are rounded
    expect(first[2 + TSV_FIELDS.indexOf("armed")]).toBe("1");
    expect(first[2 + TSV_FIELDS.indexOf("hdop")]).toBe("\\N");
    const second = lines[1].split("\t");
    expect(second[1]).toBe("41");
    expect(second[2 + TSV_FIELDS.indexOf("rssiDbm")]).toBe("-87.5");
    expect(second[2 + TSV_FIELDS.indexOf("failsafe")]).toBe("0");
    expect(second.at(-1)).toBe("\\N");
  });

  it("packs RC channels as little-endian uint16 hex that decodeRc reads back", () => {
    const hexCell = batchToTsv(1, 0, batch()).toString("latin1").split("\n")[0].split("\t").at(-1)!;
    expect(hexCell).toHaveLength(72);
    const rc = decodeRc(Buffer.from(hexCell, "hex"))!;
    expect(rc[0]).toBe(1500);
    expect(rc[17]).toBe(2000);
    expect(rc.slice(1, 17).every((v) => v === 0)).toBe(true);
  });
});

describe("TsvEncoder", () => {
  it("produces exactly the same bytes on its worker thread as batchToTsv here, in order", async () => {
    const enc = new TsvEncoder(9);
    try {
      const b = batch();
      expect(enc.onWorker).toBe(true);
      const [a, c] = await Promise.all([enc.encode(0, b), enc.encode(2, b)]);
      expect(enc.onWorker).toBe(true);
      expect(a.equals(batchToTsv(9, 0, b))).toBe(true);
      expect(c.equals(batchToTsv(9, 2, b))).toBe(true);
      // The batch is still usable: the encoder sends copies.
      expect(b.columns.lat[0]).toBe(53.4701194);
    } finally {
      await enc.close();
    }
  });
});

describe("encodeRows number cells", () => {
  // Reference: ECMAScript's Number() string conversion (ECMA-262 §7.1.4.1.1, StringToNumber),
  // which rounds correctly, as MariaDB's strtod does; every cell must read back as the same double.
  function cells(values: number[]): string[] {
    const b = new BatchBuilder(false, values.length);
    for (const v of values) {
      b.begin(1);
      b.set("tS", v);
      b.commit();
    }
    return batchToTsv(1, 0, b.take()!).toString("latin1").trimEnd().split("\n").map((l) => l.split("\t")[2]);
  }

  it("writes short decimals as written and reads every value back exactly", () => {
    const fixed = [0, -0, 1, -1, 0.1, 0.05, 12.5, -87.5, 53.4701194, -3.052114, 1e-7, 123456789.123, 2 ** 53, 1e21, 1 / 3, Math.PI, 5e-324, 1.7976931348623157e308];
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const values = [...fixed];
    for (let i = 0; i < 5000; i++) {
      const r = random();
      // decimals of 0–9 places at several magnitudes, and arbitrary doubles from arithmetic
      values.push(i % 3 === 0 ? Number(((r - 0.5) * 10 ** (i % 9)).toFixed(i % 10)) : (r - 0.5) * 10 ** ((i % 40) - 20));
    }
    const out = cells(values);
    out.forEach((text, i) => expect(Number(text), `${values[i]} written as ${text}`).toBe(values[i] === 0 ? 0 : values[i]));
    expect(cells([0.05, 12.5, -87.5, 53.4701194, 1e-7, 2])).toEqual(["0.05", "12.5", "-87.5", "53.4701194", "0.0000001", "2"]);
  });
});
