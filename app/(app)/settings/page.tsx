import type { Metadata } from "next";
import Link from "next/link";
import { SignOutButton } from "@/components/sign-out-button";
import { PageHeader } from "@/components/ui/page-header";
import { getPageContext } from "@/lib/auth/page-context";
import { CreateCrewForm } from "./create-crew-form";
import { ProfileForm } from "./profile-form";

export const metadata: Metadata = { title: "Settings" };

export default async function SettingsPage({ searchParams }: { searchParams: Promise<{ nocrew?: string }> }) {
  const { actor, crews } = await getPageContext();
  const { nocrew } = await searchParams;
  return (
    <>
      <PageHeader title="Settings" lead={`Signed in as ${actor.user.email}.`}>
        <SignOutButton className="btn-quiet no-underline" />
      </PageHeader>
      {(nocrew || crews.length === 0) && (
        <p className="mb-6 rounded-md bg-signal-100 px-4 py-3 text-signal-700">
          You are not in any crew yet. Start one below, or open an invitation link from a crew lead.
        </p>
      )}
      <section className="panel" aria-labelledby="profile">
        <h2 id="profile" className="mb-4 text-lg font-semibold">
          Profile
        </h2>
        <ProfileForm user={actor.user} />
      </section>
      <section className="panel mt-6" aria-labelledby="crews">
        <h2 id="crews" className="text-lg font-semibold">
          Your crews
        </h2>
        <ul className="my-3 space-y-1">
          {crews.map((c) => (
            <li key={c.crewId}>
              {c.name} <span className="text-ink-soft">— {c.role}</span>
            </li>
          ))}
        </ul>
        <CreateCrewForm />
      </section>
      <section className="panel mt-6" aria-labelledby="tokens">
        <h2 id="tokens" className="text-lg font-semibold">
          API tokens
        </h2>
        <p className="mt-1 text-ink-soft">Let a field laptop or a script upload logs in your name.</p>
        <Link href="/settings/tokens" className="btn-quiet mt-3">
          Manage API tokens
        </Link>
      </section>
    </>
  );
}
