import type { Metadata } from "next";
import Link from "next/link";
import { listRuns } from "@/db/queries/overview";
import { runStatusText } from "@/components/runs/run-status-text";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Runs" };

export default async function RunsPage() {
  const { crew } = await getCrewPageContext();
  const rows = await listRuns(crew.crewId);
  const mayUpload = can(crew.role, "uploadLog");
  return (
    <>
      <PageHeader title="Runs" lead="Each uploaded log becomes a run with its debrief.">
        {mayUpload && (
          <Link href="/runs/upload" className="btn-primary">
            Upload logs
          </Link>
        )}
      </PageHeader>
      {rows.length === 0 ? (
        <EmptyState title="No runs yet" action={mayUpload ? { href: "/runs/upload", label: "Upload the first log" } : undefined}>
          <p>
            After a run, upload the vehicle&apos;s log (CSV telemetry, GPX or NMEA 0183). A field laptop can also upload with a
            personal API token (Settings → API tokens).
          </p>
        </EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-rule bg-card">
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule bg-tide-50 text-ink-soft">
              <tr>
                <th className="px-3 py-2 font-medium">Run</th>
                <th className="px-3 py-2 font-medium">Uploaded</th>
                <th className="px-3 py-2 font-medium">Status</th>
                <th className="px-3 py-2 font-medium">Verdict</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {rows.map((r) => (
                <tr key={r.id}>
                  <td className="px-3 py-2 font-medium">
                    <Link href={`/runs/${r.id}`} className="text-tide-700 underline">
                      {r.title}
                    </Link>
                  </td>
                  <td className="figures px-3 py-2">{r.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                  <td className="px-3 py-2">{runStatusText[r.status] ?? r.status}</td>
                  <td className="px-3 py-2">{r.verdict ?? "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
