/**
 * "Act" alerts by e-mail, end to end: a log through the real pipeline (our own simulator's
 * output, demo data), the mail read from the local maildev inbox.
 */
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { getUserById } from "@/db/queries/users";
import { auditLog } from "@/db/schema";
import { updateProfile } from "@/lib/accounts/profile";
import { ALERT_ACTION, sendRunAlert } from "@/lib/alerts/run-alert";
import { acceptInvitation, inviteMember } from "@/lib/crews/invitations";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { linkIn, mailsTo, tokenFromLink, waitForMail } from "../helpers/inbox";
import { newLead, testPassword, uniqueEmail } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const loop = demoCrew.routePlans[0].waypoints;
// A tired pack and the simulator's link loss → "act"; no loss and no fade → "clear".
const actCsv = toCsv(simulateRun({ seed: 73, waypoints: loop, startSoc: 0.35, resistanceOhm: 0.06 }));
const clearCsv = toCsv(simulateRun({ seed: 79, waypoints: loop, lossAt: 2, fadeAt: [2, 2] }));
const actTitle = "<script>alert(1)</script> alert-check";
/** Long enough for a mail that was going to be sent to have arrived (the act mail takes well under this). */
const GRACE_MS = 2500;
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));
const aboutRun = (runId: number) => (m: { text?: string }) => new RegExp(`/runs/${runId}(?!\\d)`).test(m.text ?? "");

async function alertEntries(runId: number) {
  return db()
    .select({ detail: auditLog.detail })
    .from(auditLog)
    .where(and(eq(auditLog.action, ALERT_ACTION), eq(auditLog.targetType, "run"), eq(auditLog.targetId, String(runId))));
}

describe("act alerts", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  let quietEmail: string;
  let c: Client;
  let actRun: number;

  beforeAll(async () => {
    lead = await newLead("alerts");
    // A second lead who turned alerts off in Settings.
    quietEmail = uniqueEmail("alerts-quiet");
    await inviteMember(lead.actor, lead.crewId, { email: quietEmail, role: "lead" });
    const { userId } = await acceptInvitation(tokenFromLink(linkIn(await waitForMail(quietEmail, /invited/), "/invite/")), { name: "Quiet Lead", password: testPassword });
    const quiet = (await getUserById(userId))!;
    await updateProfile({ user: quiet, via: "session" }, { name: quiet.name, units: quiet.units, alertEmails: false });
    expect((await getUserById(userId))!.alertEmails).toBe(false);
    c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
  });

  it("mails the lead who wants alerts when a run comes out 'act', with the reasons and a link", async () => {
    const up = await uploadLog(c, `${actTitle}.csv`, actCsv);
    actRun = up.runId;
    const run = await settledRun(c, actRun);
    expect(run.status).toBe("ready");
    const { summary } = ((await (await c.get(`/api/runs/${actRun}`)).json()) as { run: { summary: { verdict: { level: string; reasons: string[] } } } }).run;
    expect(summary.verdict.level).toBe("act");

    const mail = await waitForMail(lead.email, /^Act before the next run: /, 15_000);
    expect(mail.subject).toBe(`Act before the next run: ${actTitle}`);
    const url = `${process.env.APP_URL ?? "http://localhost:3100"}/runs/${actRun}`;
    expect(linkIn(mail, "/runs/")).toBe(url);
    for (const r of summary.verdict.reasons) {
      expect(mail.text).toContain(r);
      expect(mail.html).toContain(r);
    }
    expect(mail.text).toContain("Turn these off in Settings");
    // The title is user text: escaped in the HTML part, as written in the plain part.
    expect(mail.html).not.toContain("<script>");
    expect(mail.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt; alert-check");
    expect(mail.text).toContain(actTitle);

    const entries = await alertEntries(actRun);
    expect(entries).toHaveLength(1);
    expect(entries[0].detail).toMatchObject({ verdict: "act", recipients: [lead.userId], reasons: summary.verdict.reasons });
  });

  it("sends nothing to the lead who turned alerts off", async () => {
    await pause(GRACE_MS);
    expect((await mailsTo(quietEmail)).filter((m) => /^Act before/.test(m.subject))).toEqual([]);
  });

  it("does not mail again when a re-parse of the same run says 'act' again", async () => {
    const res = await c.post(`/api/runs/${actRun}/reparse`, {});
    expect(res.status, await res.clone().text()).toBe(200);
    // Wait for the re-parse to start and finish (the run is queued first).
    await pause(300);
    expect((await settledRun(c, actRun)).status).toBe("ready");
    await pause(GRACE_MS);
    expect((await mailsTo(lead.email)).filter(aboutRun(actRun))).toHaveLength(1);
    expect(await alertEntries(actRun)).toHaveLength(1);
  });

  it("mails again for a later 'act' that follows a non-act verdict, and never twice for one outcome", async () => {
    // The decision on its own, as the ingest hook makes it: before this analysis the run was "clear".
    expect(await sendRunAlert(actRun, "clear")).toEqual({ sent: 1, failed: 0, recipients: [lead.userId] });
    expect(await sendRunAlert(actRun, "act")).toEqual({ skipped: "already-sent" });
    const deadline = Date.now() + 10_000;
    while ((await mailsTo(lead.email)).filter(aboutRun(actRun)).length < 2 && Date.now() < deadline) await pause(200);
    expect((await mailsTo(lead.email)).filter(aboutRun(actRun))).toHaveLength(2);
    expect(await alertEntries(actRun)).toHaveLength(2);
  });

  it("sends nothing for a 'clear' run", async () => {
    const up = await uploadLog(c, "alerts-clear-check.csv", clearCsv);
    expect((await settledRun(c, up.runId)).status).toBe("ready");
    const { summary } = ((await (await c.get(`/api/runs/${up.runId}`)).json()) as { run: { summary: { verdict: { level: string } } } }).run;
    expect(summary.verdict.level).toBe("clear");
    expect(await sendRunAlert(up.runId, null)).toEqual({ skipped: "not-act" });
    await pause(GRACE_MS);
    expect((await mailsTo(lead.email)).filter(aboutRun(up.runId))).toEqual([]);
    expect(await alertEntries(up.runId)).toEqual([]);
  });
});
