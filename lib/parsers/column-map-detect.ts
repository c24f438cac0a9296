import { csvFieldSpec, isRepeatableField, type ColumnMap, type ColumnMapColumn, type CsvField } from "./column-map";
import { checkColumn } from "./column-map-checks";
import { matchHeader, unitFromWords } from "./column-map-synonyms";
import { looksClock, looksIso } from "./csv-time";

export interface DetectedColumnMap {
  map: ColumnMap;
  /** Per header, 0–1: how sure the placement is (0 for ignored columns). */
  confidence: Record<string, number>;
  /** Headers that were not placed on any field. */
  unplaced: string[];
  /** Things a person should look at in the form, in plain words. */
  problems: string[];
}

interface Candidate {
  index: number;
  header: string;
  field: CsvField;
  unit?: string;
  confidence: number;
}

// Units that only the values can tell apart get a little less confidence when guessed.
const UNIT_MATTERS = new Set<CsvField>(["time", "rssi"]);

function placeByName(header: string, index: number, values: string[], decimal: "." | ",", problems: string[]): Candidate | null {
  const hit = matchHeader(header);
  if (!hit) return null;
  const spec = csvFieldSpec(hit.field);
  const hint = unitFromWords(hit.field, hit.unitWords);
  if (!values.length) {
    problems.push(`Column "${header}" is empty in the first rows`);
    return { index, header, field: hit.field, unit: hint ?? spec.units[0], confidence: hit.strength * 0.7 };
  }
  const check = checkColumn(hit.field, header, values, decimal, hint);
  if (check.problem) problems.push(check.problem);
  const guessed = check.unitGuessed && UNIT_MATTERS.has(hit.field) ? 0.95 : 1;
  const confidence = hit.strength * (0.3 + 0.7 * check.plausible) * guessed;
  return { index, header, field: hit.field, unit: check.unit ?? spec.units[0], confidence };
}

/** With no header named like a time, a column whose values are clearly times is offered (≤ 0.5). */
function guessTimeByValues(headers: string[], columns: string[][], decimal: "." | ",", taken: Set<number>): Candidate | null {
  for (let i = 0; i < headers.length; i++) {
    const values = columns[i];
    if (taken.has(i) || values.length < 2) continue;
    const iso = values.filter(looksIso).length / values.length;
    const clock = values.filter(looksClock).length / values.length;
    if (iso >= 0.9 || clock >= 0.9) {
      return { index: i, header: headers[i], field: "time", unit: iso >= 0.9 ? "iso" : "clock", confidence: 0.5 * Math.max(iso, clock) };
    }
  }
  return null;
}

/**
 * Proposes a column map from a CSV header row and its first data rows: headers are matched to
 * fields by generic words (case, spacing and unit suffix ignored) and units are taken from the
 * header ("_ms", "(ft)", "km/h") or guessed from the values (ISO or clock times, dBm/%/PWM RSSI).
 * Values that do not fit the field (a "lat" beyond ±90°) lower the confidence and add a problem.
 * @param rows data rows as split by the CSV reader, same order as `headers`
 * @param decimal the decimal mark numbers are written with
 * @example detectColumnMap(["time_s", "lat", "lon"], [["0", "48.1", "11.5"]], ".").map.columns[0]
 *   // { header: "time_s", field: "time", unit: "s" }
 */
export function detectColumnMap(headers: string[], rows: string[][], decimal: "." | ","): DetectedColumnMap {
  const problems: string[] = [];
  const columns = headers.map((_, i) => rows.map((r) => (r[i] ?? "").trim()).filter((v) => v !== ""));
  const firstIndex = new Map<string, number>();
  const candidates: Candidate[] = [];
  headers.forEach((header, i) => {
    if (firstIndex.has(header)) {
      problems.push(`The header "${header}" appears more than once; only the first such column is read`);
      return;
    }
    firstIndex.set(header, i);
    const c = placeByName(header, i, columns[i], decimal, problems);
    if (c) candidates.push(c);
  });

  // One column per field: the most confident wins, the others are left unplaced.
  const chosen = new Map<number, Candidate>();
  const byField = new Map<CsvField, Candidate>();
  for (const c of [...candidates].sort((a, b) => b.confidence - a.confidence || a.index - b.index)) {
    const other = byField.get(c.field);
    if (other && !isRepeatableField(c.field)) {
      problems.push(`Columns "${other.header}" and "${c.header}" both look like ${csvFieldSpec(c.field).label}; using "${other.header}"`);
      continue;
    }
    byField.set(c.field, c);
    chosen.set(c.index, c);
  }
  if (!byField.has("time")) {
    const guess = guessTimeByValues(headers, columns, decimal, new Set([...chosen.keys()]));
    if (guess) {
      problems.push(`No column is named like a time; "${guess.header}" holds time values, so it was taken as the time — check it`);
      byField.set("time", guess);
      chosen.set(guess.index, guess);
    } else {
      problems.push("No time column was found; map one column to Time");
    }
  }
  const lat = byField.get("lat");
  const lon = byField.get("lon");
  if (Boolean(lat) !== Boolean(lon)) {
    const only = (lat ?? lon)!;
    problems.push(`Found ${only.field === "lat" ? "latitude" : "longitude"} ("${only.header}") without its partner; position is not read`);
    chosen.delete(only.index);
  }

  const mapColumns: ColumnMapColumn[] = [];
  const confidence: Record<string, number> = {};
  const unplaced: string[] = [];
  for (const [header, i] of firstIndex) {
    const c = chosen.get(i);
    if (c) {
      mapColumns.push(c.unit !== undefined ? { header, field: c.field, unit: c.unit } : { header, field: c.field });
      confidence[header] = Math.round(c.confidence * 100) / 100;
    } else {
      mapColumns.push({ header, field: "ignore" });
      confidence[header] = 0;
      unplaced.push(header);
    }
  }
  return { map: { decimal, columns: mapColumns }, confidence, unplaced, problems };
}
