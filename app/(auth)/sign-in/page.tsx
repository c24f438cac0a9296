import type { Metadata } from "next";
import Link from "next/link";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

/** Only paths of this site: an open redirect after sign-in is a phishing aid. */
function safeCallback(raw: string | string[] | undefined): string {
  const v = Array.isArray(raw) ? raw[0] : raw;
  if (!v) return "/dashboard";
  const base = new URL("http://sortie.invalid");
  try {
    const u = new URL(v, base);
    return u.origin === base.origin ? u.pathname + u.search : "/dashboard";
  } catch {
    return "/dashboard";
  }
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const sp = await searchParams;
  return (
    <>
      <h1 className="text-2xl font-bold">Sign in</h1>
      <p className="mt-1 text-ink-soft">
        New to Sortie?{" "}
        <Link className="font-medium text-tide-700 underline" href="/sign-up">
          Start a crew
        </Link>
      </p>
      <SignInForm callbackUrl={safeCallback(sp.callbackUrl)} notice={sp.reset === "1" ? "Password changed. Sign in with the new one." : undefined} />
    </>
  );
}
