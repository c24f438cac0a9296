import { z } from "zod";
import { idSchema } from "./crew";

export const waypointSchema = z.object({
  name: z.string().trim().min(1).max(80),
  lat: z.number().min(-90, "Latitude is between -90 and 90").max(90, "Latitude is between -90 and 90"),
  lon: z.number().min(-180, "Longitude is between -180 and 180").max(180, "Longitude is between -180 and 180"),
  altM: z.number().min(-500).max(20_000).optional(),
  radiusM: z.number().positive().max(10_000).optional(),
});

/** JSON route plan as typed in or clicked on the map. */
export const routePlanCreateSchema = z.object({
  crewId: idSchema.optional(),
  name: z.string().trim().min(1, "Name the route plan").max(120),
  vehicleClass: z.enum(["ground", "air"]).default("ground"),
  corridorM: z.number().positive().max(10_000).optional(),
  waypoints: z.array(waypointSchema).min(2, "A route needs at least two waypoints").max(5_000),
});

export type RoutePlanCreate = z.infer<typeof routePlanCreateSchema>;

/** A route plan from an uploaded GPX file (its <rte>, else its <wpt> list). */
export const routePlanFromUploadSchema = z.object({
  uploadId: idSchema,
  name: z.string().trim().min(1).max(120).optional(),
  vehicleClass: z.enum(["ground", "air"]).default("ground"),
  corridorM: z.number().positive().max(10_000).optional(),
});
