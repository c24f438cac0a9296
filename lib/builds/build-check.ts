import { getBuild, type BuildWithChannels } from "@/db/queries/builds";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { checkSheet, type SheetCheckResult, type SheetInput } from "./sheet-check";
import { gatherSheetEvidence } from "./sheet-evidence";

/** The stored build in the sheet check's shape. */
export function toSheetInput(build: BuildWithChannels): SheetInput {
  return {
    channels: build.channels.map((c) => ({
      channel: c.channel,
      function: c.function,
      switchLabel: c.switchLabel,
      positions: c.positions,
      engageMinUs: c.engageMinUs,
      engageMaxUs: c.engageMaxUs,
      failsafeUs: c.failsafeUs,
    })),
    failsafeAction: build.failsafeAction,
    failsafeWithinS: build.failsafeWithinS,
    bandMhz: build.bandMhz,
    rxSensitivityDbm: build.rxSensitivityDbm,
  };
}

/** The sheet check of a stored build, with the evidence of its latest runs. Caller has read access. */
export async function sheetCheckOf(build: BuildWithChannels): Promise<SheetCheckResult> {
  return checkSheet(toSheetInput(build), await gatherSheetEvidence(build));
}

/** Read access (observers too). */
export async function getSheetCheck(actor: Actor, buildId: number): Promise<SheetCheckResult> {
  const { record } = await requireRecordPermission(actor, () => getBuild(buildId), "read", "Build");
  return sheetCheckOf(record);
}
