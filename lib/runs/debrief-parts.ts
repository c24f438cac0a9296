import type { DebriefEvent } from "@/components/debrief/event-words";
import type { events } from "@/db/schema";

interface PlanWithWaypoints {
  name: string;
  waypoints: { name: string; lat: number; lon: number; radiusM: number | null }[];
}

/** Pieces both debriefs (the crew's and the shared one) shape the same way. */

export function debriefEvent(e: typeof events.$inferSelect): DebriefEvent {
  return {
    id: e.id,
    kind: e.kind,
    startS: e.startS,
    endS: e.endS,
    lat: e.lat,
    lon: e.lon,
    distanceFromHomeM: e.distanceFromHomeM,
    peak: e.peak,
    threshold: e.threshold,
    detail: (e.detail as Record<string, unknown> | null) ?? null,
  };
}

/** The route plan for the map: each waypoint's own acceptance radius, else the run's threshold, else 2 m. */
export function debriefPlan(plan: PlanWithWaypoints | null, runSummary: Record<string, unknown> | null) {
  if (!plan) return null;
  const thresholds = (runSummary?.thresholds ?? {}) as { acceptanceRadiusM?: number };
  return {
    name: plan.name,
    waypoints: plan.waypoints.map((w) => ({ name: w.name, lat: w.lat, lon: w.lon, radiusM: w.radiusM ?? thresholds.acceptanceRadiusM ?? 2 })),
  };
}
