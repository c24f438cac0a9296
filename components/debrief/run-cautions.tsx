import { SafetyNote } from "@/components/ui/safety-note";
import type { RunSummary } from "./summary-figures";

/** The cautions under a ready debrief: failsafe and battery ones when the run exercised them. */
export function RunCautions({ summary }: { summary: RunSummary }) {
  const failsafeExercised = summary.failsafe && summary.failsafe.result !== "not-tested";
  return (
    <section className="mt-6 grid gap-3 md:grid-cols-2" aria-label="Cautions">
      {failsafeExercised && <SafetyNote topic="failsafe" />}
      {summary.power?.minCellV != null && <SafetyNote topic="battery" />}
      <SafetyNote topic="general" />
    </section>
  );
}
