import type { Metadata } from "next";
import Link from "next/link";
import { ForgotForm } from "./forgot-form";

export const metadata: Metadata = { title: "Reset password" };

export default function ForgotPage() {
  return (
    <>
      <h1 className="text-2xl font-bold">Reset the password</h1>
      <p className="mt-1 text-ink-soft">We will e-mail a link that lets you choose a new one.</p>
      <ForgotForm />
      <p className="mt-6 text-sm">
        <Link href="/sign-in" className="text-tide-700 underline">
          Back to sign-in
        </Link>
      </p>
    </>
  );
}
