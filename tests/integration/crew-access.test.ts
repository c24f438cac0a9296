/**
 * Sign-up → invitation e-mail → accept → role-checked access, against the running production
 * build, real MariaDB and the maildev inbox. Each test file makes its own crews and users.
 */
import { beforeAll, describe, expect, it } from "vitest";
import { acceptInvitation } from "@/lib/crews/invitations";
import { Client } from "../helpers/http";
import { linkIn, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";

const plan = (name: string) => ({
  name,
  waypoints: [
    { name: "A", lat: 53.47, lon: -3.05 },
    { name: "B", lat: 53.471, lon: -3.051 },
  ],
});

describe("a crew and its roles", () => {
  let crewA: Awaited<ReturnType<typeof newLead>>;
  const lead = new Client();
  const pilot = new Client();
  const observer = new Client();
  const pilotEmail = uniqueEmail("pilot");
  const observerEmail = uniqueEmail("observer");
  let routePlanId: number;

  beforeAll(async () => {
    crewA = await newLead("alpha");
    expect(await lead.signIn(crewA.email, testPassword)).toBeNull();
  });

  it("sends an invitation e-mail whose link accepts once", async () => {
    const res = await lead.post(`/api/crews/${crewA.crewId}/invitations`, { email: pilotEmail, role: "pilot" });
    expect(res.status).toBe(201);
    const mail = await waitForMail(pilotEmail, /invited to join alpha crew/);
    const link = linkIn(mail, "/invite/");
    const page = await new Client().get(new URL(link).pathname);
    expect(page.status).toBe(200);
    expect(await page.text()).toContain("Join alpha crew");

    const token = tokenFromLink(link);
    const joined = await acceptInvitation(token, { name: "Pat Pilot", password: testPassword });
    expect(joined.crewId).toBe(crewA.crewId);
    await expect(acceptInvitation(token, { name: "Again", password: testPassword })).rejects.toThrow(/already used|expired/);
    const spent = await new Client().get(new URL(link).pathname);
    expect(await spent.text()).toContain("no longer works");
  });

  it("lets the invited pilot sign in, read and write route plans", async () => {
    expect(await pilot.signIn(pilotEmail, testPassword)).toBeNull();
    const me = await (await pilot.get("/api/me")).json();
    expect(me.crews).toEqual([{ crewId: crewA.crewId, name: "alpha crew", role: "pilot" }]);
    const created = await pilot.post("/api/route-plans", plan("Pilot's loop"));
    expect(created.status).toBe(201);
    routePlanId = (await created.json()).id;
    const read = await pilot.get(`/api/route-plans/${routePlanId}`);
    expect(read.status).toBe(200);
    expect((await read.json()).routePlan.waypoints).toHaveLength(2);
  });

  it("refuses lead-only writes to a pilot with 403", async () => {
    expect((await pilot.post("/api/builds", { name: "Rover", vehicleType: "ground" })).status).toBe(403);
    expect((await pilot.post(`/api/crews/${crewA.crewId}/invitations`, { email: uniqueEmail("x"), role: "pilot" })).status).toBe(403);
  });

  it("lets an observer read but not write", async () => {
    await lead.post(`/api/crews/${crewA.crewId}/invitations`, { email: observerEmail, role: "observer" });
    const token = tokenFromLink(linkIn(await waitForMail(observerEmail, /invited/), "/invite/"));
    await acceptInvitation(token, { name: "Olly Observer", password: testPassword });
    expect(await observer.signIn(observerEmail, testPassword)).toBeNull();

    expect((await observer.get(`/api/route-plans/${routePlanId}`)).status).toBe(200);
    expect((await observer.get(`/api/crews/${crewA.crewId}/members`)).status).toBe(200);
    expect((await observer.post("/api/route-plans", plan("Not allowed"))).status).toBe(403);
    expect((await observer.post("/api/builds", { name: "Nope", vehicleType: "boat" })).status).toBe(403);
  });

  it("lets the lead create builds", async () => {
    const res = await lead.post("/api/builds", { name: "Mudskipper", vehicleType: "ground", bandMhz: 868 });
    expect(res.status).toBe(201);
    const { id } = await res.json();
    const build = (await (await observer.get(`/api/builds/${id}`)).json()).build;
    expect(build.name).toBe("Mudskipper");
    expect(build.channels).toHaveLength(18);
  });

  it("answers 404 for another crew's records and shows none of their data", async () => {
    const other = await newLead("bravo");
    const outsider = new Client();
    expect(await outsider.signIn(other.email, testPassword)).toBeNull();
    for (const path of [`/api/route-plans/${routePlanId}`, `/api/crews/${crewA.crewId}/members`, `/api/crews/${crewA.crewId}/invitations`]) {
      const res = await outsider.get(path);
      expect(res.status, path).toBe(404);
      expect(await res.text()).not.toContain("Pilot's loop");
    }
    // Naming crew A's id in the body does not get a record into crew A.
    expect((await outsider.post("/api/route-plans", { ...plan("Intruder"), crewId: crewA.crewId })).status).toBe(404);
    const mine = await (await outsider.get("/api/route-plans")).json();
    expect(mine.routePlans).toEqual([]);
  });

  it("answers 401 to callers who are not signed in", async () => {
    const anon = new Client();
    expect((await anon.get("/api/me")).status).toBe(401);
    expect((await anon.get(`/api/route-plans/${routePlanId}`)).status).toBe(401);
    expect((await anon.post("/api/route-plans", plan("x"))).status).toBe(401);
  });

  it("validates input with every field error and 422", async () => {
    const res = await lead.post("/api/route-plans", { name: "", waypoints: [{ name: "A", lat: 100, lon: 0 }] });
    expect(res.status).toBe(422);
    const fields = (await res.json()).error.details.fields;
    expect(Object.keys(fields)).toEqual(expect.arrayContaining(["name", "waypoints", "waypoints.0.lat"]));
  });
});
