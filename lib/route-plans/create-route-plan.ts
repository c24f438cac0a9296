import { db } from "@/db/client";
import { routePlans, routeWaypoints } from "@/db/schema";
import { audit } from "@/lib/audit";
import { requireCrewPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import type { RoutePlanCreate } from "@/lib/validations/route-plan";

export async function createRoutePlan(
  actor: Actor,
  crewId: number,
  input: Omit<RoutePlanCreate, "crewId">,
  source: "gpx" | "json" | "drawn" = "json",
): Promise<number> {
  await requireCrewPermission(actor, crewId, "manageRoutePlans", "Crew");
  const id = await db().transaction(async (tx) => {
    const [{ id }] = await tx
      .insert(routePlans)
      .values({ crewId, name: input.name, vehicleClass: input.vehicleClass, corridorM: input.corridorM ?? null, source, createdBy: actor.user.id })
      .$returningId();
    await tx.insert(routeWaypoints).values(
      input.waypoints.map((w, seq) => ({ routePlanId: id, seq, name: w.name, lat: w.lat, lon: w.lon, altM: w.altM ?? null, radiusM: w.radiusM ?? null })),
    );
    return id;
  });
  await audit({ crewId, actorId: actor.user.id, action: "route-plan.created", targetType: "route-plan", targetId: id });
  return id;
}
