import { z } from "zod";
import { columnMapSchema } from "@/lib/parsers/column-map";
import { idSchema } from "./crew";

/**
 * Browsers report log files under many types; anything else (images, archives…) is refused.
 * "text/x-log": freedesktop.org shared-mime-info names `*.log` so (/usr/share/mime/globs2), and
 * browsers on Linux take a file's type from it — receivers' NMEA captures are often `.log` files.
 */
export const acceptedContentTypes = [
  "text/csv", "text/plain", "text/tab-separated-values", "application/csv", "application/vnd.ms-excel",
  "application/gpx+xml", "application/xml", "text/xml", "application/octet-stream", "text/x-nmea", "text/x-log", "",
] as const;

export const uploadCreateSchema = z.object({
  crewId: idSchema.optional(),
  fileName: z
    .string()
    .trim()
    .min(1, "The file needs a name")
    .max(255, "File names are limited to 255 characters"),
  size: z.number().int().min(1, "The file is empty").max(Number.MAX_SAFE_INTEGER),
  contentType: z
    .string()
    .max(120)
    .transform((s) => s.split(";")[0].trim().toLowerCase())
    .refine((t) => (acceptedContentTypes as readonly string[]).includes(t), {
      message: "Upload a CSV, GPX or NMEA 0183 text log",
    }),
  buildId: idSchema.optional(),
  routePlanId: idSchema.optional(),
  note: z.string().trim().max(5000).optional(),
});

export const uploadCompleteSchema = z
  .object({
    columnMapId: idSchema.optional(),
    columnMap: columnMapSchema.optional(),
    /** ETags of the parts, in order, for multipart uploads. */
    parts: z.array(z.string().min(1).max(200)).max(10_000).optional(),
  })
  .refine((v) => !(v.columnMapId && v.columnMap), { message: "Send either columnMapId or columnMap, not both" });

export const reparseSchema = z
  .object({ columnMapId: idSchema.optional(), columnMap: columnMapSchema.optional() })
  .refine((v) => !(v.columnMapId && v.columnMap), { message: "Send either columnMapId or columnMap, not both" });

export const columnMapCreateSchema = z.object({
  crewId: idSchema.optional(),
  name: z.string().trim().min(1, "Name the column map").max(80),
  mapping: columnMapSchema,
});

export type UploadCreate = z.infer<typeof uploadCreateSchema>;
