import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { listBuilds } from "@/db/queries/builds";
import { listRoutePlans } from "@/db/queries/route-plans";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { listColumnMaps } from "@/lib/ingest/column-maps";
import { UploadForm } from "./upload-form";

export const metadata: Metadata = { title: "Upload logs" };

export default async function UploadPage() {
  const { actor, crew } = await getCrewPageContext();
  if (!can(crew.role, "uploadLog")) redirect("/runs");
  const [builds, routePlans, columnMaps] = await Promise.all([
    listBuilds(crew.crewId),
    listRoutePlans(crew.crewId),
    listColumnMaps(actor, crew.crewId),
  ]);
  return (
    <>
      <PageHeader title="Upload logs" lead={`Into ${crew.name}. Pick one or more files; each becomes a run, or several when one file holds several runs.`} />
      <UploadForm
        crewId={crew.crewId}
        maxBytes={env().UPLOAD_MAX_BYTES}
        builds={builds.map((b) => ({ id: b.id, name: b.name }))}
        routePlans={routePlans.map((r) => ({ id: r.id, name: r.name }))}
        columnMaps={columnMaps.map((m) => ({ id: m.id, name: m.name }))}
      />
    </>
  );
}
