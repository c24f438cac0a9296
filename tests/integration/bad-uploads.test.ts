/**
 * Hostile and broken uploads through the running server (real s3rver and MariaDB), pattern of
 * ingest.test.ts. Files come from tests/fixtures/bad/ (see its README.md). Requirements: OWASP
 * ASVS 4.0.3 level 2 — V12.1.1 (size limits), V12.2.1 (content checked, not the name), V12.3.1 /
 * V12.3.2 (file names never used as paths), V5.1.3 / V5.1.4 (validation failures reported, nothing
 * partial stored), V5.5.2 (no XML entity expansion, W3C XML 1.0 §4); OWASP "CSV Injection".
 */
import fs from "node:fs";
import path from "node:path";
import { sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db/client";
import { env } from "@/lib/env";
import { Client } from "../helpers/http";
import { newLead, testPassword } from "../helpers/people";
import { settledRun, uploadLog, type RunJson } from "../helpers/uploads";

const BAD_DIR = path.resolve(process.cwd(), "tests/fixtures/bad");
const fixture = (name: string) => fs.readFileSync(path.join(BAD_DIR, name));

type Row = Record<string, unknown>;
async function rows<T extends Row>(query: ReturnType<typeof sql>): Promise<T[]> {
  const [r] = (await db().execute(query)) as unknown as [T[]];
  return r;
}
const sampleCount = async (runId: number) => Number((await rows<{ n: number }>(sql`SELECT COUNT(*) AS n FROM samples WHERE run_id = ${runId}`))[0].n);
const objectKey = async (uploadId: number) => (await rows<{ k: string }>(sql`SELECT object_key AS k FROM uploads WHERE id = ${uploadId}`))[0].k;
const uploadRows = async (crewId: number) => Number((await rows<{ n: number }>(sql`SELECT COUNT(*) AS n FROM uploads WHERE crew_id = ${crewId}`))[0].n);

async function runView(client: Client, runId: number): Promise<RunJson & { title: string; upload: { fileName: string } }> {
  const res = await client.get(`/api/runs/${runId}`);
  expect(res.status).toBe(200);
  expect(res.headers.get("content-type")).toMatch(/^application\/json/);
  return (await res.json()).run;
}

describe("hostile and broken uploads", () => {
  let lead: Awaited<ReturnType<typeof newLead>>;
  let client: Client;
  /** A good run uploaded first; no bad upload may change it. */
  let good: { runId: number; samples: number };
  /** Title of the run uploaded as "../../etc/passwd.csv". */
  let traversalTitle: string | undefined;

  beforeAll(async () => {
    lead = await newLead("bad-uploads");
    client = new Client();
    expect(await client.signIn(lead.email, testPassword)).toBeNull();
    const up = await uploadLog(client, "good.csv", fixture("time-backwards-duplicates.csv"));
    const run = await settledRun(client, up.runId);
    expect(run.status).toBe("ready");
    good = { runId: up.runId, samples: run.sampleCount };
    expect(good.samples).toBe(5);
  });

  it("refuses an empty file at POST /api/uploads, and fails a blank one with a readable message", async () => {
    // ASVS V12.1.1 / V5.1.3: size 0 is refused before any bytes are sent
    const empty = await client.post("/api/uploads", { fileName: "empty.csv", size: fixture("empty.csv").length, contentType: "text/csv" });
    expect(empty.status).toBe(422);
    expect(JSON.stringify(await empty.json())).toMatch(/The file is empty/);
    // A file of only a line break gets through the API and is failed by the parser.
    const run = await settledRun(client, (await uploadLog(client, "blank.csv", "\n")).runId);
    expect(run.status).toBe("failed");
    expect(run.error).toBe("The file is empty");
    expect(run.sampleCount).toBe(0);
    expect(await sampleCount(run.id)).toBe(0);
  });

  it("fails binary junk named .csv with a readable message and no samples", async () => {
    // ASVS V12.2.1 (content, not extension, decides)
    const run = await settledRun(client, (await uploadLog(client, "binary-junk.csv", fixture("binary-junk.csv"))).runId);
    expect(run.status).toBe("failed");
    expect(run.error).toBe("This does not look like a text log (CSV, GPX or NMEA 0183)");
    expect(await sampleCount(run.id)).toBe(0);
  });

  it("reads a billion-laughs GPX without expanding the entities", async () => {
    // ASVS V5.5.2 / W3C XML 1.0 §4.4: 10^9 × "lol" would be 3 GB; the run is ready with 2 samples
    const run = await settledRun(client, (await uploadLog(client, "billion-laughs.gpx", fixture("billion-laughs.gpx"), { contentType: "application/gpx+xml" })).runId);
    expect(run.status).toBe("ready");
    expect(run.format).toBe("gpx");
    expect(run.sampleCount).toBe(2);
    expect(await sampleCount(run.id)).toBe(2);
    expect(run.warnings).toContainEqual(expect.objectContaining({ code: "dtd-ignored" }));
    expect(JSON.stringify(run).length).toBeLessThan(20_000);
    expect(JSON.stringify(run)).not.toContain("lollol");
  });

  it("reads an external-entity GPX without the entity's file anywhere in the run", async () => {
    // ASVS V5.5.2 / V12.3.1: SYSTEM "file:///etc/passwd" is never read
    const run = await runView(client, (await settledRun(client, (await uploadLog(client, "xxe-file.gpx", fixture("xxe-file.gpx"), { contentType: "application/gpx+xml" })).runId)).id);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(2);
    expect(JSON.stringify(run)).not.toMatch(/root:|\/bin\/|nologin/);
  });

  it("stores a path-traversal file name under a safe object key", async () => {
    // ASVS V12.3.1 / V12.3.2: lib/ingest/object-key.ts reduces the name to a basename
    const up = await uploadLog(client, "../../etc/passwd.csv", fixture("traversal-name.csv"));
    const run = await settledRun(client, up.runId);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(3);
    const key = await objectKey(up.uploadId);
    expect(key).not.toContain("..");
    expect(key).not.toContain("/etc/");
    expect(key).toMatch(new RegExp(`^crews/${lead.crewId}/logs/[0-9a-f]{24}/passwd\\.csv$`));
    const view = await runView(client, up.runId);
    // The name the person gave is kept as text on the upload record.
    expect(view.upload.fileName).toBe("../../etc/passwd.csv");
    traversalTitle = view.title;
  });

  // The title is the name's last path segment. ASVS V12.3.1 (user-supplied names not treated as paths) / V5.3.3.
  it("titles the run with the file name as text, without its path", () => {
    expect(traversalTitle).toBe("passwd");
  });

  it("keeps formula-injection text in the file name and mode column as plain text", async () => {
    // OWASP "CSV Injection": stored verbatim, neutralised where written to CSV (lib/exports/events-csv.ts)
    const name = '=HYPERLINK("http://evil.example","x").csv';
    const up = await uploadLog(client, name, fixture("formula-injection.csv"));
    const run = await settledRun(client, up.runId);
    expect(run.status).toBe("ready");
    expect(run.sampleCount).toBe(6);
    expect(await sampleCount(run.id)).toBe(6);
    const key = await objectKey(up.uploadId);
    expect(key).not.toMatch(/["=]/);
    expect(key).not.toContain("..");
    const view = await runView(client, up.runId);
    expect(view.title).toBe('=HYPERLINK("http://evil.example","x")');
    expect(view.upload.fileName).toBe(name);
  });

  it("refuses a declared size over the 2 GB limit before any upload exists", async () => {
    // ASVS V12.1.1. The limit (UPLOAD_MAX_BYTES, default 2 GiB) is inclusive; one byte more is refused.
    const before = await uploadRows(lead.crewId);
    const size = env().UPLOAD_MAX_BYTES + 1;
    expect(size).toBe(2 * 1024 ** 3 + 1);
    const res = await client.post("/api/uploads", { fileName: "two-gigabytes.csv", size, contentType: "text/csv" });
    expect([413, 422]).toContain(res.status);
    const body = await res.json();
    expect(body.error.message).toMatch(/“two-gigabytes\.csv” is 2048 MB; the upload limit is 2048 MB/);
    expect(await uploadRows(lead.crewId)).toBe(before);
  });

  it("refuses content types that are not text logs at POST /api/uploads", async () => {
    // ASVS V12.2.1 / V5.1.3: lib/validations/upload.ts allow-lists the declared type
    const before = await uploadRows(lead.crewId);
    for (const contentType of ["image/png", "text/html", "application/zip", "application/x-msdownload"]) {
      const res = await client.post("/api/uploads", { fileName: "log.csv", size: 100, contentType });
      expect(res.status, contentType).toBe(422);
      expect(JSON.stringify(await res.json()), contentType).toMatch(/Upload a CSV, GPX or NMEA 0183 text log/);
    }
    expect(await uploadRows(lead.crewId)).toBe(before);
  });

  it("leaves the crew's earlier run and its samples untouched", async () => {
    // ASVS V5.1.4 / V12.1.1: a failed or hostile upload changes nothing else
    const view = await runView(client, good.runId);
    expect(view.status).toBe("ready");
    expect(view.sampleCount).toBe(good.samples);
    expect(await sampleCount(good.runId)).toBe(good.samples);
    const crewRuns = await rows<{ status: string; n: number }>(sql`SELECT status, COUNT(*) AS n FROM runs WHERE crew_id = ${lead.crewId} GROUP BY status`);
    expect(crewRuns.every((r) => r.status === "ready" || r.status === "failed")).toBe(true);
  });
});
