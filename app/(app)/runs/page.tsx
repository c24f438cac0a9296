import type { Metadata } from "next";
import Link from "next/link";
import { listRunsPage, runFilterOptions } from "@/db/queries/run-list";
import { getUserById } from "@/db/queries/users";
import { runStatusText } from "@/components/runs/run-status-text";
import { partOf } from "@/components/runs/run-parts";
import { RunsLive } from "@/components/runs/runs-live";
import { VerdictBadge } from "@/components/runs/verdict-badge";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { formatDistance, formatSpan, type Units } from "@/lib/format/units";
import { readRunListQuery, runListSearch, type RunListQuery, type RunSortKey } from "@/lib/validations/run-list";
import { Pager } from "@/components/ui/pager";

export const metadata: Metadata = { title: "Runs" };

const columns: { key: RunSortKey; label: string; numeric?: boolean }[] = [
  { key: "date", label: "Date" },
  { key: "build", label: "Build" },
  { key: "pilot", label: "Pilot" },
  { key: "plan", label: "Route plan" },
  { key: "duration", label: "Duration", numeric: true },
  { key: "distance", label: "Distance", numeric: true },
  { key: "verdict", label: "Verdict" },
  { key: "status", label: "Status" },
];

const when = (d: Date) => d.toISOString().slice(0, 16).replace("T", " ");

function SortHeader({ q, col }: { q: RunListQuery; col: (typeof columns)[number] }) {
  const active = q.sort === col.key;
  const dir = active && q.dir === "desc" ? "asc" : active ? "desc" : col.key === "date" ? "desc" : "asc";
  return (
    <th scope="col" aria-sort={active ? (q.dir === "asc" ? "ascending" : "descending") : "none"} className={`px-3 py-2 font-medium ${col.numeric ? "text-right" : ""}`}>
      <Link href={`/runs${runListSearch(q, { sort: col.key, dir, page: 1 })}`} className="inline-flex min-h-8 items-center gap-1 hover:text-tide-700">
        {col.label}
        <span aria-hidden="true" className="text-xs">
          {active ? (q.dir === "asc" ? "▲" : "▼") : ""}
        </span>
      </Link>
    </th>
  );
}

export default async function RunsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { crew, actor } = await getCrewPageContext();
  const q = readRunListQuery(await searchParams);
  const [{ rows, total, pages }, options, me] = await Promise.all([listRunsPage(crew.crewId, q), runFilterOptions(crew.crewId), getUserById(actor.user.id)]);
  const units: Units = me?.units ?? "metric";
  const mayUpload = can(crew.role, "uploadLog");
  const filtered = q.build || q.pilot || q.verdict || q.from || q.to;
  const active = rows.filter((r) => r.status === "queued" || r.status === "parsing" || r.status === "analysing");

  return (
    <>
      <PageHeader title="Runs" lead="Each uploaded log becomes a run with its debrief, or several when one file holds several runs.">
        {mayUpload && (
          <Link href="/runs/upload" className="btn-primary">
            Upload logs
          </Link>
        )}
      </PageHeader>
      <RunsLive active={active.map((r) => ({ id: r.id, status: r.status }))} />

      {total === 0 && !filtered ? (
        <EmptyState title="No runs yet" action={mayUpload ? { href: "/runs/upload", label: "Upload the first log" } : undefined}>
          <p>
            After a run, upload the vehicle&apos;s log (CSV telemetry, GPX or NMEA 0183). A field laptop can also upload with a
            personal API token (Settings → API tokens).
          </p>
        </EmptyState>
      ) : (
        <>
          <form method="get" action="/runs" className="panel mb-4 grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-6" aria-label="Filter runs">
            {q.sort !== "date" && <input type="hidden" name="sort" value={q.sort} />}
            {q.dir !== "desc" && <input type="hidden" name="dir" value={q.dir} />}
            <label className="text-sm">
              <span className="field-label">Build</span>
              <select name="build" defaultValue={q.build ?? ""} className="field-input">
                <option value="">Any</option>
                {options.builds.map((b) => (
                  <option key={b.id} value={b.id}>
                    {b.name}
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm">
              <span className="field-label">Pilot</span>
              <select name="pilot" defaultValue={q.pilot ?? ""} className="field-input">
                <option value="">Any</option>
                {options.pilots.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.name}
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm">
              <span className="field-label">Verdict</span>
              <select name="verdict" defaultValue={q.verdict ?? ""} className="field-input">
                <option value="">Any</option>
                <option value="act">Act</option>
                <option value="watch">Watch</option>
                <option value="clear">Clear</option>
              </select>
            </label>
            <label className="text-sm">
              <span className="field-label">From</span>
              <input type="date" name="from" defaultValue={q.from ?? ""} className="field-input" />
            </label>
            <label className="text-sm">
              <span className="field-label">To</span>
              <input type="date" name="to" defaultValue={q.to ?? ""} className="field-input" />
            </label>
            <div className="col-span-2 flex items-end gap-2 sm:col-span-1">
              <button type="submit" className="btn-primary flex-1">
                Filter
              </button>
              {filtered && (
                <Link href={`/runs${runListSearch({ ...q, build: undefined, pilot: undefined, verdict: undefined, from: undefined, to: undefined, page: 1 })}`} className="btn-quiet">
                  Clear
                </Link>
              )}
            </div>
          </form>

          <p className="mb-2 text-sm text-ink-soft" aria-live="polite">
            {total === 0 ? "No run matches these filters." : `${total.toLocaleString("en")} run${total === 1 ? "" : "s"}${pages > 1 ? `, page ${q.page} of ${pages}` : ""}`}
          </p>
          {rows.length > 0 && (
            <div className="overflow-x-auto rounded-lg border border-rule bg-card">
              <table className="w-full min-w-[760px] text-left text-sm" data-testid="runs-table">
                <thead className="border-b border-rule bg-tide-50 text-ink-soft">
                  <tr>
                    <th scope="col" className="px-3 py-2 font-medium">
                      Run
                    </th>
                    {columns.map((c) => (
                      <SortHeader key={c.key} q={q} col={c} />
                    ))}
                  </tr>
                </thead>
                <tbody className="divide-y divide-rule">
                  {rows.map((r) => (
                    <tr key={r.id} data-run-id={r.id}>
                      <td className="px-3 py-2 font-medium">
                        <Link href={`/runs/${r.id}`} className="text-tide-700 underline">
                          {r.title}
                        </Link>
                        {r.partCount > 1 && (
                          <span className="figures ml-2 inline-block rounded border border-rule px-1.5 text-xs font-normal whitespace-nowrap text-ink-soft" data-testid="run-part">
                            {partOf(r.part, r.partCount).toLowerCase()}
                          </span>
                        )}
                      </td>
                      <td className="figures px-3 py-2 whitespace-nowrap">{when(r.startedAt ?? r.createdAt)}</td>
                      <td className="px-3 py-2">{r.buildName ?? "—"}</td>
                      <td className="px-3 py-2">{r.pilotName ?? "—"}</td>
                      <td className="px-3 py-2">{r.planName ?? "—"}</td>
                      <td className="figures px-3 py-2 text-right whitespace-nowrap">{formatSpan(r.durationS)}</td>
                      <td className="figures px-3 py-2 text-right whitespace-nowrap">{formatDistance(r.distanceM, units)}</td>
                      <td className="px-3 py-2">
                        <VerdictBadge level={r.verdict} />
                      </td>
                      <td className="px-3 py-2 whitespace-nowrap" data-testid="run-status">
                        {runStatusText[r.status] ?? r.status}
                        {r.status === "parsing" && <span className="figures text-ink-soft"> {Math.round(r.progress * 100)} %</span>}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <Pager page={q.page} pages={pages} hrefFor={(n) => `/runs${runListSearch(q, { page: n })}`} />
        </>
      )}
    </>
  );
}
