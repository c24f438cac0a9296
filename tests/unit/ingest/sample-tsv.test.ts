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
