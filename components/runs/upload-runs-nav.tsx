import Link from "next/link";
import { formatSpan } from "@/lib/format/units";
import { partOf, partStart, type UploadRunLink } from "./run-parts";
import { VerdictBadge } from "./verdict-badge";

export interface UploadRunsNavProps {
  part: number;
  fileName: string;
  runs: UploadRunLink[];
}

/**
 * On a run that is one of several from one file: "Part 2 of 3 of <file>" and links to the other
 * parts with their start, duration and verdict. Nothing for a file that held one run.
 */
export function UploadRunsNav({ part, fileName, runs }: UploadRunsNavProps) {
  if (runs.length < 2) return null;
  return (
    <nav aria-label="Runs from the same file" className="mt-2 text-sm" data-testid="upload-runs-nav">
      <p>
        <span className="font-semibold">{partOf(part, runs.length)}</span> of <span className="break-all">{fileName}</span>
        <span className="text-ink-soft"> — the file holds separate runs, each with its own debrief.</span>
      </p>
      <ul className="mt-1.5 flex flex-wrap gap-2">
        {runs.map((r) => {
          const label = (
            <>
              <span className="font-medium">Part {r.part}</span>
              <span className="figures text-ink-soft">{[partStart(r.startedAt), formatSpan(r.durationS)].filter(Boolean).join(" · ")}</span>
              <VerdictBadge level={r.verdict} />
            </>
          );
          const box = "inline-flex min-h-11 flex-wrap items-center gap-x-2 gap-y-0.5 rounded-md border px-3 py-1";
          return (
            <li key={r.id}>
              {r.part === part ? (
                <span aria-current="page" className={`${box} border-tide-700 bg-tide-50`}>
                  {label}
                  <span className="sr-only">(this run)</span>
                </span>
              ) : (
                <Link href={`/runs/${r.id}`} className={`${box} border-rule hover:border-tide-700 hover:bg-tide-50`}>
                  {label}
                </Link>
              )}
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
