/**
 * The PDF debrief over HTTP, from a log that went through the real pipeline (our own
 * simulator's output, demo data): the document is read back with pdf-parse and must carry the
 * run's own title, verdict, figures (as lib/format/units.ts words them), events and notes.
 */
import fs from "node:fs";
import { and, eq } from "drizzle-orm";
import { PDFParse } from "pdf-parse";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { auditLog } from "@/db/schema";
import { updateProfile } from "@/lib/accounts/profile";
import { formatDistance, formatSpan } from "@/lib/format/units";
import { addNote } from "@/lib/runs/notes";
import { simulateRun } from "@/scripts/simulator/simulate-run";
import { toCsv } from "@/scripts/simulator/write-logs";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog } from "../helpers/uploads";

const loop = demoCrew.routePlans[0].waypoints;
// A tired pack and the simulator's link loss: the analysis says "act".
const csv = toCsv(simulateRun({ seed: 71, waypoints: loop, startSoc: 0.35, resistanceOhm: 0.06 }));

interface Summary {
  durationS: number;
  distanceM: number;
  verdict: { level: string; reasons: string[] };
}

async function pdfText(body: Buffer) {
  const parser = new PDFParse({ data: new Uint8Array(body) });
  try {
    const t = await parser.getText();
    return { text: t.text.replace(/\s+/g, " "), pages: t.total };
  } finally {
    await parser.destroy();
  }
}

describe("PDF debrief", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  let c: Client;
  let runId: number;
  let summary: Summary;
  const note = "Raised the receiver antenna by 20 cm; check the dune corner again.";

  beforeAll(async () => {
    lead = await newLead("pdf");
    c = new Client();
    expect(await c.signIn(lead.email, testPassword)).toBeNull();
    const plan = await c.post("/api/route-plans", { name: "Flats loop", waypoints: loop.map((w) => ({ name: w.name, lat: w.lat, lon: w.lon })) });
    expect(plan.status).toBe(201);
    const up = await uploadLog(c, "pdf-check-loop.csv", csv, { routePlanId: (await plan.json()).id });
    const run = await settledRun(c, up.runId);
    expect(run.status, run.error ?? "").toBe("ready");
    runId = up.runId;
    summary = ((await (await c.get(`/api/runs/${runId}`)).json()) as { run: { summary: Summary } }).run.summary;
    expect(summary.verdict.level).toBe("act");
    await addNote(lead.actor, runId, note);
  });

  it("answers a valid PDF with the run's title, verdict, figures, events and notes as text", async () => {
    const res = await c.get(`/api/runs/${runId}/report.pdf`);
    expect(res.status, await res.clone().text()).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toBe(`inline; filename="sortie-run-${runId}-pdf-check-loop.pdf"`);
    expect(res.headers.get("cache-control")).toMatch(/no-store/);
    const body = Buffer.from(await res.arrayBuffer());
    // ISO 32000-1 §7.5.2: the file starts with the header %PDF-1.n.
    expect(body.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    // Kept for a look by eye, as the browser tests keep screenshots.
    fs.mkdirSync(".data/test-reports", { recursive: true });
    fs.writeFileSync(".data/test-reports/pdf-report.pdf", body);
    const { text, pages } = await pdfText(body);
    expect(pages).toBeGreaterThanOrEqual(1);
    expect(text).toContain("pdf-check-loop");
    expect(text).toContain("Act before the next run");
    for (const r of summary.verdict.reasons) expect(text).toContain(r);
    expect(text).toContain(formatSpan(summary.durationS));
    expect(text).toContain(formatDistance(summary.distanceM, "metric"));
    expect(text).toContain("Link lost");
    expect(text).toContain("Waypoint reached: Slipway");
    expect(text).toContain(note);
    expect(text).toContain("pdf lead");
    expect(text).toContain("Not signed off");
    expect(text).toContain("Bench-test failsafes with propellers off and wheels lifted.");
  });

  it("records the export in the audit log", async () => {
    const rows = await db()
      .select({ detail: auditLog.detail, actorId: auditLog.actorId })
      .from(auditLog)
      .where(and(eq(auditLog.action, "run.exported"), eq(auditLog.targetType, "run"), eq(auditLog.targetId, String(runId))));
    expect(rows.length).toBeGreaterThanOrEqual(1);
    expect(rows[0]).toEqual({ detail: { format: "pdf" }, actorId: lead.userId });
  });

  it("words the figures in the reader's units", async () => {
    await updateProfile(lead.actor, { name: "pdf lead", units: "imperial", alertEmails: true });
    try {
      const { text } = await pdfText(Buffer.from(await (await c.get(`/api/runs/${runId}/report.pdf`)).arrayBuffer()));
      expect(text).toContain(formatDistance(summary.distanceM, "imperial"));
      expect(text).toContain("Altitude (ft)");
    } finally {
      await updateProfile(lead.actor, { name: "pdf lead", units: "metric", alertEmails: true });
    }
  });

  it("is 404 for another crew and 401 signed out", async () => {
    const other = await newLead("pdf-other");
    const oc = new Client();
    expect(await oc.signIn(other.email, testPassword)).toBeNull();
    expect((await oc.get(`/api/runs/${runId}/report.pdf`)).status).toBe(404);
    expect((await new Client().get(`/api/runs/${runId}/report.pdf`)).status).toBe(401);
    expect((await c.get(`/api/runs/999999999/report.pdf`)).status).toBe(404);
  });

  it("is 409 for a run that is not ready (a log that could not be read)", async () => {
    const up = await uploadLog(c, "pdf-junk.csv", Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256)));
    expect((await settledRun(c, up.runId)).status).toBe("failed");
    const res = await c.get(`/api/runs/${up.runId}/report.pdf`);
    expect(res.status).toBe(409);
    expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/could not be read/);
  });
});
