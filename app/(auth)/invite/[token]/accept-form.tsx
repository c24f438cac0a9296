"use client";

import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useActionState, useEffect, useRef, useState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/form-state";
import { acceptInvitationAction } from "./actions";

export function AcceptForm({ token, signedIn }: { token: string; signedIn: boolean }) {
  const router = useRouter();
  const password = useRef<HTMLInputElement>(null);
  // React resets the form after the action, so the password is kept from the submit event.
  const typedPassword = useRef("");
  const [signInError, setSignInError] = useState<string | null>(null);
  const [state, action] = useActionState(acceptInvitationAction, { status: "idle" } as FormState<{ email: string }>);

  useEffect(() => {
    if (state.status !== "ok" || !state.result) return;
    void signIn("credentials", { redirect: false, email: state.result.email, password: typedPassword.current }).then((res) => {
      if (!res || res.error) {
        setSignInError("Your account is ready, but signing in failed. Sign in with your e-mail and password.");
        return;
      }
      router.replace("/dashboard");
      router.refresh();
    });
  }, [state, router]);

  return (
    <form action={action} onSubmit={() => (typedPassword.current = password.current?.value ?? "")} className="mt-6 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      {!signedIn && (
        <>
          <Field name="name" label="Your name" autoComplete="name" defaultValue={state.values?.name} errors={state.errors?.name} required />
          <Field ref={password} name="password" label="Choose a password" type="password" autoComplete="new-password" hint="At least 10 characters." errors={state.errors?.password} required />
        </>
      )}
      <FormMessage state={signInError ? { status: "error", message: signInError } : state} />
      <SubmitButton pendingLabel="Joining…">{signedIn ? "Join the crew" : "Create account and join"}</SubmitButton>
    </form>
  );
}
