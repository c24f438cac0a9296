import { z } from "zod";
import { failsafeActions, vehicleTypes } from "@/db/schema/builds";
import { idSchema } from "./crew";

const optionalText = (max: number) => z.string().trim().max(max).optional().transform((v) => (v ? v : undefined));

export const buildCreateSchema = z.object({
  crewId: idSchema.optional(),
  name: z.string().trim().min(1, "Name the build").max(120),
  vehicleType: z.enum(vehicleTypes, { message: "Choose ground, multirotor, fixed-wing or boat" }),
  frame: optionalText(120),
  flightController: optionalText(120),
  firmware: optionalText(120),
  firmwareVersion: optionalText(60),
  receiver: optionalText(120),
  transmitter: optionalText(120),
  bandMhz: z.number().positive().max(100_000).optional(),
  txPowerMw: z.number().positive().max(100_000).optional(),
  rxSensitivityDbm: z.number().min(-150).max(0).optional(),
  antennas: optionalText(200),
  batteryCells: z.number().int().min(1).max(24).optional(),
  batteryCapacityMah: z.number().int().positive().max(1_000_000).optional(),
  notes: optionalText(10_000),
  failsafeAction: z.enum(failsafeActions).optional(),
  failsafeWithinS: z.number().min(0).max(120).optional(),
});

export type BuildCreate = z.infer<typeof buildCreateSchema>;
