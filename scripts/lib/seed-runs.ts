/**
 * Uploads the simulator's demo logs for the demo crew through the real pipeline (presigned PUT,
 * complete, parse, store) — the same path a browser takes. Logs already stored (same SHA-256)
 * are skipped, so running it again changes nothing.
 */
import { createHash } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { db } from "@/db/client";
import { demoCrew } from "@/db/demo-crew";
import { getUserWithSecretByEmail } from "@/db/queries/users";
import { builds, crews, routePlans, uploads } from "@/db/schema";
import type { Actor } from "@/lib/auth/actor";
import { drainIngestHere } from "@/lib/jobs/worker";
import { drainOutbox } from "@/lib/mail/outbox";
import { completeUpload, createUpload } from "@/lib/ingest/uploads";
import { demoLogs } from "../simulator/demo-runs";

export async function seedDemoRuns(): Promise<{ added: number; skipped: number }> {
  const [crew] = await db().select({ id: crews.id }).from(crews).where(eq(crews.name, demoCrew.name));
  const pilotEmail = demoCrew.members.find((m) => m.role === "pilot")!.email;
  const pilot = (await getUserWithSecretByEmail(pilotEmail))!;
  const actor: Actor = { user: { id: pilot.id, email: pilot.email, name: pilot.name, units: pilot.units, alertEmails: pilot.alertEmails }, via: "session" };
  let added = 0;
  let skipped = 0;
  for (const log of demoLogs()) {
    const sha = createHash("sha256").update(log.body).digest("hex");
    const [have] = await db().select({ id: uploads.id }).from(uploads).where(and(eq(uploads.crewId, crew.id), eq(uploads.sha256, sha)));
    if (have) {
      skipped++;
      continue;
    }
    const [build] = await db().select({ id: builds.id }).from(builds).where(and(eq(builds.crewId, crew.id), eq(builds.name, log.build)));
    const [plan] = log.routePlan
      ? await db().select({ id: routePlans.id }).from(routePlans).where(and(eq(routePlans.crewId, crew.id), eq(routePlans.name, log.routePlan)))
      : [];
    const body = Buffer.from(log.body, "utf8");
    const created = await createUpload(actor, crew.id, {
      fileName: log.fileName,
      size: body.length,
      contentType: log.contentType,
      buildId: build?.id,
      routePlanId: plan?.id,
      note: log.note,
    });
    const put = await fetch(created.putUrl!, { method: "PUT", body: new Uint8Array(body), headers: { "content-type": created.contentType } });
    if (!put.ok) throw new Error(`storing ${log.fileName} failed: HTTP ${put.status}`);
    await completeUpload(actor, created.uploadId, {});
    added++;
  }
  // This process reads the logs itself: the app is not serving yet.
  await drainIngestHere();
  // An "act" demo run mails the demo lead (queued with its analysis); send it before the caller closes the database.
  await drainOutbox();
  return { added, skipped };
}
