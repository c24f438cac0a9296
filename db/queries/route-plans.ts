import { asc, count, desc, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { routePlans, routeWaypoints } from "@/db/schema";

export async function getRoutePlan(id: number) {
  const [plan] = await db().select().from(routePlans).where(eq(routePlans.id, id)).limit(1);
  if (!plan) return null;
  const waypoints = await db()
    .select()
    .from(routeWaypoints)
    .where(eq(routeWaypoints.routePlanId, id))
    .orderBy(asc(routeWaypoints.seq));
  return { ...plan, waypoints };
}

export async function listRoutePlans(crewId: number) {
  return db()
    .select({
      id: routePlans.id,
      name: routePlans.name,
      vehicleClass: routePlans.vehicleClass,
      source: routePlans.source,
      updatedAt: routePlans.updatedAt,
      waypointCount: count(routeWaypoints.seq),
    })
    .from(routePlans)
    .leftJoin(routeWaypoints, eq(routeWaypoints.routePlanId, routePlans.id))
    .where(eq(routePlans.crewId, crewId))
    .groupBy(routePlans.id)
    .orderBy(desc(routePlans.updatedAt));
}
