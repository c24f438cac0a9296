import type { Metadata } from "next";
import { listBuilds } from "@/db/queries/builds";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { CreateBuildForm } from "./create-build-form";

export const metadata: Metadata = { title: "Builds" };

const vehicleLabel = { ground: "Ground rover", multirotor: "Multirotor", "fixed-wing": "Fixed-wing", boat: "Boat" } as const;

export default async function BuildsPage() {
  const { crew } = await getCrewPageContext();
  const rows = await listBuilds(crew.crewId);
  const mayEdit = can(crew.role, "manageBuilds");
  return (
    <>
      <PageHeader title="Builds" lead="One record per vehicle: radio link, battery and failsafe plan." />
      {rows.length === 0 ? (
        <EmptyState title="No builds recorded">
          <p>
            {mayEdit
              ? "Record each vehicle below. Runs attach to a build, so you can see whether an antenna swap or a firmware update changed anything."
              : "A crew lead records the crew's vehicles here."}
          </p>
        </EmptyState>
      ) : (
        <ul className="grid gap-3 sm:grid-cols-2">
          {rows.map((b) => (
            <li key={b.id} className="panel">
              <p className="text-xs font-semibold uppercase tracking-wider text-signal-700">{vehicleLabel[b.vehicleType]}</p>
              <p className="mt-1 text-lg font-semibold">{b.name}</p>
              <p className="mt-1 text-sm text-ink-soft">
                {[b.receiver, b.bandMhz ? `${b.bandMhz} MHz` : null, [b.firmware, b.firmwareVersion].filter(Boolean).join(" ")]
                  .filter(Boolean)
                  .join(" · ") || "Radio details not filled in yet"}
              </p>
            </li>
          ))}
        </ul>
      )}
      {mayEdit && (
        <section className="panel mt-6" aria-labelledby="new-build">
          <h2 id="new-build" className="mb-4 text-lg font-semibold">
            Record a build
          </h2>
          <CreateBuildForm crewId={crew.crewId} />
        </section>
      )}
    </>
  );
}
