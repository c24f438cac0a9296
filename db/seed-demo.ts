import { and, eq, ne } from "drizzle-orm";
import { hashPassword } from "@/lib/auth/password";
import { db } from "./client";
import { demoCrew, demoPassword, type DemoChannel } from "./demo-crew";
import { buildChannels, builds, crews, memberships, routePlans, routeWaypoints, users } from "./schema";

/** Creates the demo crew, its members, builds and route plans; running it again changes nothing. */
export async function seedDemo(): Promise<{ crewId: number; created: boolean }> {
  const d = db();
  const [existing] = await d.select({ id: crews.id }).from(crews).where(eq(crews.name, demoCrew.name)).limit(1);
  const passwordHash = await hashPassword(demoPassword);
  return d.transaction(async (tx) => {
    const crewId = existing?.id ?? (await tx.insert(crews).values({ name: demoCrew.name }).$returningId())[0].id;
    const userIds: Record<string, number> = {};
    for (const m of demoCrew.members) {
      const [u] = await tx.select({ id: users.id }).from(users).where(eq(users.email, m.email)).limit(1);
      const id = u?.id ?? (await tx.insert(users).values({ email: m.email, name: m.name, passwordHash }).$returningId())[0].id;
      userIds[m.role] = id;
      const [member] = await tx
        .select({ role: memberships.role })
        .from(memberships)
        .where(and(eq(memberships.crewId, crewId), eq(memberships.userId, id)));
      if (!member) await tx.insert(memberships).values({ crewId, userId: id, role: m.role });
    }
    for (const { linkSheet, ...b } of demoCrew.builds) {
      const [have] = await tx.select({ id: builds.id }).from(builds).where(and(eq(builds.crewId, crewId), eq(builds.name, b.name)));
      if (have) {
        // A demo database seeded before the builds had link sheets gets them, unless someone filled one in since.
        const [used] = await tx.select({ channel: buildChannels.channel }).from(buildChannels).where(and(eq(buildChannels.buildId, have.id), ne(buildChannels.function, "unused"))).limit(1);
        if (used) continue;
        await tx.delete(buildChannels).where(eq(buildChannels.buildId, have.id));
        await tx.insert(buildChannels).values(sheetRows(have.id, linkSheet));
        continue;
      }
      const [{ id }] = await tx.insert(builds).values({ ...b, crewId, createdBy: userIds.lead }).$returningId();
      await tx.insert(buildChannels).values(sheetRows(id, linkSheet));
    }
    for (const p of demoCrew.routePlans) {
      const [have] = await tx.select({ id: routePlans.id }).from(routePlans).where(and(eq(routePlans.crewId, crewId), eq(routePlans.name, p.name)));
      if (have) continue;
      const [{ id }] = await tx
        .insert(routePlans)
        .values({ crewId, name: p.name, vehicleClass: p.vehicleClass, source: "json", createdBy: userIds.pilot })
        .$returningId();
      await tx.insert(routeWaypoints).values(p.waypoints.map((w, seq) => ({ routePlanId: id, seq, ...w })));
    }
    return { crewId, created: !existing };
  });
}

/** All 18 channels of a build's link sheet: the demo's rows, the rest unused. */
function sheetRows(buildId: number, sheet: readonly DemoChannel[]) {
  return Array.from({ length: 18 }, (_, i) => {
    const c = sheet.find((x) => x.channel === i + 1);
    return {
      buildId,
      channel: i + 1,
      function: c?.function ?? ("unused" as const),
      switchLabel: c?.switchLabel ?? null,
      positions: c?.positions ?? null,
      engageMinUs: c?.engageMinUs ?? null,
      engageMaxUs: c?.engageMaxUs ?? null,
      failsafeUs: c?.failsafeUs ?? null,
    };
  });
}
