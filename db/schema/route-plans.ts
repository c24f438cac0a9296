import { double, float, index, int, mysqlEnum, mysqlTable, primaryKey, varchar } from "drizzle-orm/mysql-core";
import { crews } from "./crews";
import { id, lifecycleDates, ref } from "./util/columns";
import { users } from "./users";

export const routePlanSources = ["gpx", "json", "drawn"] as const;

export const routePlans = mysqlTable(
  "route_plans",
  {
    id: id(),
    crewId: ref().notNull().references(() => crews.id, { onDelete: "cascade" }),
    name: varchar({ length: 120 }).notNull(),
    /** Sets the default acceptance radius and corridor: ground 2 m / 3 m, air 5 m / 10 m. */
    vehicleClass: mysqlEnum(["ground", "air"]).notNull().default("ground"),
    corridorM: float(),
    source: mysqlEnum(routePlanSources).notNull(),
    createdBy: ref().references(() => users.id, { onDelete: "set null" }),
    ...lifecycleDates(),
  },
  (t) => [index("route_plans_crew_idx").on(t.crewId)],
);

export const routeWaypoints = mysqlTable(
  "route_waypoints",
  {
    routePlanId: ref().notNull().references(() => routePlans.id, { onDelete: "cascade" }),
    seq: int({ unsigned: true }).notNull(),
    name: varchar({ length: 80 }).notNull(),
    lat: double().notNull(),
    lon: double().notNull(),
    altM: float(),
    radiusM: float(),
  },
  (t) => [primaryKey({ name: "route_waypoints_pk", columns: [t.routePlanId, t.seq] })],
);

export type RoutePlan = typeof routePlans.$inferSelect;
export type RouteWaypoint = typeof routeWaypoints.$inferSelect;
