/**
 * What changed in a build record, as the `changes` JSON of a build_changes row: one entry per
 * field, `{ from, to }`. Link-sheet fields are keyed `ch<N>.<field>`. Pure.
 */
import type { ChannelFunction } from "@/db/schema/builds";

export type Changes = Record<string, { from: unknown; to: unknown }>;

/** FLOAT columns hold about 7 significant digits: 2.4 reads back as 2.4000000953… */
const FLOAT_DIGITS = 7;

export function normaliseValue(v: unknown): unknown {
  if (v === undefined || v === "") return null;
  if (typeof v === "number") return Number(v.toPrecision(FLOAT_DIGITS));
  if (v instanceof Date) return v.toISOString();
  return v;
}

const same = (a: unknown, b: unknown) => normaliseValue(a) === normaliseValue(b);

/** Entries for the keys of `next` whose value differs from `prev` (undefined in `next` = not sent). */
export function diffFields<T extends Record<string, unknown>>(prev: T, next: Partial<T>): Changes {
  const out: Changes = {};
  for (const key of Object.keys(next)) {
    const to = next[key as keyof T];
    if (to === undefined) continue;
    const from = prev[key as keyof T];
    if (!same(from, to)) out[key] = { from: normaliseValue(from), to: normaliseValue(to) };
  }
  return out;
}

export interface SheetRow {
  channel: number;
  function: ChannelFunction;
  switchLabel: string | null;
  positions: number | null;
  engageMinUs: number | null;
  engageMaxUs: number | null;
  failsafeUs: number | null;
}

export const SHEET_FIELDS = ["function", "switchLabel", "positions", "engageMinUs", "engageMaxUs", "failsafeUs"] as const;

/** Per channel and field, what changed between two sheets (a channel missing before counts as unused). */
export function diffSheet(prev: SheetRow[], next: SheetRow[]): Changes {
  const before = new Map(prev.map((c) => [c.channel, c]));
  const out: Changes = {};
  for (const c of [...next].sort((a, b) => a.channel - b.channel)) {
    const p = before.get(c.channel);
    for (const f of SHEET_FIELDS) {
      const from = p ? p[f] : f === "function" ? "unused" : null;
      if (!same(from, c[f])) out[`ch${c.channel}.${f}`] = { from: normaliseValue(from), to: normaliseValue(c[f]) };
    }
  }
  return out;
}

const FIELD_LABELS: Record<string, string> = {
  name: "Name",
  vehicleType: "Vehicle type",
  frame: "Frame",
  flightController: "Flight controller board",
  firmware: "Firmware",
  firmwareVersion: "Firmware version",
  receiver: "Receiver",
  transmitter: "Transmitter",
  bandMhz: "Link band (MHz)",
  txPowerMw: "Transmitter power (mW)",
  rxSensitivityDbm: "Receiver sensitivity (dBm)",
  antennas: "Antennas",
  batteryCells: "Battery cells",
  batteryCapacityMah: "Battery capacity (mAh)",
  notes: "Notes",
  failsafeAction: "Failsafe plan: action",
  failsafeWithinS: "Failsafe plan: acts within (s)",
  retired: "Retired",
  photo: "Photo",
};

const SHEET_LABELS: Record<(typeof SHEET_FIELDS)[number], string> = {
  function: "function",
  switchLabel: "switch",
  positions: "positions",
  engageMinUs: "engages from (µs)",
  engageMaxUs: "engages to (µs)",
  failsafeUs: "on link loss (µs)",
};

/** "ch5.failsafeUs" → { channel: 5, label: "on link loss (µs)" }; other keys → null. */
export function sheetChangeKey(key: string): { channel: number; label: string } | null {
  const m = /^ch(\d+)\.(\w+)$/.exec(key);
  return m ? { channel: Number(m[1]), label: SHEET_LABELS[m[2] as keyof typeof SHEET_LABELS] ?? m[2] } : null;
}

/** A change key in words: "bandMhz" → "Link band (MHz)", "ch5.failsafeUs" → "Channel 5 on link loss (µs)". */
export function changeLabel(key: string): string {
  const m = /^ch(\d+)\.(\w+)$/.exec(key);
  if (m) return `Channel ${m[1]} ${SHEET_LABELS[m[2] as keyof typeof SHEET_LABELS] ?? m[2]}`;
  return FIELD_LABELS[key] ?? key;
}

/** True when a change touches the vehicle itself (not only photos): such changes mark the trend charts. */
export function changesTheBuild(changes: Changes): boolean {
  return Object.keys(changes).some((k) => k !== "photo" && k !== "retired");
}
