import { and, asc, desc, eq, isNull } from "drizzle-orm";
import { db } from "@/db/client";
import { buildChannels, builds } from "@/db/schema";

export async function getBuild(id: number) {
  const [build] = await db().select().from(builds).where(eq(builds.id, id)).limit(1);
  if (!build) return null;
  const channels = await db().select().from(buildChannels).where(eq(buildChannels.buildId, id)).orderBy(asc(buildChannels.channel));
  return { ...build, channels };
}

export async function listBuilds(crewId: number, opts: { includeRetired?: boolean } = {}) {
  const where = opts.includeRetired ? eq(builds.crewId, crewId) : and(eq(builds.crewId, crewId), isNull(builds.retiredAt));
  return db()
    .select({
      id: builds.id,
      name: builds.name,
      vehicleType: builds.vehicleType,
      receiver: builds.receiver,
      bandMhz: builds.bandMhz,
      firmware: builds.firmware,
      firmwareVersion: builds.firmwareVersion,
      retiredAt: builds.retiredAt,
      updatedAt: builds.updatedAt,
    })
    .from(builds)
    .where(where)
    .orderBy(desc(builds.updatedAt));
}
