import { SafetyNote } from "@/components/ui/safety-note";
import { failsafeNotAssessed } from "@/lib/analysis/evidence";
import type { RunSummary } from "./summary-figures";

/**
 * The cautions under a ready debrief: failsafe and battery ones when the run exercised them. A
 * bench run carries its bench caution at the top (BenchNotice) instead of the failsafe one here.
 */
export function RunCautions({ summary }: { summary: RunSummary }) {
  const failsafeExercised = summary.failsafe && !failsafeNotAssessed(summary.failsafe.result) && !summary.bench;
  return (
    <section className="mt-6 grid gap-3 md:grid-cols-2" aria-label="Cautions">
      {failsafeExercised && <SafetyNote topic="failsafe" />}
      {summary.power?.minCellV != null && <SafetyNote topic="battery" />}
      <SafetyNote topic="general" />
    </section>
  );
}
