import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { columnMapSchema } from "@/lib/parsers/column-map";
import { detectColumnMap } from "@/lib/parsers/column-map-detect";
import { matchHeader } from "@/lib/parsers/column-map-synonyms";

const FIXTURES = path.resolve(process.cwd(), "tests/fixtures/csv");
const table = (file: string) => {
  const [header, ...rows] = fs.readFileSync(path.join(FIXTURES, file), "utf8").trim().split("\n").map((l) => l.split(","));
  return { header, rows };
};
/** One column with the given values, as detectColumnMap sees it. */
const single = (header: string, values: string[], decimal: "." | "," = ".") =>
  detectColumnMap([header], values.map((v) => [v]), decimal);
const colOf = (d: ReturnType<typeof detectColumnMap>, header: string) => d.map.columns.find((c) => c.header === header)!;

describe("detectColumnMap", () => {
  it("places every column of the log simulator's header set with confidence of at least 0.8", () => {
    const { header, rows } = table("simulator.csv");
    const d = detectColumnMap(header, rows, ".");
    expect(d.unplaced).toEqual([]);
    expect(d.problems).toEqual([]);
    for (const h of header) expect(d.confidence[h], h).toBeGreaterThanOrEqual(0.8);
    expect(d.map.columns).toEqual([
      { header: "time_s", field: "time", unit: "s" },
      { header: "latitude", field: "lat", unit: "deg" },
      { header: "longitude", field: "lon", unit: "deg" },
      { header: "altitude_m", field: "alt", unit: "m" },
      { header: "ground_speed_ms", field: "speed", unit: "m/s" },
      { header: "heading_deg", field: "heading", unit: "deg" },
      { header: "gps_sats", field: "sats" },
      { header: "hdop", field: "hdop" },
      { header: "fix", field: "fix" },
      { header: "rssi_dbm", field: "rssi", unit: "dBm" },
      { header: "link_quality", field: "lq", unit: "%" },
      { header: "snr_db", field: "snr", unit: "dB" },
      { header: "battery_v", field: "voltage", unit: "V" },
      { header: "current_a", field: "current", unit: "A" },
      { header: "used_mah", field: "usedMah", unit: "mAh" },
      { header: "mode", field: "mode" },
      { header: "armed", field: "armed" },
      { header: "failsafe", field: "failsafe" },
      ...[1, 2, 3, 4, 5, 6, 7, 8].map((n) => ({ header: `ch${n}`, field: `rc${n}`, unit: "us" })),
    ]);
    expect(columnMapSchema.safeParse(d.map).success).toBe(true);
  });

  it("matches headers whatever their case, spacing, underscores, camel case or unit suffix", () => {
    const cases: [string, string, string?][] = [
      ["Time (ms)", "time", "ms"], ["TIMESTAMP", "time"], ["t", "time"], ["DateTime", "time"],
      ["GPS_Lat", "lat"], ["Latitude [deg]", "lat"], ["lng", "lon"], ["Long", "lon"],
      ["Alt(ft)", "alt", "ft"], ["ele", "alt"], ["Elevation m", "alt", "m"], ["height_ft", "alt", "ft"],
      ["Ground Speed (km/h)", "speed", "km/h"], ["gspd_kph", "speed", "km/h"], ["groundSpeed", "speed"], ["vel kn", "speed", "kn"],
      ["speed_kt", "speed", "kn"], ["Speed (knots)", "speed", "kn"], ["speed mph", "speed", "mph"], ["speed m/s", "speed", "m/s"],
      ["Course °", "heading"], ["HDG", "heading"], ["cog", "heading"],
      ["Satellites", "sats"], ["numSat", "sats"], ["num_sats", "sats"], ["GPS Fix", "fix"], ["fix_type", "fix"],
      ["RSSI%", "rssi", "%"], ["rx_rssi", "rssi"], ["rssi_pct", "rssi", "%"],
      ["LQ", "lq"], ["LinkQ", "lq"], ["rx_quality", "lq"], ["rx_snr", "snr"],
      ["VBat", "voltage"], ["bat_v", "voltage"], ["pack_v", "voltage"], ["Volt", "voltage"],
      ["curr", "current"], ["Amps", "current"], ["battery_a", "current"], ["current (mA)", "current", "mA"],
      ["mAh", "usedMah"], ["consumed", "usedMah"], ["Flight Mode", "mode"], ["drive_mode", "mode"], ["flightmode", "mode"],
      ["arm", "armed"], ["fs", "failsafe"], ["rx_failsafe", "failsafe"],
      ["CH1", "rc1"], ["rc_12", "rc12"], ["Channel 18", "rc18"], ["ch3 (us)", "rc3"],
    ];
    for (const [header, field] of cases) expect(matchHeader(header)?.field, header).toBe(field);
    const units = cases.filter((c) => c[2]);
    for (const [header, field, unit] of units) {
      const values = field === "time" ? ["0", "100", "200"] : field === "rssi" ? ["50", "60"] : ["10", "12"];
      const d = single(header, values);
      expect(colOf(d, header).unit, header).toBe(unit);
    }
  });

  it("reads the time unit from the values when the header has none", () => {
    expect(colOf(single("time", ["0", "0.1", "0.2", "0.3"]), "time").unit).toBe("s");
    expect(colOf(single("time", ["0", "1", "2", "3"]), "time").unit).toBe("s");
    expect(colOf(single("time", ["0", "100", "200", "300"]), "time").unit).toBe("ms");
    expect(colOf(single("time", ["1714557600000", "1714557600100"]), "time").unit).toBe("ms");
    expect(colOf(single("time", ["1714557600", "1714557601"]), "time").unit).toBe("s");
    expect(colOf(single("time", ["2024-05-01T12:00:00+02:00", "2024-05-01T12:00:01+02:00"]), "time").unit).toBe("iso");
    expect(colOf(single("time", ["12:34:56.789", "12:34:57.789"]), "time").unit).toBe("clock");
    expect(colOf(single("time", ["0,0", "0,1", "0,2"], ","), "time").unit).toBe("s");
  });

  it("lets ISO or clock values overrule a seconds suffix", () => {
    expect(colOf(single("time_s", ["2024-05-01T12:00:00Z", "2024-05-01T12:00:01Z"]), "time_s").unit).toBe("iso");
  });

  it("reads the RSSI unit from the values: negative is dBm, 0–100 is %, 1000–2000 is PWM", () => {
    expect(colOf(single("rssi", ["-60", "-72", "-101"]), "rssi").unit).toBe("dBm");
    expect(colOf(single("rssi", ["100", "87", "0"]), "rssi").unit).toBe("%");
    expect(colOf(single("rssi", ["1000", "1500", "2000"]), "rssi").unit).toBe("pwm");
    expect(single("rssi", ["-60", "-72"]).confidence.rssi).toBeGreaterThanOrEqual(0.8);
  });

  it("flags an RSSI suffix that its values contradict", () => {
    const d = single("rssi_dbm", ["1500", "1600", "1700"]);
    expect(colOf(d, "rssi_dbm").unit).toBe("pwm");
    expect(d.problems).toContain('Column "rssi_dbm": the name says dBm but the values look like pwm');
  });

  it("takes altitude in feet only when the header says so", () => {
    expect(colOf(single("alt", ["1000", "3000"]), "alt").unit).toBe("m");
    expect(colOf(single("alt (ft)", ["1000", "3000"]), "alt (ft)").unit).toBe("ft");
  });

  it("takes speed as m/s when the header names no unit", () => {
    expect(colOf(single("speed", ["1", "2"]), "speed").unit).toBe("m/s");
  });

  it("gives a column named lat low confidence and a problem when its values are beyond ±90°", () => {
    const d = detectColumnMap(["time", "lat", "lon"], [["0", "4812.5", "11.5"], ["1", "4812.6", "11.5"]], ".");
    expect(d.confidence.lat).toBeLessThan(0.5);
    expect(d.confidence.lon).toBeGreaterThanOrEqual(0.9);
    expect(d.problems).toEqual(['Column "lat": 2 of 2 values in the first rows are not latitudes between -90° and 90°']);
  });

  it("lowers confidence in part when only some values fit", () => {
    const d = single("hdop", ["0.9", "1.1", "abc", "0.8"]);
    expect(d.confidence.hdop).toBeGreaterThan(0.5);
    expect(d.confidence.hdop).toBeLessThan(0.9);
  });

  it("leaves unknown headers unplaced with confidence 0", () => {
    const d = detectColumnMap(["time", "throttle_out", "baro_temp"], [["0", "0.4", "21"]], ".");
    expect(d.unplaced).toEqual(["throttle_out", "baro_temp"]);
    expect(d.confidence).toEqual({ time: 0.9, throttle_out: 0, baro_temp: 0 });
    expect(colOf(d, "throttle_out").field).toBe("ignore");
  });

  it("keeps the more confident of two columns that look like the same field", () => {
    const d = detectColumnMap(["time", "yaw", "heading"], [["0", "10", "20"], ["1", "11", "21"]], ".");
    expect(colOf(d, "heading").field).toBe("heading");
    expect(colOf(d, "yaw").field).toBe("ignore");
    expect(d.unplaced).toEqual(["yaw"]);
    expect(d.problems).toEqual(['Columns "heading" and "yaw" both look like Course over ground (degrees); using "heading"']);
  });

  it("places neither latitude nor longitude when only one of them is found", () => {
    const d = detectColumnMap(["time", "lat", "alt"], [["0", "48.1", "500"]], ".");
    expect(colOf(d, "lat").field).toBe("ignore");
    expect(d.unplaced).toEqual(["lat"]);
    expect(columnMapSchema.safeParse(d.map).success).toBe(true);
  });

  it("guesses the time from ISO values under an unknown header, with confidence of at most 0.5", () => {
    const d = detectColumnMap(["stamp", "volt"], [["2024-05-01T12:00:00Z", "12.1"], ["2024-05-01T12:00:01Z", "12.0"]], ".");
    expect(colOf(d, "stamp")).toEqual({ header: "stamp", field: "time", unit: "iso" });
    expect(d.confidence.stamp).toBeLessThanOrEqual(0.5);
    expect(d.confidence.stamp).toBeGreaterThan(0);
    expect(d.unplaced).toEqual([]);
  });

  it("says so when no column can be the time", () => {
    const d = detectColumnMap(["a", "b"], [["1", "2"]], ".");
    expect(d.problems).toEqual(["No time column was found; map one column to Time"]);
    expect(d.map.columns.every((c) => c.field === "ignore")).toBe(true);
  });

  it("reads only the first of two columns with the same header", () => {
    const d = detectColumnMap(["time", "alt", "alt"], [["0", "1", "2"]], ".");
    expect(d.map.columns.map((c) => c.header)).toEqual(["time", "alt"]);
    expect(d.problems[0]).toMatch(/"alt" appears more than once/);
  });

  it("reports a placed column that is empty in every sample row", () => {
    const d = detectColumnMap(["time", "hdop"], [["0", ""], ["1", " "]], ".");
    expect(colOf(d, "hdop").field).toBe("hdop");
    expect(d.confidence.hdop).toBeLessThan(0.8);
    expect(d.problems).toEqual(['Column "hdop" is empty in the first rows']);
  });

  it("reads comma decimals when told the decimal mark is a comma", () => {
    const d = detectColumnMap(["time", "lat", "lon"], [["0,5", "48,1", "11,5"]], ",");
    expect(d.map.decimal).toBe(",");
    expect(d.confidence.lat).toBeGreaterThanOrEqual(0.9);
  });

  it("does not change the rows it is given", () => {
    const rows = Object.freeze([Object.freeze(["0", "48.1", "11.5"])]) as unknown as string[][];
    expect(() => detectColumnMap(["time", "lat", "lon"], rows, ".")).not.toThrow();
  });
});
