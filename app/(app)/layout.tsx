import Link from "next/link";
import { AppNav } from "@/components/app-nav";
import { CrewSwitcher } from "@/components/crew-switcher";
import { SignOutButton } from "@/components/sign-out-button";
import { Logo } from "@/components/ui/logo";
import { getPageContext } from "@/lib/auth/page-context";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const { actor, crew, crews } = await getPageContext();
  const crewBlock = crew ? <CrewSwitcher crews={crews} activeCrewId={crew.crewId} /> : null;
  return (
    <div className="min-h-dvh lg:grid lg:grid-cols-[16rem_minmax(0,1fr)]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:p-2">
        Skip to content
      </a>
      <aside className="hidden bg-tide-900 text-tide-50 lg:flex lg:flex-col lg:gap-6 lg:p-4">
        <Link href="/dashboard" className="px-2 pt-2 text-white">
          <Logo />
        </Link>
        {crew && (
          <div className="rounded-md bg-tide-700/50 p-3">
            <p className="mb-1 text-xs uppercase tracking-wider text-tide-300">Crew</p>
            {crewBlock}
            <p className="mt-1 text-xs text-tide-300">You are {crew.role}</p>
          </div>
        )}
        <AppNav orientation="vertical" />
        <div className="mt-auto border-t border-tide-700 px-2 pt-4 text-sm">
          <p className="truncate font-medium text-white">{actor.user.name}</p>
          <p className="truncate text-tide-300">{actor.user.email}</p>
          <SignOutButton className="text-tide-100" />
        </div>
      </aside>
      <div className="lg:hidden">
        <header className="flex items-center justify-between gap-3 bg-tide-900 px-4 py-2 text-white">
          <Link href="/dashboard">
            <Logo className="h-6 w-auto" />
          </Link>
          <div className="min-w-0 max-w-[55%] text-right">{crewBlock}</div>
        </header>
        <div className="bg-tide-900 pt-1">
          <AppNav orientation="horizontal" />
        </div>
      </div>
      <main id="main" className="mx-auto w-full max-w-6xl px-4 py-6 sm:px-8">
        {children}
      </main>
    </div>
  );
}
