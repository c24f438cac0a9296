import Link from "next/link";
import type { VehicleType } from "@/db/schema/builds";
import { SafetyNote } from "@/components/ui/safety-note";
import { failsafeResultWords } from "@/lib/analysis/evidence";
import { benchCommandedWords, benchFlownWords, dayWords, dayWordsBeside } from "@/lib/builds/bench-test-facts";
import type { BenchTestView } from "@/lib/builds/bench-tests";

export interface BenchTestSectionProps {
  vehicleType: VehicleType;
  latest: BenchTestView | null;
  earlier: BenchTestView[];
  linkSheetChangedAt: Date | null;
}

/** How to make the vehicle safe before its failsafe is tested on the bench (DESIGN.md §8). */
const makeSafe: Record<VehicleType, string> = {
  ground: "with the wheels lifted clear of the ground",
  boat: "with the boat out of the water and the propeller clear",
  multirotor: "with the propellers off",
  "fixed-wing": "with the propeller off",
};

const utcTime = (d: Date) => `${d.toISOString().slice(11, 16)} UTC`;
const resultTone = (result: string) => (result === "pass" ? "text-clear" : "text-act");

function RunLink({ t }: { t: BenchTestView }) {
  if (t.runId === null) return <span className="text-ink-soft">the run was deleted; the figures are kept</span>;
  return (
    <Link href={`/runs/${t.runId}`} className="break-all text-tide-700 underline">
      {t.runTitle ?? `run ${t.runId}`}
    </Link>
  );
}

/**
 * The build page's "Failsafe bench test" section: the latest test with its result in the
 * debrief's words, a stale mark once the link sheet changed after it, earlier tests folded away,
 * and what to do when there is none. Server component; the data comes from latestBenchTest.
 */
export function BenchTestSection({ vehicleType, latest, earlier, linkSheetChangedAt }: BenchTestSectionProps) {
  return (
    <div className="grid gap-4" data-testid="bench-test">
      {latest === null ? (
        <p className="max-w-prose text-sm" data-testid="bench-test-empty">
          No failsafe bench test recorded for this build. Bench-test the failsafe {makeSafe[vehicleType]}: arm, switch the transmitter off for about ten
          seconds and back on. Then{" "}
          <Link href="/runs/upload" className="text-tide-700 underline">
            upload the log
          </Link>{" "}
          to this build, and record it from its debrief.
        </p>
      ) : (
        <>
          {latest.stale && linkSheetChangedAt && (
            <p role="status" className="rounded-md border-l-4 border-watch bg-watch/10 px-4 py-3 text-sm" data-testid="bench-test-stale">
              <strong>Stale:</strong> {`the link sheet changed on ${dayWordsBeside(linkSheetChangedAt, latest.testedAt)} after this test — test again.`}
            </p>
          )}
          <dl className="grid gap-x-6 gap-y-3 text-sm sm:grid-cols-2 lg:grid-cols-3" data-testid="bench-test-latest">
            <div>
              <dt className="text-ink-soft">Tested</dt>
              <dd className="figures mt-0.5">
                {dayWords(latest.testedAt)}, {utcTime(latest.testedAt)}
              </dd>
            </div>
            <div>
              <dt className="text-ink-soft">Result</dt>
              <dd className={`mt-0.5 font-semibold ${resultTone(latest.result)}`} data-testid="bench-test-result">
                {failsafeResultWords(latest.result)}
              </dd>
            </div>
            <div>
              <dt className="text-ink-soft">Failsafe commanded</dt>
              <dd className="mt-0.5">{benchCommandedWords(latest)}</dd>
            </div>
            <div>
              <dt className="text-ink-soft">Vehicle did</dt>
              <dd className="mt-0.5">{benchFlownWords(latest)}</dd>
            </div>
            <div>
              <dt className="text-ink-soft">Log</dt>
              <dd className="mt-0.5">
                <RunLink t={latest} />
              </dd>
            </div>
            <div>
              <dt className="text-ink-soft">Recorded</dt>
              <dd className="mt-0.5">
                {dayWords(latest.recordedAt)}
                {latest.recordedByName ? ` by ${latest.recordedByName}` : ""}
              </dd>
            </div>
            {latest.note && (
              <div className="sm:col-span-2 lg:col-span-3">
                <dt className="text-ink-soft">Note</dt>
                <dd className="mt-0.5 whitespace-pre-line">{latest.note}</dd>
              </div>
            )}
          </dl>
          {earlier.length > 0 && (
            <details className="text-sm">
              <summary className="cursor-pointer text-tide-700">Earlier bench tests ({earlier.length})</summary>
              <ul className="mt-2 grid gap-1">
                {earlier.map((t) => (
                  <li key={t.id}>
                    <span className="figures">{dayWords(t.testedAt)}</span> — <span className={resultTone(t.result)}>{failsafeResultWords(t.result)}</span>, commanded{" "}
                    {benchCommandedWords(t)} · <RunLink t={t} />
                  </li>
                ))}
              </ul>
            </details>
          )}
        </>
      )}
      <SafetyNote topic="failsafe" />
    </div>
  );
}
