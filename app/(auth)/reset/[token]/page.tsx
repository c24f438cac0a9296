import type { Metadata } from "next";
import Link from "next/link";
import { resetLinkUsable } from "@/lib/accounts/password-reset";
import { ResetForm } from "./reset-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const usable = await resetLinkUsable(decodeURIComponent(token));
  if (!usable) {
    return (
      <>
        <h1 className="text-2xl font-bold">This link no longer works</h1>
        <p className="mt-2 text-ink-soft">Reset links work once and for one hour. Ask for a fresh one.</p>
        <Link href="/forgot" className="btn-primary mt-6">
          Send a new link
        </Link>
      </>
    );
  }
  return (
    <>
      <h1 className="text-2xl font-bold">Choose a new password</h1>
      <ResetForm token={decodeURIComponent(token)} />
    </>
  );
}
