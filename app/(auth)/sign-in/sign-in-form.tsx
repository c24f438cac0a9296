"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";

const messages: Record<string, string> = {
  CredentialsSignin: "That e-mail and password do not match an account.",
  RateLimited: "Too many failed attempts for this account. Wait a while before trying again, or reset the password.",
};

export function SignInForm({ callbackUrl, notice }: { callbackUrl: string; notice?: string }) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    setPending(true);
    setError(null);
    const res = await signIn("credentials", {
      redirect: false,
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      callbackUrl,
    });
    if (!res || res.error) {
      setPending(false);
      setError(messages[res?.error ?? ""] ?? "Sign-in failed; try again.");
      return;
    }
    router.replace(callbackUrl);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="mt-6 space-y-4" noValidate>
      {notice && <FormMessage state={{ status: "ok", message: notice }} />}
      <Field name="email" label="E-mail" type="email" autoComplete="email" required autoFocus />
      <Field name="password" label="Password" type="password" autoComplete="current-password" required />
      <FormMessage state={{ status: "error", message: error ?? undefined }} />
      <div className="flex items-center justify-between gap-4">
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Signing in…" : "Sign in"}
        </button>
        <Link href="/forgot" className="text-sm text-tide-700 underline">
          Forgot the password?
        </Link>
      </div>
    </form>
  );
}
