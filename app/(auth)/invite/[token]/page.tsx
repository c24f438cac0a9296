import type { Metadata } from "next";
import Link from "next/link";
import { getActor } from "@/lib/auth/actor";
import { describeInvitation } from "@/lib/crews/invitations";
import { AcceptForm } from "./accept-form";

export const metadata: Metadata = { title: "Invitation" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const token = decodeURIComponent((await params).token);
  const [inv, actor] = await Promise.all([describeInvitation(token), getActor()]);

  if (inv.state === "spent") {
    return (
      <>
        <h1 className="text-2xl font-bold">This invitation no longer works</h1>
        <p className="mt-2 text-ink-soft">
          Invitations work once and for seven days, and a lead can withdraw them. Ask the crew&apos;s lead to send a new one.
        </p>
        <Link href="/sign-in" className="btn-quiet mt-6">
          Go to sign-in
        </Link>
      </>
    );
  }

  const heading = (
    <>
      <p className="text-sm font-semibold uppercase tracking-wider text-signal-700">Invitation</p>
      <h1 className="mt-1 text-2xl font-bold">{`Join ${inv.crewName}`}</h1>
      <p className="mt-2 text-ink-soft">
        You are invited as <b className="text-ink">{inv.role}</b> for <b className="text-ink">{inv.email}</b>.
      </p>
    </>
  );

  if (actor && actor.user.email !== inv.email) {
    return (
      <>
        {heading}
        <p className="mt-4 rounded-md bg-signal-100 px-3 py-2 text-signal-700">
          You are signed in as {actor.user.email}. Sign out, then open this link again and sign in as {inv.email}.
        </p>
        <Link href="/api/auth/signout" className="btn-quiet mt-6">
          Sign out
        </Link>
      </>
    );
  }
  if (!actor && inv.accountExists) {
    return (
      <>
        {heading}
        <p className="mt-4 text-ink-soft">That address already has a Sortie account. Sign in and you will come back here to accept.</p>
        <Link href={`/sign-in?callbackUrl=${encodeURIComponent(`/invite/${encodeURIComponent(token)}`)}`} className="btn-primary mt-6">
          Sign in to accept
        </Link>
      </>
    );
  }
  return (
    <>
      {heading}
      <AcceptForm token={token} signedIn={!!actor} />
    </>
  );
}
