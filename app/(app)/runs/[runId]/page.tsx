import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { formatBytes, formatDuration } from "@/components/runs/format-bytes";
import { ReparseButton } from "@/components/runs/reparse-button";
import { RunStatusPoller } from "@/components/runs/run-status-poller";
import { runStatusText } from "@/components/runs/run-status-text";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { NotFoundError } from "@/lib/errors";
import { viewRun, type RunView } from "@/lib/ingest/runs";
import { idSchema } from "@/lib/validations/crew";
import { ColumnMapEditor } from "./column-map-editor";

export const metadata: Metadata = { title: "Run" };

async function loadRun(raw: string): Promise<{ run: RunView; mayEdit: boolean }> {
  const id = idSchema.safeParse(raw);
  if (!id.success) notFound();
  const { actor } = await getCrewPageContext();
  try {
    const run = await viewRun(actor, id.data);
    return { run, mayEdit: run.mayEdit };
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


export default async function RunPage({ params }: { params: Promise<{ runId: string }> }) {
  const { run, mayEdit } = await loadRun((await params).runId);
  const figures = [
    { label: "Status", value: runStatusText[run.status] ?? run.status },
    { label: "Format", value: run.format ? run.format.toUpperCase() : "—" },
    { label: "Samples", value: run.sampleCount.toLocaleString("en") },
    { label: "Duration", value: formatDuration(run.durationS) },
    { label: "Started", value: run.startedAt ? run.startedAt.toISOString().replace("T", " ").slice(0, 19) + " UTC" : "not in the log" },
    { label: "Original", value: `${run.upload.fileName} (${formatBytes(run.upload.sizeBytes)})` },
  ];
  const carried = run.status === "ready" ? carries(run.summary) : null;
  const verdict = (run.summary?.verdict as { level: string; reasons: string[] } | undefined) ?? null;
  return (
    <>
      <PageHeader title={run.title} lead={run.upload.note ?? undefined}>
        <a href={`/api/runs/${run.id}/original`} className="btn-quiet">
          Download the original
        </a>
        {mayEdit && run.status !== "queued" && run.status !== "parsing" && <ReparseButton runId={run.id} />}
      </PageHeader>
      <RunStatusPoller runId={run.id} status={run.status} progress={run.progress} />
      {run.status === "ready" && verdict && (
        <section
          aria-label="Verdict"
          className={`mb-6 rounded-lg border-l-8 bg-card p-4 ${verdict.level === "act" ? "border-act" : verdict.level === "watch" ? "border-watch" : "border-clear"}`}
        >
          <p className="text-lg font-bold">
            {verdict.level === "act" ? "Act before the next run" : verdict.level === "watch" ? "Watch" : "Clear"}
          </p>
          {verdict.reasons.length > 0 && (
            <ul className="mt-1 list-disc pl-5 text-sm">
              {verdict.reasons.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          )}
        </section>
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
      <dl className="grid grid-cols-2 gap-3 md:grid-cols-3">
        {figures.map((f) => (
          <div key={f.label} className="panel">
            <dt className="text-sm text-ink-soft">{f.label}</dt>
            <dd className="figures mt-1 break-words text-lg">{f.value}</dd>
          </div>
        ))}
      </dl>
      {carried && (
        <p className="panel mt-3 text-sm">
          <span className="text-ink-soft">The log carries: </span>
          <span data-testid="carries">{carried}</span>
        </p>
      )}
      {run.warnings.length > 0 && (
        <section className="panel mt-6" aria-labelledby="warnings">
          <h2 id="warnings" className="text-lg font-semibold">
            Warnings <span className="figures text-ink-soft">({run.warnings.length})</span>
          </h2>
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
        </section>
      )}
      {run.format === "csv" && mayEdit && (
        <section className="panel mt-6" aria-labelledby="column-map">
          <h2 id="column-map" className="text-lg font-semibold">
            Column map
          </h2>
          <p className="mt-1 text-sm text-ink-soft">Check which column carries which value and in which unit; correct it and re-parse.</p>
          <ColumnMapEditor runId={run.id} crewId={run.crewId} current={run.columnMap} />
        </section>
      )}
      <p className="mt-8 text-sm">
        <Link href="/runs" className="text-tide-700 underline">
          All runs
        </Link>
      </p>
    </>
  );
}
