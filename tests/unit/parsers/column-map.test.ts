import { describe, expect, it } from "vitest";
import { columnMapSchema, csvFieldNames, csvFields, csvFieldSpec, unitOf, type ColumnMap } from "@/lib/parsers/column-map";

const time = { header: "t", field: "time" as const, unit: "s" };
const issuesOf = (map: unknown) => {
  const r = columnMapSchema.safeParse(map);
  expect(r.success).toBe(false);
  return r.error!.issues.map((i) => ({ path: i.path.join("."), message: i.message }));
};

describe("columnMapSchema", () => {
  it("accepts a map with only a time column and no delimiter or decimal mark", () => {
    const map: ColumnMap = { columns: [time] };
    expect(columnMapSchema.parse(map)).toEqual(map);
  });

  it("accepts every field with each of its allowed units", () => {
    for (const spec of csvFields) {
      for (const unit of spec.units) {
        const col = { header: "x", field: spec.field, unit };
        const columns = spec.field === "time" ? [col] : spec.field === "lat" || spec.field === "lon"
          ? [time, { header: "la", field: "lat", unit: "deg" }, { header: "lo", field: "lon", unit: "deg" }] : [time, col];
        expect(columnMapSchema.safeParse({ columns }).success, `${spec.field} ${unit}`).toBe(true);
      }
    }
  });

  it("requires a time column", () => {
    expect(issuesOf({ columns: [{ header: "alt", field: "alt" }] })).toEqual([{ path: "columns", message: "Map one column to Time" }]);
  });

  it("refuses a field mapped to two columns and names the second", () => {
    const issues = issuesOf({ columns: [time, { header: "alt", field: "alt" }, { header: "gps_alt", field: "alt" }] });
    expect(issues).toEqual([{ path: "columns.2.field", message: "Altitude is mapped to more than one column" }]);
  });

  it("lets any number of columns be ignored", () => {
    const columns = [time, { header: "a", field: "ignore" }, { header: "b", field: "ignore" }, { header: "c", field: "ignore" }];
    expect(columnMapSchema.safeParse({ columns }).success).toBe(true);
  });

  it("refuses a unit the field does not take, and any unit on a field without one", () => {
    expect(issuesOf({ columns: [time, { header: "v", field: "speed", unit: "furlong/fortnight" }] })).toEqual([
      { path: "columns.1.unit", message: 'Ground speed takes one of m/s, km/h, kn, mph, not "furlong/fortnight"' },
    ]);
    expect(issuesOf({ columns: [time, { header: "n", field: "sats", unit: "m" }] })[0].path).toBe("columns.1.unit");
    expect(issuesOf({ columns: [{ header: "t", field: "time", unit: "h" }] })[0].path).toBe("columns.0.unit");
  });

  it("wants latitude and longitude together", () => {
    const message = "Latitude and longitude are mapped together or not at all";
    expect(issuesOf({ columns: [time, { header: "lat", field: "lat" }] })).toEqual([{ path: "columns", message }]);
    expect(issuesOf({ columns: [time, { header: "lon", field: "lon" }] })).toEqual([{ path: "columns", message }]);
  });

  it("refuses the same header listed twice", () => {
    expect(issuesOf({ columns: [time, { header: "t", field: "ignore" }] })[0].path).toBe("columns.1.header");
  });

  it("takes a one-character delimiter that is not a quote or line break", () => {
    expect(columnMapSchema.safeParse({ delimiter: ";", columns: [time] }).success).toBe(true);
    expect(columnMapSchema.safeParse({ delimiter: "\t", columns: [time] }).success).toBe(true);
    expect(issuesOf({ delimiter: ";;", columns: [time] })[0].path).toBe("delimiter");
    expect(issuesOf({ delimiter: '"', columns: [time] })[0].path).toBe("delimiter");
    expect(issuesOf({ delimiter: "\n", columns: [time] })[0].path).toBe("delimiter");
  });

  it("takes only a dot or a comma as decimal mark", () => {
    expect(columnMapSchema.safeParse({ decimal: ",", columns: [time] }).success).toBe(true);
    expect(issuesOf({ decimal: "·", columns: [time] })[0].path).toBe("decimal");
  });

  it("refuses an unknown field", () => {
    expect(issuesOf({ columns: [time, { header: "x", field: "throttle" }] })[0].path).toBe("columns.1.field");
  });
});

describe("csvFields", () => {
  it("lists every field once, with a label of its own", () => {
    expect(csvFields.map((s) => s.field)).toEqual([...csvFieldNames]);
    const labels = csvFields.map((s) => s.label);
    expect(new Set(labels).size).toBe(labels.length);
    expect(labels.every((l) => l.trim().length > 0)).toBe(true);
  });

  it("offers the units of the design brief", () => {
    expect(csvFieldSpec("time").units).toEqual(["s", "ms", "iso", "clock"]);
    expect(csvFieldSpec("alt").units).toEqual(["m", "ft"]);
    expect(csvFieldSpec("speed").units).toEqual(["m/s", "km/h", "kn", "mph"]);
    expect(csvFieldSpec("rssi").units).toEqual(["dBm", "%", "pwm"]);
    expect(csvFieldSpec("current").units).toEqual(["A", "mA"]);
    expect(csvFieldSpec("rc18").units).toEqual(["us"]);
    expect(csvFieldSpec("mode").units).toEqual([]);
  });

  it("labels link quality and ground speed in plain words", () => {
    expect(csvFieldSpec("lq").label).toBe("Link quality (LQ %)");
    expect(csvFieldSpec("speed").label).toBe("Ground speed");
    expect(csvFieldSpec("rssi").label).toBe("RSSI");
  });
});

describe("unitOf", () => {
  it("uses the column's unit, else the field's first unit, else none", () => {
    expect(unitOf({ field: "alt", unit: "ft" })).toBe("ft");
    expect(unitOf({ field: "alt" })).toBe("m");
    expect(unitOf({ field: "time" })).toBe("s");
    expect(unitOf({ field: "mode" })).toBeUndefined();
  });
});
