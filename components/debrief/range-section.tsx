import { RangeChart } from "@/components/charts/range-chart";
import { SafetyNote } from "@/components/ui/safety-note";
import { formatDistance, type Units } from "@/lib/format/units";
import type { RunSummary } from "./summary-figures";

/** The range view with its explanation and caution; the same on the debrief and the shared page. */
export function RangeSection(props: { runId: number; version: string; apiBase?: string; range: RunSummary["range"]; units: Units }) {
  const { range, units } = props;
  return (
    <section className="panel mt-6" aria-labelledby="range-title">
      <h2 id="range-title" className="text-lg font-semibold">
        Range: signal against distance
      </h2>
      <p className="mt-1 max-w-prose text-sm text-ink-soft">
        Each dot is a sample with RSSI in dBm and a position. The solid line is the log-distance fit of this run; the dashed line
        falls 20 dB per decade as in free space. Where the fit meets the threshold (receiver sensitivity plus the fade margin) is
        the estimate{range?.estimatedRangeM != null ? `: ${formatDistance(range.estimatedRangeM, units)}` : ""}.
      </p>
      {range?.credible === false && (
        <p className="mt-2 max-w-prose text-sm font-medium" data-testid="range-not-credible">
          No credible fit, so no range is quoted: {range.notCredibleWhy}. The dots still show what the link did at each distance.
        </p>
      )}
      <div className="mt-3">
        <RangeChart
          runId={props.runId}
          version={props.version}
          apiBase={props.apiBase}
          fit={range?.p0Dbm != null && range.pathLossExponent != null ? { p0Dbm: range.p0Dbm, pathLossExponent: range.pathLossExponent } : null}
          thresholdDbm={range?.thresholdDbm ?? null}
          estimatedRangeM={range?.estimatedRangeM ?? null}
          distanceUnit={units === "imperial" ? "ft" : "m"}
        />
      </div>
      <div className="mt-3">
        <SafetyNote topic="range" />
      </div>
    </section>
  );
}
