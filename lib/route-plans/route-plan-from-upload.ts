import { getUpload } from "@/db/queries/runs";
import { requireRecordPermission } from "@/lib/auth/access";
import type { Actor } from "@/lib/auth/actor";
import { ValidationError } from "@/lib/errors";
import { parseGpxRoutePlan } from "@/lib/parsers/gpx-route-plan";
import { ParseError } from "@/lib/parsers/types";
import { objectSize, readObject } from "@/lib/storage/objects";
import { createRoutePlan } from "./create-route-plan";

const MAX_PLAN_BYTES = 20 * 1024 * 1024;

/** Turns an uploaded GPX file's first <rte> (or its <wpt> list) into a route plan of the upload's crew. */
export async function routePlanFromUpload(
  actor: Actor,
  uploadId: number,
  opts: { name?: string; vehicleClass: "ground" | "air"; corridorM?: number },
): Promise<number> {
  const { record: upload } = await requireRecordPermission(actor, () => getUpload(uploadId), "manageRoutePlans", "Upload");
  const size = await objectSize(upload.objectKey);
  if (size === null) throw new ValidationError("The GPX file has not arrived in storage yet");
  if (size > MAX_PLAN_BYTES) throw new ValidationError("A route plan file must be under 20 MB");
  const chunks: Buffer[] = [];
  for await (const c of await readObject(upload.objectKey)) chunks.push(c as Buffer);
  let plan;
  try {
    plan = parseGpxRoutePlan(Buffer.concat(chunks).toString("utf8"));
  } catch (e) {
    if (e instanceof ParseError) throw new ValidationError(e.describe());
    throw e;
  }
  const name = opts.name ?? plan.name ?? upload.fileName.replace(/\.gpx$/i, "");
  return createRoutePlan(actor, upload.crewId, { name, vehicleClass: opts.vehicleClass, corridorM: opts.corridorM, waypoints: plan.waypoints }, "gpx");
}
