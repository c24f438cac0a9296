import type { Metadata } from "next";
import { listRoutePlans } from "@/db/queries/route-plans";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";

export const metadata: Metadata = { title: "Route plans" };

export default async function RoutesPage() {
  const { crew } = await getCrewPageContext();
  const rows = await listRoutePlans(crew.crewId);
  return (
    <>
      <PageHeader title="Route plans" lead="Planned waypoints that runs are measured against." />
      {rows.length === 0 ? (
        <EmptyState title="No route plans yet">
          <p>
            Pilots and leads add route plans from a GPX route or waypoint list, or as JSON waypoints through the API
            (<code className="figures">POST /api/route-plans</code>, see the README).
          </p>
        </EmptyState>
      ) : (
        <ul className="divide-y divide-rule rounded-lg border border-rule bg-card">
          {rows.map((r) => (
            <li key={r.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
              <span className="font-medium">{r.name}</span>
              <span className="text-sm text-ink-soft">
                <span className="figures">{r.waypointCount}</span> waypoints · {r.vehicleClass === "air" ? "air" : "ground"} ·{" "}
                {r.source === "gpx" ? "from a GPX file" : r.source === "drawn" ? "drawn on the map" : "typed in"}
              </span>
            </li>
          ))}
        </ul>
      )}
    </>
  );
}
