import type { Metadata } from "next";
import Link from "next/link";
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
  const all = await listBuilds(crew.crewId, { includeRetired: true });
  const rows = all.filter((b) => !b.retiredAt);
  const retired = all.filter((b) => b.retiredAt);
  const mayEdit = can(crew.role, "manageBuilds");
  return (
    <>
      <PageHeader title="Builds" lead="One record per vehicle: radio link, battery and failsafe plan." />
      {rows.length === 0 ? (
        <EmptyState title={retired.length ? "No builds in service" : "No builds recorded"}>
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
              <p className="mt-1 text-lg font-semibold">
                <Link href={`/builds/${b.id}`} className="text-tide-900 underline decoration-tide-300 underline-offset-4 hover:text-tide-700">
                  {b.name}
                </Link>
              </p>
              <p className="mt-1 text-sm text-ink-soft">
                {[b.receiver, b.bandMhz ? `${b.bandMhz} MHz` : null, [b.firmware, b.firmwareVersion].filter(Boolean).join(" ")]
                  .filter(Boolean)
                  .join(" · ") || "Radio details not filled in yet"}
              </p>
            </li>
          ))}
        </ul>
      )}
      {retired.length > 0 && (
        <section className="mt-6" aria-labelledby="retired-builds">
          <h2 id="retired-builds" className="mb-2 text-lg font-semibold">
            Retired
          </h2>
          <ul className="grid gap-1 text-sm">
            {retired.map((b) => (
              <li key={b.id}>
                <Link href={`/builds/${b.id}`} className="text-tide-700 underline">
                  {b.name}
                </Link>{" "}
                <span className="text-ink-soft">· {vehicleLabel[b.vehicleType]}</span>
              </li>
            ))}
          </ul>
        </section>
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
