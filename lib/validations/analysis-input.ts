import { z } from "zod";

/** build.json for the command-line analyser (and the shape builds are turned into for analysis). */
export const buildConfigSchema = z.object({
  vehicleType: z.enum(["ground", "multirotor", "fixed-wing", "boat"]),
  cells: z.number().int().min(1).max(24).optional(),
  bandMhz: z.number().positive().max(100_000).optional(),
  rxSensitivityDbm: z.number().min(-150).max(0).optional(),
  failsafe: z.object({ action: z.enum(["return-to-home", "hold", "land"]), expectedWithinS: z.number().min(0).max(120) }).optional(),
  channels: z
    .array(
      z.object({
        channel: z.number().int().min(1).max(18),
        function: z.string().min(1).max(40),
        failsafeUs: z.number().int().min(500).max(2500).optional(),
        engageMinUs: z.number().int().min(500).max(2500).optional(),
        engageMaxUs: z.number().int().min(500).max(2500).optional(),
      }),
    )
    .max(18)
    .optional(),
});

/** plan.json for the command-line analyser. */
export const routePlanInputSchema = z.object({
  waypoints: z
    .array(z.object({ name: z.string().min(1).max(80), lat: z.number().min(-90).max(90), lon: z.number().min(-180).max(180), radiusM: z.number().positive().optional() }))
    .min(2),
  corridorM: z.number().positive().optional(),
});
