import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { DebriefBody } from "@/components/debrief/debrief-body";
import { BenchNotice } from "@/components/debrief/bench-notice";
import { utcMinute, VerdictStrip } from "@/components/debrief/verdict-strip";
import { NotesSection } from "@/components/debrief/notes-section";
import { RunCautions } from "@/components/debrief/run-cautions";
import type { RunSummary } from "@/components/debrief/summary-figures";
import { FieldModeToggle } from "@/components/ui/field-mode-toggle";
import { formatSpan } from "@/lib/format/units";
import { openSharedDebrief } from "@/lib/share/shared-debrief";

// Every load checks the link (expiry, withdrawal) and counts one view: never cached.
export const dynamic = "force-dynamic";

export const metadata: Metadata = {
  title: "Shared debrief",
  robots: { index: false, follow: false, nocache: true },
  // The token is in the URL: map tiles and other requests must not carry it in a Referer.
  referrer: "no-referrer",
};

const utc = utcMinute;


/** A debrief for someone without an account: read-only, and only this run. */
export default async function SharedDebriefPage({ params }: { params: Promise<{ token: string }> }) {
  const token = (await params).token;
  const d = await openSharedDebrief(token);
  if (!d) notFound();
  const { run } = d;
  const units = "metric" as const;
  const apiBase = `/api/share/${encodeURIComponent(token)}`;
  const summary = (run.summary ?? {}) as RunSummary & { fieldsPresent?: string[] };
  const ready = run.status === "ready";
  const verdict = ready ? (summary.verdict ?? null) : null;
  const meta = [d.buildName, d.pilotName && `pilot ${d.pilotName}`, d.plan && `plan “${d.plan.name}”`, run.startedAt && utc(run.startedAt)].filter(Boolean).join(" · ");

  return (
    <>
      <header className="mb-4 flex flex-col gap-3 border-b border-rule pb-4 sm:flex-row sm:items-end sm:justify-between">
        <div className="min-w-0">
          <p className="text-sm text-ink-soft">Debrief shared with you · link valid until {utc(d.expiresAt)}</p>
          <h1 className="text-2xl font-bold tracking-tight break-words" data-testid="shared-title">
            {run.title}
          </h1>
          {meta && <p className="mt-1 text-ink-soft">{meta}</p>}
          {run.note && <p className="mt-1 max-w-prose text-sm whitespace-pre-wrap break-words">{run.note}</p>}
        </div>
        <div className="flex flex-wrap gap-2">
          <FieldModeToggle />
        </div>
      </header>

      {!ready && (
        <p className="panel mb-4 text-sm" role="status">
          This debrief is being updated right now. Reload the page in a minute.
        </p>
      )}

      {ready && summary.bench === true && <BenchNotice linkLost={(summary.link?.lostCount ?? 0) > 0} />}

      {verdict && <VerdictStrip verdict={verdict} signOff={d.signOff} />}

      <DebriefBody run={run} summary={summary} dataVersion={d.dataVersion} events={d.events} plan={d.plan} units={units} apiBase={apiBase} />

      <NotesSection notes={d.notes} emptyText="No notes on this debrief." />

      {ready && <RunCautions summary={summary} />}

      <section className="panel mt-6" aria-labelledby="log-title">
        <h2 id="log-title" className="text-lg font-semibold">
          The log
        </h2>
        <dl className="mt-3 grid grid-cols-2 gap-3 text-sm md:grid-cols-4">
          {[
            ["Format", run.format ? run.format.toUpperCase() : "—"],
            ["Samples", run.sampleCount.toLocaleString("en")],
            ["Duration", formatSpan(run.durationS)],
            ["Started", run.startedAt ? utc(run.startedAt) : "not in the log"],
          ].map(([label, value]) => (
            <div key={label}>
              <dt className="text-ink-soft">{label}</dt>
              <dd className="figures mt-0.5 break-words">{value}</dd>
            </div>
          ))}
        </dl>
      </section>
    </>
  );
}
