import type { Units } from "@/lib/format/units";
import { summaryFigures, type RunSummary } from "./figure-list";

export type { RunSummary } from "./figure-list";

const toneBorder = { act: "border-act/60", watch: "border-watch/60", muted: "border-dashed" } as const;

/** The debrief's headline figures, in the reader's units, each with its unit, its source and what it means. */
export function SummaryFigures({ summary, units }: { summary: RunSummary; units: Units }) {
  const figures = summaryFigures(summary, units);
  return (
    <dl className="grid grid-cols-2 gap-3 md:grid-cols-3 xl:grid-cols-5" data-testid="summary-figures">
      {figures.map((fig) => (
        // A figure with lines of evidence (source, commanded and flown) gets two columns where columns are narrow.
        <div
          key={fig.label}
          className={`panel min-w-0 p-3 sm:p-4 ${fig.detail?.length ? "col-span-2 md:col-span-1 xl:col-span-2" : ""} ${fig.tone ? toneBorder[fig.tone] : ""}`}
          data-figure={fig.label}
        >
          <dt className="text-sm text-ink-soft">{fig.label}</dt>
          <dd className={`figures mt-1 text-lg leading-tight ${fig.tone === "muted" ? "text-ink-soft" : ""}`}>{fig.value}</dd>
          {fig.sub && <dd className="mt-1 text-xs break-words text-ink-soft">{fig.sub}</dd>}
          {fig.detail?.map((d) => (
            <dd key={d} className="mt-1 text-xs break-words text-ink-soft">
              {d}
            </dd>
          ))}
        </div>
      ))}
    </dl>
  );
}
