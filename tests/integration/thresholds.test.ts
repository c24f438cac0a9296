/** Crew thresholds change the analysis of stored runs when a lead asks for it (our simulator's log). */
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { acceptInvitation, inviteMember } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

async function fades(runId: number): Promise<{ count: number; threshold: number | null; belowS: number }> {
  const [rows] = (await db().execute(
    sql`SELECT COUNT(e.id) AS n, MAX(e.threshold) AS th, JSON_EXTRACT(r.summary, '$.link.timeBelowFadeS') AS below
        FROM runs r LEFT JOIN events e ON e.run_id = r.id AND e.kind = 'link-fade' WHERE r.id = ${runId} GROUP BY r.id`,
  )) as unknown as [{ n: number; th: number | null; below: number }[]];
  return { count: Number(rows[0].n), threshold: rows[0].th, belowS: Number(rows[0].below) };
}

describe("crew thresholds", () => {
  it("re-analyses stored runs with the lead's new thresholds; pilots cannot change them", async () => {
    const lead = await newLead("thresholds");
    const c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const up = await uploadLog(c, "th.csv", toCsv(simulateRun({ seed: 3, waypoints: demoCrew.routePlans[0].waypoints })));
    expect((await settledRun(c, up.runId)).status).toBe("ready");
    const before = await fades(up.runId);
    expect(before.count).toBeGreaterThan(0);
    expect(before.threshold).toBe(70); // DESIGN.md §5 default

    // LQ below 90 % now counts as a fade: the same log must spend longer below the threshold.
    expect((await c.request(`/api/crews/${lead.crewId}/thresholds`, { method: "PUT", json: { lqFadePct: 90 } })).status).toBe(200);
    const re = await c.post(`/api/crews/${lead.crewId}/reanalyse`, {});
    expect(re.status).toBe(200);
    expect((await re.json()).queued).toBe(1);
    const after = await settledRun(c, up.runId);
    expect(after.status).toBe("ready");
    const now = await fades(up.runId);
    expect(now.threshold).toBe(90);
    expect(now.belowS).toBeGreaterThan(before.belowS);

    expect((await c.request(`/api/crews/${lead.crewId}/thresholds`, { method: "PUT", json: { lqFadePct: 250 } })).status).toBe(422);

    const email = uniqueEmail("th-pilot");
    await inviteMember(lead.actor, lead.crewId, { email, role: "pilot" });
    await acceptInvitation(tokenFromLink(linkIn(await waitForMail(email, /invited/), "/invite/")), { name: "P", password: testPassword });
    const pilot = new Client();
    expect(await pilot.signIn(email, testPassword)).toBeNull();
    expect((await pilot.get(`/api/crews/${lead.crewId}/thresholds`)).status).toBe(200);
    expect((await pilot.request(`/api/crews/${lead.crewId}/thresholds`, { method: "PUT", json: { lqFadePct: 50 } })).status).toBe(403);
    expect((await pilot.post(`/api/crews/${lead.crewId}/reanalyse`, {})).status).toBe(403);
    const outsider = await newLead("th-outsider");
    const o = new Client();
    expect(await o.signIn(outsider.email, testPassword)).toBeNull();
    expect((await o.get(`/api/crews/${lead.crewId}/thresholds`)).status).toBe(404);
  });
});
