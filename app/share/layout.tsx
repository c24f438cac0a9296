import { Logo } from "@/components/ui/logo";

/** Shared debriefs stand alone: no crew navigation, no sign-in, no links into the app. */
export default function ShareLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="min-h-dvh">
      <header className="flex items-center justify-between gap-3 bg-tide-900 px-4 py-2 text-white sm:px-8">
        <Logo className="h-6 w-auto" />
        <p className="text-sm text-tide-100">Shared debrief · read-only</p>
      </header>
      <main id="main" className="mx-auto w-full max-w-6xl px-4 py-6 sm:px-8">
        {children}
      </main>
    </div>
  );
}
