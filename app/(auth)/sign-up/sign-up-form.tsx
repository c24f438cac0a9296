"use client";

import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useActionState, useEffect, useRef, useState } from "react";
import { Field } from "@/components/ui/field";
import { FormMessage } from "@/components/ui/form-message";
import { SubmitButton } from "@/components/ui/submit-button";
import type { FormState } from "@/lib/actions/form-state";
import { signUpAction } from "./actions";

export function SignUpForm() {
  const router = useRouter();
  const password = useRef<HTMLInputElement>(null);
  // React resets the form after the action, so the password is kept from the submit event.
  const typedPassword = useRef("");
  const [signInError, setSignInError] = useState<string | null>(null);
  const [state, action] = useActionState(signUpAction, { status: "idle" } as FormState<{ email: string }>);

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

  const v = state.values ?? {};
  return (
    <form action={action} onSubmit={() => (typedPassword.current = password.current?.value ?? "")} className="mt-6 space-y-4" noValidate>
      <Field name="name" label="Your name" autoComplete="name" defaultValue={v.name} errors={state.errors?.name} required />
      <Field name="email" label="E-mail" type="email" autoComplete="email" defaultValue={v.email} errors={state.errors?.email} required />
      <Field
        ref={password}
        name="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A short sentence works well."
        errors={state.errors?.password}
        required
      />
      <Field
        name="crewName"
        label="Crew name"
        placeholder="e.g. Harbour Rover Club"
        defaultValue={v.crewName}
        errors={state.errors?.crewName}
        required
      />
      <FormMessage state={signInError ? { status: "error", message: signInError } : state} />
      <SubmitButton pendingLabel="Creating…">Create account and crew</SubmitButton>
    </form>
  );
}
