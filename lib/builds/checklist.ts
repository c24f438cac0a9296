/**
 * The printable pre-run checklist, generated from the build record and its link sheet. The
 * generator is pure; `loadChecklist` fetches what it needs.
 */
import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild, type BuildWithChannels } from "@/db/queries/builds";
import { crews } from "@/db/schema";
import { defaultThresholds, withOverrides } from "@/lib/analysis/thresholds";
import type { Thresholds } from "@/lib/analysis/types";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { benchTestLine, benchTestStanding, type BenchTestStanding } from "./bench-test-facts";
import { latestBenchTest } from "./bench-tests";
import { sheetCheckOf } from "./build-check";
import { FUNCTION_WORDS, STICK_CHANNELS } from "./sheet-check";

/** LiPo full charge per cell (common practice). */
export const LIPO_FULL_V = 4.2;

export interface SwitchLine {
  channel: number;
  does: string;
  switchName: string;
  engages: string;
  onLoss: string;
}

export interface Checklist {
  radio: string[];
  sticks: string | null;
  switches: SwitchLine[];
  rssi: string[];
  failsafePlan: string;
  /** Where the build's recorded failsafe bench test stands: missing, stale, failed or current. */
  benchTestRecord: { state: BenchTestStanding["state"]; line: string };
  benchTest: string[];
  battery: string[];
}

const v = (x: number) => Number(x.toPrecision(7));
const actionWords = { "return-to-home": "return to home", hold: "hold position", land: "land" } as const;

const does: Record<string, string> = {
  arm: "Arms the vehicle",
  "return-to-home": "Commands return to home",
  mission: "Starts or pauses the mission",
  mode: "Selects the flight or drive mode",
  aux: "Auxiliary function",
};

/** How to make a vehicle safe on the bench before its failsafe is tested. */
function makeSafe(vehicle: BuildWithChannels["vehicleType"]): string {
  if (vehicle === "ground") return "Lift the wheels or tracks clear of the ground (vehicle on a stand) so nothing can drive off.";
  if (vehicle === "boat") return "Keep the boat out of the water and the propeller or jet clear of hands, cables and loose cloth.";
  return "Remove the propellers. Never test a failsafe with propellers fitted.";
}

/**
 * Lines of the checklist: radio and link, which switch does what, the failsafe plan, the build's
 * recorded bench test (missing or stale is said so) and how to bench-test it, and the battery.
 * Missing facts are said to be missing rather than left out.
 * @param bench the build's latest recorded bench test (when it was done, its result), or null
 */
export function buildChecklist(b: BuildWithChannels, th: Pick<Thresholds, "lowCellV">, bench: { testedAt: Date; result: string } | null = null): Checklist {
  const band = b.bandMhz != null ? `${v(b.bandMhz)} MHz` : null;
  const radio = [
    `Transmitter (${b.transmitter ?? "not recorded"}) bound to the receiver (${b.receiver ?? "not recorded"})${band ? ` on ${band}` : ""}.`,
    b.txPowerMw != null
      ? `Transmitter power set to ${v(b.txPowerMw)} mW — within your local radio-power limits for ${band ?? "this band"}.`
      : "Transmitter power not recorded: check it is within your local radio-power limits.",
    `Antennas fitted, undamaged and placed as recorded: ${b.antennas ?? "(not recorded)"}.`,
    "Range check on the ground before the run, with the transmitter's reduced-power test if it has one.",
  ];
  const stickChannels = b.channels.filter((c) => ["roll", "pitch", "throttle", "yaw"].includes(c.function));
  const sticks = stickChannels.length
    ? `Sticks: ${stickChannels.map((c) => `${FUNCTION_WORDS[c.function]} on channel ${c.channel}`).join(", ")}. Move each stick and confirm the vehicle reports the matching channel.`
    : null;
  const switches = b.channels
    .filter((c) => c.function in does)
    .map((c) => ({
      channel: c.channel,
      does: does[c.function],
      switchName: [c.switchLabel, c.positions && `${c.positions} positions`].filter(Boolean).join(", ") || "—",
      engages: c.engageMinUs != null && c.engageMaxUs != null ? `${c.engageMinUs}–${c.engageMaxUs} µs` : "not recorded",
      onLoss: c.failsafeUs != null ? `${c.failsafeUs} µs` : "not recorded",
    }));
  const rssi = b.channels
    .filter((c) => c.function === "rssi")
    .map((c) =>
      (STICK_CHANNELS as readonly number[]).includes(c.channel)
        ? `RSSI is recorded on stick channel ${c.channel}: correct the link sheet before the run.`
        : `The receiver reports RSSI on channel ${c.channel}: with the vehicle near the transmitter it should read a strong signal and not move with the sticks.`,
    );
  const plan = b.failsafeAction
    ? `On link loss the vehicle should ${actionWords[b.failsafeAction]}${b.failsafeWithinS != null ? ` within ${v(b.failsafeWithinS)} s` : " (no expected time recorded)"}.`
    : "No failsafe plan is recorded. Decide what the vehicle must do on link loss before the run.";
  const loss = b.channels.filter((c) => c.failsafeUs != null && c.function !== "unused");
  const benchTest = [
    makeSafe(b.vehicleType),
    "Power the vehicle and the transmitter; arm on the bench.",
    "Switch the transmitter off (or disconnect its radio link) and start a timer.",
    loss.length
      ? `The receiver should now output: ${loss.map((c) => `channel ${c.channel} (${FUNCTION_WORDS[c.function]}) ${c.failsafeUs} µs`).join("; ")}.`
      : "No failsafe values are recorded on the link sheet: read what the receiver outputs now and record it.",
    b.failsafeAction
      ? `Within ${b.failsafeWithinS != null ? `${v(b.failsafeWithinS)} s` : "the expected time"} the vehicle should switch to ${actionWords[b.failsafeAction]}. Note how long it took.`
      : "Note what the vehicle does and how long it takes.",
    "Switch the transmitter back on, confirm control returns, then disarm.",
  ];
  const cells = b.batteryCells;
  const battery = [
    cells
      ? `Pack: ${cells}S${b.batteryCapacityMah ? ` ${b.batteryCapacityMah} mAh` : ""}. Full charge reads about ${(cells * LIPO_FULL_V).toFixed(1)} V (${LIPO_FULL_V.toFixed(2)} V per cell, LiPo common practice).`
      : "Battery cells not recorded: check the pack matches the vehicle.",
    cells
      ? `End the run before ${(cells * th.lowCellV).toFixed(1)} V under load (${th.lowCellV.toFixed(2)} V per cell, the crew's low-voltage threshold).`
      : `End the run before ${th.lowCellV.toFixed(2)} V per cell under load (the crew's low-voltage threshold).`,
    "No swelling, dents, torn wrap or hot cells; balance lead and main lead undamaged; pack strapped down.",
  ];
  const standing = benchTestStanding(bench, b.linkSheetChangedAt);
  return { radio, sticks, switches, rssi, failsafePlan: plan, benchTestRecord: { state: standing.state, line: benchTestLine(standing) }, benchTest, battery };
}

/** The checklist of a build the actor may read, with its sheet check. */
export async function loadChecklist(actor: Actor, buildId: number) {
  const { record } = await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  const [[crew], check, bench] = await Promise.all([
    db().select({ thresholds: crews.thresholds }).from(crews).where(eq(crews.id, record.crewId)),
    sheetCheckOf(record),
    latestBenchTest(record),
  ]);
  const th = withOverrides(defaultThresholds(record.vehicleType), crew?.thresholds as Partial<Thresholds> | null, record.thresholds as Partial<Thresholds> | null);
  return { build: record, check, checklist: buildChecklist(record, th, bench.latest) };
}
