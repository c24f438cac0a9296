import type { Units } from "@/lib/format/units";
import { summaryFigures, type RunSummary } from "./figure-list";

export type { RunSummary } from "./figure-list";

/** The debrief's headline figures, in the reader's units, each with its unit and what it means. */
export function SummaryFigures({ summary, units }: { summary: RunSummary; units: Units }) {
  const figures = summaryFigures(summary, units);
  return (
    <dl className="grid grid-cols-2 gap-3 md:grid-cols-3 xl:grid-cols-5" data-testid="summary-figures">
      {figures.map((fig) => (
        <div key={fig.label} className={`panel p-3 sm:p-4 ${fig.tone === "act" ? "border-act/60" : fig.tone === "watch" ? "border-watch/60" : ""}`}>
          <dt className="text-sm text-ink-soft">{fig.label}</dt>
          <dd className="figures mt-1 text-lg leading-tight">{fig.value}</dd>
          {fig.sub && <dd className="mt-1 text-xs text-ink-soft">{fig.sub}</dd>}
        </div>
      ))}
    </dl>
  );
}
