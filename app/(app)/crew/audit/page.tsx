import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { listAuditActions, listAuditPage, readAuditQuery, type AuditQuery } from "@/db/queries/audit";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { Pager } from "@/components/ui/pager";

export const metadata: Metadata = { title: "Audit log" };

const when = (d: Date) => d.toISOString().slice(0, 19).replace("T", " ");

function search(q: AuditQuery, page: number): string {
  const p = new URLSearchParams();
  if (q.action) p.set("action", q.action);
  if (page > 1) p.set("page", String(page));
  const s = p.toString();
  return s ? `?${s}` : "";
}

/** Short, readable detail: the fields an entry carries, never the whole JSON blob. */
function detailText(detail: Record<string, unknown> | null): string {
  if (!detail) return "";
  return Object.entries(detail)
    .filter(([, v]) => v !== null && v !== undefined && typeof v !== "object")
    .map(([k, v]) => `${k}: ${String(v)}`)
    .join(", ")
    .slice(0, 200);
}

/** The crew's audit log, for its leads only (ASVS V7.3.3: logs are not shown to everyone). */
export default async function CrewAuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { crew } = await getCrewPageContext();
  // Not a lead: the page does not exist for them, as with other crews' records.
  if (!can(crew.role, "manageMembers")) notFound();
  const q = readAuditQuery(await searchParams);
  const [{ entries, total, pages }, actions] = await Promise.all([listAuditPage(crew.crewId, q), listAuditActions(crew.crewId)]);

  return (
    <>
      <PageHeader title="Audit log" lead={`Sign-ins, role changes, deletions, share links, exports and sign-offs in ${crew.name}, newest first.`}>
        <Link href="/crew" className="btn-quiet">
          ← Crew
        </Link>
      </PageHeader>
      <form method="get" action="/crew/audit" className="panel mb-4 flex flex-wrap items-end gap-3" aria-label="Filter the audit log">
        <label className="text-sm">
          <span className="field-label">Action</span>
          <select name="action" defaultValue={q.action ?? ""} className="field-input" data-testid="audit-action">
            <option value="">Any</option>
            {actions.map((a) => (
              <option key={a} value={a}>
                {a}
              </option>
            ))}
          </select>
        </label>
        <button type="submit" className="btn-primary">
          Filter
        </button>
      </form>
      <p className="mb-2 text-sm text-ink-soft" role="status">
        {total === 0 ? "No entries." : `${total.toLocaleString("en")} entr${total === 1 ? "y" : "ies"}${pages > 1 ? `, page ${q.page} of ${pages}` : ""}`}
      </p>
      {entries.length > 0 && (
        <div className="overflow-x-auto rounded-lg border border-rule bg-card">
          <table className="w-full text-left text-sm" data-testid="audit-table">
            <thead className="border-b border-rule text-ink-soft">
              <tr>
                <th scope="col" className="px-3 py-2 font-medium">When (UTC)</th>
                <th scope="col" className="px-3 py-2 font-medium">Action</th>
                <th scope="col" className="px-3 py-2 font-medium">Who</th>
                <th scope="col" className="px-3 py-2 font-medium">Target</th>
                <th scope="col" className="px-3 py-2 font-medium">Detail</th>
                <th scope="col" className="px-3 py-2 font-medium">Address</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-rule">
              {entries.map((e) => (
                <tr key={e.id}>
                  <td className="figures whitespace-nowrap px-3 py-2">{when(e.createdAt)}</td>
                  <td className="px-3 py-2 font-medium">{e.action}</td>
                  <td className="px-3 py-2">{e.actorName ?? (e.actorId ? "(deleted account)" : "—")}</td>
                  <td className="px-3 py-2">{e.targetType ? `${e.targetType} ${e.targetId ?? ""}` : "—"}</td>
                  <td className="px-3 py-2 text-ink-soft">{detailText(e.detail)}</td>
                  <td className="figures px-3 py-2 text-ink-soft">{e.ip ?? ""}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <Pager page={q.page} pages={pages} hrefFor={(n) => `/crew/audit${search(q, n)}`} />
    </>
  );
}
