import type { Metadata } from "next";
import Link from "next/link";
import { SignUpForm } from "./sign-up-form";

export const metadata: Metadata = { title: "Start a crew" };

export default function SignUpPage() {
  return (
    <>
      <h1 className="text-2xl font-bold">Start a crew</h1>
      <p className="mt-1 text-ink-soft">
        You will lead the new crew and can invite pilots and observers. Already have an account?{" "}
        <Link className="font-medium text-tide-700 underline" href="/sign-in">
          Sign in
        </Link>
      </p>
      <SignUpForm />
    </>
  );
}
