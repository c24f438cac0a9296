import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { BenchTestPanel } from "@/components/builds/bench-test-panel";
import { MoveRunForm } from "@/components/builds/move-run-form";
import { DebriefBody } from "@/components/debrief/debrief-body";
import { BenchNotice } from "@/components/debrief/bench-notice";
import { utcMinute, VerdictStrip } from "@/components/debrief/verdict-strip";
import { NotesSection } from "@/components/debrief/notes-section";
import { RunCautions } from "@/components/debrief/run-cautions";
import type { RunSummary } from "@/components/debrief/summary-figures";
import { ExportLinks } from "@/components/runs/export-links";
import { formatBytes } from "@/components/runs/format-bytes";
import { PdfLink } from "@/components/runs/pdf-link";
import { ReparseButton } from "@/components/runs/reparse-button";
import { RunStatusPoller } from "@/components/runs/run-status-poller";
import { UploadRunsNav } from "@/components/runs/upload-runs-nav";
import { runStatusText } from "@/components/runs/run-status-text";
import { SharePanel } from "@/components/share/share-panel";
import { FieldModeToggle } from "@/components/ui/field-mode-toggle";
import { listBuilds } from "@/db/queries/builds";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { NotFoundError } from "@/lib/errors";
import { formatSpan } from "@/lib/format/units";
import { loadDebrief, type Debrief } from "@/lib/runs/debrief";
import { idSchema } from "@/lib/validations/crew";
import { ColumnMapEditor } from "./column-map-editor";
import { NoteForm } from "./note-form";
import { SignOffForm } from "./sign-off-form";

export const metadata: Metadata = { title: "Debrief" };

async function load(raw: string): Promise<Debrief & { role: string }> {
  const id = idSchema.safeParse(raw);
  if (!id.success) notFound();
  const { actor } = await getCrewPageContext();
  try {
    const d = await loadDebrief(actor, id.data);
    return { ...d, role: d.run.viewerRole };
  } catch (e) {
    if (e instanceof NotFoundError) notFound();
    throw e;
  }
}

const fieldWords: Record<string, string> = {
  lat: "position", altM: "altitude", speedMps: "speed", headingDeg: "course", sats: "satellites", hdop: "HDOP", fixType: "fix type",
  rssiDbm: "RSSI (dBm)", rssiPct: "RSSI (%)", lqPct: "LQ", snrDb: "SNR", voltageV: "voltage", currentA: "current", usedMah: "capacity used",
  modeIndex: "mode", armed: "armed flag", failsafe: "failsafe flag",
};

function carries(summary: Record<string, unknown> | null): string {
  const present = (summary?.fieldsPresent as string[] | undefined) ?? [];
  const words = present.map((f) => fieldWords[f]).filter(Boolean);
  if (summary?.hasRc) words.push("RC channels");
  return words.length ? words.join(", ") : "—";
}

const utc = utcMinute;


export default async function DebriefPage({ params }: { params: Promise<{ runId: string }> }) {
  const d = await load((await params).runId);
  const { run, units } = d;
  const summary = (run.summary ?? {}) as RunSummary & { fieldsPresent?: string[] };
  const ready = run.status === "ready";
  const verdict = ready ? (summary.verdict ?? null) : null;
  const mayNote = can(d.role as never, "writeNote");
  const maySign = can(d.role as never, "signOff");
  const meta = [d.buildName, d.pilotName && `pilot ${d.pilotName}`, d.plan && `plan “${d.plan.name}”`, run.startedAt && utc(run.startedAt)].filter(Boolean).join(" · ");
  const mayShare = can(d.role as never, "share");
  const builds = run.mayEdit ? (await listBuilds(run.crewId)).map((b) => ({ id: b.id, name: b.name })) : [];

  return (
    <>
      <header className="mb-4 flex flex-col gap-3 border-b border-rule pb-4 sm:flex-row sm:items-end sm:justify-between">
        <div className="min-w-0">
          <p className="text-sm text-ink-soft">
            <Link href="/runs" className="text-tide-700 underline">
              Runs
            </Link>{" "}
            / debrief
          </p>
          <h1 className="text-2xl font-bold tracking-tight break-words">{run.title}</h1>
          {meta && <p className="mt-1 text-ink-soft">{meta}</p>}
          <UploadRunsNav part={run.part} fileName={run.upload.fileName} runs={run.upload.runs} />
          {run.upload.note && <p className="mt-1 max-w-prose text-sm">{run.upload.note}</p>}
        </div>
        <div className="flex flex-wrap gap-2">
          <FieldModeToggle />
          <a href={`/api/runs/${run.id}/original`} className="btn-quiet">
            Download the original
          </a>
          {run.mayEdit && run.status !== "queued" && run.status !== "parsing" && run.status !== "analysing" && (
            <ReparseButton runId={run.id} label={run.upload.runs.length > 1 ? `Re-parse the original (all ${run.upload.runs.length} runs)` : undefined} />
          )}
        </div>
      </header>

      <RunStatusPoller runId={run.id} status={run.status} progress={run.progress} error={run.error} />

      {ready && summary.bench === true && <BenchNotice linkLost={(summary.link?.lostCount ?? 0) > 0} />}

      {verdict && (
        <VerdictStrip verdict={verdict} signOff={d.signOff} notSignedHint={maySign ? "" : " — a lead signs debriefs off"}>
          {maySign && (
            <div className="mt-2 sm:flex sm:justify-end">
              <SignOffForm runId={run.id} signed={Boolean(d.signOff)} />
            </div>
          )}
        </VerdictStrip>
      )}

      {run.status === "failed" && run.error && (
        <section role="alert" className="mb-6 rounded-lg border border-act/40 bg-act/5 p-4">
          <h2 className="font-semibold text-act">This log could not be read</h2>
          <p className="figures mt-1 text-sm">{run.error}</p>
          <p className="mt-2 text-sm text-ink-soft">
            The original file is kept. Download it to check{run.format === "csv" ? ", or correct the column map below and re-parse" : ""}.
          </p>
        </section>
      )}

      <DebriefBody run={run} summary={summary} dataVersion={d.dataVersion} events={d.events} plan={d.plan} units={units} />

      {ready && <BenchTestPanel runId={run.id} />}

      <NotesSection notes={d.notes} emptyText="No notes yet. Pilots add what they saw and changed; leads read them before signing off.">
        {mayNote && <NoteForm runId={run.id} />}
      </NotesSection>

      {ready && (
        <section className="panel mt-6" aria-labelledby="share-title">
          <h2 id="share-title" className="text-lg font-semibold">
            Share and export
          </h2>
          <div className="mt-3 flex flex-wrap gap-2">
            <PdfLink runId={run.id} />
            <ExportLinks runId={run.id} />
          </div>
          {mayShare && (
            <div className="mt-4 border-t border-rule pt-4">
              <SharePanel runId={run.id} />
            </div>
          )}
          {run.mayEdit && (
            <div className="mt-4 border-t border-rule pt-4">
              <MoveRunForm runId={run.id} currentBuildId={run.buildId} builds={builds} />
            </div>
          )}
        </section>
      )}

      {ready && <RunCautions summary={summary} />}

      <section className="panel mt-6" aria-labelledby="log-title">
        <h2 id="log-title" className="text-lg font-semibold">
          The log
        </h2>
        <dl className="mt-3 grid grid-cols-2 gap-3 text-sm md:grid-cols-3">
          {[
            ["Status", runStatusText[run.status] ?? run.status],
            ["Format", run.format ? run.format.toUpperCase() : "—"],
            ["Samples", run.sampleCount.toLocaleString("en")],
            ["Duration", formatSpan(run.durationS)],
            ["Started", run.startedAt ? utc(run.startedAt) : "not in the log"],
            ["Original", `${run.upload.fileName} (${formatBytes(run.upload.sizeBytes)})`],
          ].map(([label, value]) => (
            <div key={label}>
              <dt className="text-ink-soft">{label}</dt>
              <dd className="figures mt-0.5 break-words">{value}</dd>
            </div>
          ))}
        </dl>
        {ready && (
          <p className="mt-3 text-sm">
            <span className="text-ink-soft">The log carries: </span>
            <span data-testid="carries">{carries(run.summary)}</span>
          </p>
        )}
        {run.warnings.length > 0 && (
          <div className="mt-4" aria-labelledby="warnings">
            <h3 id="warnings" className="font-semibold">
              Warnings <span className="figures text-ink-soft">({run.warnings.length})</span>
            </h3>
            <ul className="mt-2 space-y-1 text-sm">
              {run.warnings.map((w, i) => (
                <li key={i} className="flex gap-2">
                  <span aria-hidden="true" className="text-watch">
                    ▲
                  </span>
                  <span>
                    {w.message}
                    {w.line ? ` (first at line ${w.line}${w.column ? `, column “${w.column}”` : ""})` : ""}
                    {w.count && w.count > 1 ? ` — ${w.count.toLocaleString("en")} times` : ""}
                  </span>
                </li>
              ))}
            </ul>
          </div>
        )}
        {run.format === "csv" && run.mayEdit && (
          <div className="mt-4" aria-labelledby="column-map">
            <h3 id="column-map" className="font-semibold">
              Column map
            </h3>
            <p className="mt-1 text-sm text-ink-soft">Check which column carries which value and in which unit; correct it and re-parse.</p>
            <ColumnMapEditor runId={run.id} crewId={run.crewId} current={run.columnMap} />
          </div>
        )}
      </section>
    </>
  );
}
