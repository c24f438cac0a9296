import type { Metadata } from "next";
import { listRuns } from "@/db/queries/overview";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";

export const metadata: Metadata = { title: "Runs" };

export default async function RunsPage() {
  const { crew } = await getCrewPageContext();
  const rows = await listRuns(crew.crewId);
  return (
    <>
      <PageHeader title="Runs" lead="Each uploaded log becomes a run with its debrief." />
      {rows.length === 0 ? (
        <EmptyState title="No runs yet" action={{ href: "/settings/tokens", label: "Set up uploads from a laptop" }}>
          <p>
            After a run, upload the vehicle&apos;s log (CSV telemetry, GPX or NMEA 0183). A field laptop can upload with a
            personal API token.
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
                  <td className="px-3 py-2 font-medium">{r.title}</td>
                  <td className="figures px-3 py-2">{r.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                  <td className="px-3 py-2">{r.status}</td>
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
