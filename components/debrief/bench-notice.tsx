import { SafetyNote } from "@/components/ui/safety-note";
import { BENCH_WORDS } from "@/lib/analysis/evidence";

/** At the top of a bench run's debrief (summary.bench): what the layout leaves out, and the bench caution. */
export function BenchNotice({ linkLost }: { linkLost: boolean }) {
  return (
    <section aria-labelledby="bench-title" data-testid="bench-notice" className="mb-4 rounded-lg border border-rule bg-card p-4">
      <h2 id="bench-title" className="text-lg font-semibold">
        {BENCH_WORDS.title}
      </h2>
      <p className="mt-1 max-w-prose text-sm">{BENCH_WORDS.body}</p>
      {linkLost && <p className="mt-1 max-w-prose text-sm">{BENCH_WORDS.loss}</p>}
      <div className="mt-3">
        <SafetyNote topic="bench" />
      </div>
    </section>
  );
}
