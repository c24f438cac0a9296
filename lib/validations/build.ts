import { z } from "zod";
import { channelFunctions, failsafeActions, vehicleTypes } from "@/db/schema/builds";
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

// ---- Edits of an existing build ------------------------------------------------------------

/** Text that may be cleared: "" and null both mean "no value". */
const clearableText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullable()
    .transform((v) => (v ? v : null));
const clearable = <T extends z.ZodType>(schema: T) => schema.nullable();

/**
 * Partial update: only the fields sent change; null clears a field. The failsafe plan lives in the
 * same record (it is edited beside the link sheet in the UI).
 */
export const buildUpdateSchema = z
  .object({
    name: z.string().trim().min(1, "Name the build").max(120),
    vehicleType: z.enum(vehicleTypes, { message: "Choose ground, multirotor, fixed-wing or boat" }),
    frame: clearableText(120),
    flightController: clearableText(120),
    firmware: clearableText(120),
    firmwareVersion: clearableText(60),
    receiver: clearableText(120),
    transmitter: clearableText(120),
    bandMhz: clearable(z.number().positive("The band is a frequency above 0 MHz").max(100_000)),
    txPowerMw: clearable(z.number().positive("Power is above 0 mW").max(100_000)),
    rxSensitivityDbm: clearable(z.number().min(-150, "Sensitivity is a level between -150 and 0 dBm").max(0, "Sensitivity is a level between -150 and 0 dBm")),
    antennas: clearableText(200),
    batteryCells: clearable(z.number().int("Whole cells").min(1).max(24)),
    batteryCapacityMah: clearable(z.number().int("Whole mAh").positive().max(1_000_000)),
    notes: clearableText(10_000),
    failsafeAction: clearable(z.enum(failsafeActions, { message: "Choose return to home, hold or land" })),
    failsafeWithinS: clearable(z.number().min(0, "Between 0 and 120 s").max(120, "Between 0 and 120 s")),
  })
  .partial()
  .strict();

export type BuildUpdate = z.infer<typeof buildUpdateSchema>;

/** PWM values a receiver can put out; wider than any common endpoint setting. */
const pwm = z.number().int("Whole microseconds").min(500, "Between 500 and 2500 µs").max(2500, "Between 500 and 2500 µs");

export const linkSheetChannelSchema = z.object({
  channel: z.number().int().min(1).max(18),
  function: z.enum(channelFunctions, { message: "Choose what the channel does" }),
  switchLabel: z
    .string()
    .trim()
    .max(40)
    .nullish()
    .transform((v) => (v ? v : null)),
  positions: z.number().int().min(2, "A switch has 2 to 6 positions").max(6, "A switch has 2 to 6 positions").nullish().transform((v) => v ?? null),
  engageMinUs: pwm.nullish().transform((v) => v ?? null),
  engageMaxUs: pwm.nullish().transform((v) => v ?? null),
  failsafeUs: pwm.nullish().transform((v) => v ?? null),
});

/** The whole sheet: all 18 channels, each once; optionally the failsafe plan saved with it. */
export const linkSheetSchema = z
  .object({
    channels: z
      .array(linkSheetChannelSchema)
      .length(18, "Send all 18 channels")
      .refine((cs) => new Set(cs.map((c) => c.channel)).size === 18, { message: "Each channel 1–18 exactly once" }),
    failsafeAction: buildUpdateSchema.shape.failsafeAction,
    failsafeWithinS: buildUpdateSchema.shape.failsafeWithinS,
  })
  .strict();

export type LinkSheetInput = z.infer<typeof linkSheetSchema>;
export type LinkSheetChannel = z.infer<typeof linkSheetChannelSchema>;

export const retireSchema = z.object({ retired: z.boolean() }).strict();

/** Photos: a picture of the build, not a document store. */
export const photoContentTypes = ["image/jpeg", "image/png", "image/webp"] as const;
export const PHOTO_MAX_BYTES = 10 * 1024 * 1024;

export const photoCreateSchema = z.object({
  fileName: z.string().trim().min(1, "The file needs a name").max(160, "File names are limited to 160 characters"),
  contentType: z
    .string()
    .max(120)
    .transform((s) => s.split(";")[0].trim().toLowerCase())
    .refine((t) => (photoContentTypes as readonly string[]).includes(t), { message: "Upload a JPEG, PNG or WebP image" }),
  size: z.number().int().min(1, "The file is empty").max(PHOTO_MAX_BYTES, "Photos are limited to 10 MB"),
  caption: z.string().trim().max(200).optional().transform((v) => (v ? v : undefined)),
});

export const moveRunSchema = z.object({ buildId: idSchema.nullable() }).strict();
