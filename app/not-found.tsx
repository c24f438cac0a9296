import Link from "next/link";
import { Logo } from "@/components/ui/logo";

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col items-center justify-center px-6 text-center">
      <span className="text-tide-700">
        <Logo />
      </span>
      <h1 className="mt-8 text-2xl font-bold">Nothing here</h1>
      <p className="mt-2 text-ink-soft">The page does not exist, or it belongs to a crew you are not in.</p>
      <Link href="/dashboard" className="btn-primary mt-6">
        Back to the overview
      </Link>
    </main>
  );
}
