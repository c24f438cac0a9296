import { z } from "zod";

/**
 * The column map: how a CSV log's columns map to sample fields and in which unit each is written.
 * Stored with a run (and as a crew's named column map), so the shape is validated with zod.
 */

export const csvFieldNames = [
  "time", "lat", "lon", "alt", "speed", "heading", "sats", "hdop", "fix", "rssi", "lq", "snr",
  "voltage", "current", "usedMah", "mode", "armed", "failsafe",
  "rc1", "rc2", "rc3", "rc4", "rc5", "rc6", "rc7", "rc8", "rc9",
  "rc10", "rc11", "rc12", "rc13", "rc14", "rc15", "rc16", "rc17", "rc18",
  "ignore",
] as const;

export type CsvField = (typeof csvFieldNames)[number];

export interface CsvFieldSpec {
  field: CsvField;
  /** Plain label for the column-map form. */
  label: string;
  /** Units the column may be written in; the first is the default. Empty: the field has no unit. */
  units: readonly string[];
}

const rcSpecs: CsvFieldSpec[] = Array.from({ length: 18 }, (_, i) => ({
  field: `rc${i + 1}` as CsvField,
  label: `RC channel ${i + 1} (µs)`,
  units: ["us"],
}));

/** Every field a column can be mapped to, in form order, with its allowed units. */
export const csvFields: readonly CsvFieldSpec[] = [
  { field: "time", label: "Time", units: ["s", "ms", "iso", "clock"] },
  { field: "lat", label: "Latitude (degrees)", units: ["deg"] },
  { field: "lon", label: "Longitude (degrees)", units: ["deg"] },
  { field: "alt", label: "Altitude", units: ["m", "ft"] },
  { field: "speed", label: "Ground speed", units: ["m/s", "km/h", "kn", "mph"] },
  { field: "heading", label: "Course over ground (degrees)", units: ["deg"] },
  { field: "sats", label: "Satellites in use", units: [] },
  { field: "hdop", label: "HDOP", units: [] },
  { field: "fix", label: "GPS fix type", units: [] },
  { field: "rssi", label: "RSSI", units: ["dBm", "%", "pwm"] },
  { field: "lq", label: "Link quality (LQ %)", units: ["%"] },
  { field: "snr", label: "SNR (dB)", units: ["dB"] },
  { field: "voltage", label: "Battery voltage (V)", units: ["V"] },
  { field: "current", label: "Battery current", units: ["A", "mA"] },
  { field: "usedMah", label: "Capacity used (mAh)", units: ["mAh"] },
  { field: "mode", label: "Flight or drive mode (text)", units: [] },
  { field: "armed", label: "Armed flag", units: [] },
  { field: "failsafe", label: "Failsafe flag", units: [] },
  ...rcSpecs,
  { field: "ignore", label: "Not used", units: [] },
];

/** Words the form shows for each unit value. */
export const unitLabels: Record<string, string> = {
  s: "seconds", ms: "milliseconds", iso: "ISO 8601 date and time", clock: "hh:mm:ss.sss",
  deg: "degrees", m: "metres", ft: "feet", "m/s": "m/s", "km/h": "km/h", kn: "knots", mph: "mph",
  dBm: "dBm", "%": "%", pwm: "PWM channel (1000–2000 µs)", dB: "dB", V: "volts", A: "amperes",
  mA: "milliamperes", mAh: "mAh", us: "µs",
};

const specByField = new Map(csvFields.map((s) => [s.field, s]));

/**
 * The spec of one field.
 * @example csvFieldSpec("lq").label // "Link quality (LQ %)"
 */
export function csvFieldSpec(field: CsvField): CsvFieldSpec {
  return specByField.get(field)!;
}

/**
 * The unit a mapped column is read in: its own unit, else the field's default.
 * @example unitOf({ header: "alt", field: "alt" }) // "m"
 */
export function unitOf(col: { field: CsvField; unit?: string }): string | undefined {
  return col.unit ?? csvFieldSpec(col.field).units[0];
}

/**
 * True for the fields that may be mapped more than once (see columnMapSchema).
 * @example isRepeatableField("alt") // false
 */
export function isRepeatableField(field: CsvField): boolean {
  return field === "ignore" || /^rc\d+$/.test(field);
}

const columnSchema = z.object({
  header: z.string().max(200, "Headers are limited to 200 characters"),
  field: z.enum(csvFieldNames),
  unit: z.string().max(40).optional(),
});

export const columnMapSchema = z
  .object({
    delimiter: z
      .string()
      .length(1, "The delimiter is one character")
      .refine((d) => !/[\r\n"]/.test(d), "A quote or line break cannot be the delimiter")
      .optional(),
    decimal: z.enum([".", ","]).optional(),
    columns: z.array(columnSchema).min(1, "Map at least the time column").max(500),
  })
  .superRefine((map, ctx) => {
    const seenField = new Map<CsvField, number>();
    const seenHeader = new Set<string>();
    map.columns.forEach((c, i) => {
      const spec = csvFieldSpec(c.field);
      if (c.unit !== undefined && !spec.units.includes(c.unit)) {
        const allowed = spec.units.length ? `one of ${spec.units.join(", ")}` : "no unit";
        ctx.addIssue({ code: "custom", path: ["columns", i, "unit"], message: `${spec.label} takes ${allowed}, not "${c.unit}"` });
      }
      if (seenHeader.has(c.header)) {
        ctx.addIssue({ code: "custom", path: ["columns", i, "header"], message: `Column "${c.header}" is listed twice` });
      }
      seenHeader.add(c.header);
      if (!isRepeatableField(c.field) && seenField.has(c.field)) {
        ctx.addIssue({ code: "custom", path: ["columns", i, "field"], message: `${spec.label} is mapped to more than one column` });
      }
      seenField.set(c.field, i);
    });
    if (!seenField.has("time")) {
      ctx.addIssue({ code: "custom", path: ["columns"], message: "Map one column to Time" });
    }
    if (seenField.has("lat") !== seenField.has("lon")) {
      ctx.addIssue({ code: "custom", path: ["columns"], message: "Latitude and longitude are mapped together or not at all" });
    }
  });

export type ColumnMap = z.infer<typeof columnMapSchema>;
export type ColumnMapColumn = ColumnMap["columns"][number];
