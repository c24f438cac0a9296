import type { Metadata } from "next";
import Link from "next/link";
import { getCrewOverview } from "@/db/queries/overview";
import { runStatusText } from "@/components/runs/run-status-text";
import { PageHeader } from "@/components/ui/page-header";
import { SafetyNote } from "@/components/ui/safety-note";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Overview" };

export default async function DashboardPage() {
  const { actor, crew } = await getCrewPageContext();
  const o = await getCrewOverview(crew.crewId);
  const tiles = [
    { label: "Runs", value: o.runCount, href: "/runs" },
    { label: "Builds", value: o.buildCount, href: "/builds" },
    { label: "Route plans", value: o.routePlanCount, href: "/routes" },
    { label: "Crew members", value: o.memberCount, href: "/crew" },
  ];
  const steps = [
    { done: o.buildCount > 0, text: "Record a build", href: "/builds", who: can(crew.role, "manageBuilds") },
    { done: o.routePlanCount > 0, text: "Add a route plan", href: "/routes", who: can(crew.role, "manageRoutePlans") },
    { done: o.memberCount > 1, text: "Invite your pilots and observers", href: "/crew", who: can(crew.role, "manageMembers") },
    { done: o.runCount > 0, text: "Upload the log of a run", href: "/runs/upload", who: can(crew.role, "uploadLog") },
  ].filter((s) => s.who);
  const open = steps.filter((s) => !s.done);

  return (
    <>
      <PageHeader title={`Hello, ${actor.user.name.split(" ")[0]}`} lead={`${crew.name} — you are ${crew.role} in this crew.`} />
      <section aria-label="Crew at a glance" className="grid grid-cols-2 gap-3 md:grid-cols-4">
        {tiles.map((t) => (
          <Link key={t.label} href={t.href} className="panel group hover:border-tide-500">
            <p className="text-sm text-ink-soft">{t.label}</p>
            <p className="figures mt-1 text-3xl font-medium text-tide-900 group-hover:text-tide-700">{t.value}</p>
          </Link>
        ))}
      </section>

      {open.length > 0 && (
        <section className="panel mt-6" aria-labelledby="next-steps">
          <h2 id="next-steps" className="text-lg font-semibold">
            Next steps
          </h2>
          <ol className="mt-3 space-y-2">
            {steps.map((s) => (
              <li key={s.text} className="flex items-center gap-3">
                <span
                  aria-hidden="true"
                  className={`flex h-6 w-6 items-center justify-center rounded-full border text-xs ${s.done ? "border-clear bg-clear text-white" : "border-rule"}`}
                >
                  {s.done ? "✓" : ""}
                </span>
                <span className="sr-only">{s.done ? "Done:" : "To do:"}</span>
                <Link href={s.href} className={s.done ? "text-ink-soft line-through" : "text-tide-700 underline"}>
                  {s.text}
                </Link>
              </li>
            ))}
          </ol>
        </section>
      )}

      <section className="panel mt-6" aria-labelledby="recent">
        <h2 id="recent" className="text-lg font-semibold">
          Latest runs
        </h2>
        {o.recentRuns.length === 0 ? (
          <p className="mt-2 text-ink-soft">No runs yet. After the next run, upload its log and the debrief appears here.</p>
        ) : (
          <ul className="mt-3 divide-y divide-rule">
            {o.recentRuns.map((r) => (
              <li key={r.id} className="flex items-center justify-between py-2">
                <Link href={`/runs/${r.id}`} className="font-medium text-tide-700 underline">
                  {r.title}
                </Link>
                <span className="text-sm text-ink-soft">{r.verdict ?? runStatusText[r.status] ?? r.status}</span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <div className="mt-6">
        <SafetyNote />
      </div>
    </>
  );
}
