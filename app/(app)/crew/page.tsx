import type { Metadata } from "next";
import Link from "next/link";
import { listMembers, listPendingInvitations } from "@/db/queries/crews";
import { PageHeader } from "@/components/ui/page-header";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { can } from "@/lib/auth/roles";
import { InviteForm } from "./invite-form";
import { MemberRow } from "./member-row";
import { RenameCrewForm } from "./rename-crew-form";
import { RevokeInvitationButton } from "./revoke-invitation-button";

export const metadata: Metadata = { title: "Crew" };

export default async function CrewPage() {
  const { actor, crew } = await getCrewPageContext();
  const lead = can(crew.role, "manageMembers");
  const [members, invitations] = await Promise.all([listMembers(crew.crewId), lead ? listPendingInvitations(crew.crewId) : Promise.resolve([])]);
  return (
    <>
      <PageHeader title={crew.name} lead="Leads manage members, builds and thresholds and sign off debriefs; pilots upload and annotate runs; observers read.">
        {lead && (
          <Link href="/crew/audit" className="btn-quiet">
            Audit log
          </Link>
        )}
      </PageHeader>
      <section aria-labelledby="members" className="rounded-lg border border-rule bg-card">
        <h2 id="members" className="border-b border-rule px-4 py-3 text-lg font-semibold">
          Members <span className="figures text-ink-soft">({members.length})</span>
        </h2>
        <ul className="divide-y divide-rule">
          {members.map((m) => (
            <MemberRow key={m.userId} crewId={crew.crewId} member={m} editable={lead} isSelf={m.userId === actor.user.id} />
          ))}
        </ul>
      </section>

      {lead && (
        <>
          <section aria-labelledby="pending" className="mt-6 rounded-lg border border-rule bg-card">
            <h2 id="pending" className="border-b border-rule px-4 py-3 text-lg font-semibold">
              Pending invitations
            </h2>
            {invitations.length === 0 ? (
              <p className="px-4 py-3 text-ink-soft">None open. Invitations you send appear here until they are accepted or expire.</p>
            ) : (
              <ul className="divide-y divide-rule">
                {invitations.map((i) => (
                  <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
                    <span>
                      <span className="font-medium">{i.email}</span> <span className="text-ink-soft">as {i.role}</span>
                    </span>
                    <span className="flex items-center gap-3 text-sm text-ink-soft">
                      expires <span className="figures">{i.expiresAt.toISOString().slice(0, 10)}</span>
                      <RevokeInvitationButton invitationId={i.id} />
                    </span>
                  </li>
                ))}
              </ul>
            )}
          </section>
          <section aria-labelledby="invite" className="panel mt-6">
            <h2 id="invite" className="mb-4 text-lg font-semibold">
              Invite someone
            </h2>
            <InviteForm crewId={crew.crewId} />
          </section>
          <section aria-labelledby="rename" className="panel mt-6">
            <h2 id="rename" className="mb-4 text-lg font-semibold">
              Crew name
            </h2>
            <RenameCrewForm crewId={crew.crewId} name={crew.name} />
          </section>
        </>
      )}
    </>
  );
}
