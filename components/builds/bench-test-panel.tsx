import Link from "next/link";
import { SafetyNote } from "@/components/ui/safety-note";
import { failsafeResultWords } from "@/lib/analysis/evidence";
import { getPageContext } from "@/lib/auth/page-context";
import { benchCommandedWords, benchFlownWords, dayWords } from "@/lib/builds/bench-test-facts";
import { benchTestOffer } from "@/lib/builds/bench-tests";
import { RecordBenchTestForm } from "./record-bench-test-form";

/**
 * On a bench run's debrief (a ready run whose log had no usable fix, attached to a build): leads
 * record it as the build's failsafe bench test; once recorded, everyone sees that it was, and
 * whether the link sheet changed since. Renders nothing for other runs.
 */
export async function BenchTestPanel({ runId }: { runId: number }) {
  const { actor } = await getPageContext();
  const offer = await benchTestOffer(actor, runId);
  if (!offer || (!offer.recorded && !offer.mayRecord)) return null;
  const { build, recorded, facts } = offer;
  const buildLink = (
    <Link href={`/builds/${build.id}#bench-test`} className="text-tide-700 underline">
      {build.name}
    </Link>
  );
  return (
    <section className="panel mt-6" aria-labelledby="bench-test-title" data-testid="bench-test-panel">
      <h2 id="bench-test-title" className="text-lg font-semibold">
        Failsafe bench test
      </h2>
      {recorded ? (
        <div className="mt-2 grid gap-2 text-sm">
          <p data-testid="bench-test-recorded">
            Recorded as the failsafe bench test of {buildLink} on {dayWords(recorded.recordedAt)}
            {recorded.recordedByName ? ` by ${recorded.recordedByName}` : ""}: <strong>{failsafeResultWords(recorded.result)}</strong>.
          </p>
          {recorded.stale && (
            <p role="status" className="rounded-md border-l-4 border-watch bg-watch/10 px-4 py-2">
              <strong>Stale:</strong> the build&apos;s link sheet changed after this test — test again.
            </p>
          )}
        </div>
      ) : facts ? (
        <div className="mt-2 grid gap-3 text-sm">
          <p className="max-w-prose">
            This log has no usable GPS fix, so it was read as a bench test: <strong>{failsafeResultWords(facts.result)}</strong>; failsafe commanded{" "}
            {benchCommandedWords(facts)}; the vehicle did: {benchFlownWords(facts)}. Record it on {buildLink} so the build page and the pre-run checklist show it.
          </p>
          <RecordBenchTestForm runId={offer.runId} buildId={build.id} buildName={build.name} />
        </div>
      ) : (
        <p className="mt-2 max-w-prose text-sm" data-testid="bench-test-problem">
          {offer.problem}
        </p>
      )}
      <div className="mt-3">
        <SafetyNote topic="failsafe" />
      </div>
    </section>
  );
}
