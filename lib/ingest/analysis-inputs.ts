import { eq } from "drizzle-orm";
import { db } from "@/db/client";
import { getBuild } from "@/db/queries/builds";
import { getRoutePlan } from "@/db/queries/route-plans";
import { crews } from "@/db/schema";
import { defaultThresholds, withOverrides } from "@/lib/analysis/thresholds";
import type { BuildConfig, RoutePlanInput, Thresholds, VehicleType } from "@/lib/analysis/types";

/** The build record, route plan and thresholds of a run, in the analysis's own shapes. */
export async function loadAnalysisInputs(run: { crewId: number; buildId: number | null; routePlanId: number | null }): Promise<{
  build?: BuildConfig;
  plan?: RoutePlanInput;
  thresholds: Thresholds;
}> {
  const [build, plan, [crew]] = await Promise.all([
    run.buildId ? getBuild(run.buildId) : Promise.resolve(null),
    run.routePlanId ? getRoutePlan(run.routePlanId) : Promise.resolve(null),
    db().select({ thresholds: crews.thresholds }).from(crews).where(eq(crews.id, run.crewId)),
  ]);
  const sameCrewBuild = build && build.crewId === run.crewId ? build : null;
  const samePlan = plan && plan.crewId === run.crewId ? plan : null;
  const vehicle: VehicleType = sameCrewBuild?.vehicleType ?? (samePlan?.vehicleClass === "air" ? "multirotor" : "ground");
  const buildConfig: BuildConfig | undefined = sameCrewBuild
    ? {
        vehicleType: sameCrewBuild.vehicleType,
        cells: sameCrewBuild.batteryCells ?? undefined,
        bandMhz: sameCrewBuild.bandMhz ?? undefined,
        rxSensitivityDbm: sameCrewBuild.rxSensitivityDbm ?? undefined,
        failsafe:
          sameCrewBuild.failsafeAction && sameCrewBuild.failsafeWithinS != null
            ? { action: sameCrewBuild.failsafeAction, expectedWithinS: sameCrewBuild.failsafeWithinS }
            : undefined,
        channels: sameCrewBuild.channels
          .filter((c) => c.function !== "unused")
          .map((c) => ({
            channel: c.channel,
            function: c.function,
            failsafeUs: c.failsafeUs ?? undefined,
            engageMinUs: c.engageMinUs ?? undefined,
            engageMaxUs: c.engageMaxUs ?? undefined,
          })),
      }
    : undefined;
  const planInput: RoutePlanInput | undefined = samePlan
    ? {
        corridorM: samePlan.corridorM ?? undefined,
        waypoints: samePlan.waypoints.map((w) => ({ name: w.name, lat: w.lat, lon: w.lon, radiusM: w.radiusM ?? undefined })),
      }
    : undefined;
  const thresholds = withOverrides(defaultThresholds(vehicle), crew?.thresholds as Partial<Thresholds> | null, sameCrewBuild?.thresholds as Partial<Thresholds> | null);
  return { build: buildConfig, plan: planInput, thresholds };
}
