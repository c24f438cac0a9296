import Link from "next/link";
import { Logo } from "@/components/ui/logo";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="grid min-h-dvh lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
      <aside className="relative hidden overflow-hidden bg-tide-900 p-10 text-tide-50 lg:flex lg:flex-col lg:justify-between">
        <Link href="/" className="text-white">
          <Logo />
        </Link>
        <div className="relative z-10 max-w-md">
          <p className="text-3xl font-semibold leading-tight text-white">Every run comes home with evidence.</p>
          <p className="mt-4 text-tide-100">
            Upload the log, and Sortie shows where the link faded, whether the failsafe did what the build&apos;s plan says,
            how far the vehicle strayed from its route and how the battery held up.
          </p>
        </div>
        <p className="relative z-10 text-sm text-tide-300">
          Review software, not an airworthiness tool. Fly and drive under your local rules.
        </p>
        <svg className="absolute -bottom-24 -right-24 h-[28rem] w-[28rem] text-tide-700" viewBox="0 0 200 200" aria-hidden="true">
          {[30, 55, 80, 105, 130].map((r) => (
            <circle key={r} cx="160" cy="160" r={r} fill="none" stroke="currentColor" strokeWidth="1.5" />
          ))}
        </svg>
      </aside>
      <main className="flex flex-col px-5 py-8 sm:px-10">
        <Link href="/" className="mb-10 text-tide-700 lg:hidden">
          <Logo />
        </Link>
        <div className="mx-auto my-auto w-full max-w-md">{children}</div>
      </main>
    </div>
  );
}
