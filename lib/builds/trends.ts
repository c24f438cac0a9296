/**
 * Figures of a build's runs over time, from each run's stored summary, and the moments the build
 * record changed (markers on the trend charts). Pure.
 */
import { M_PER_FT, type Units } from "@/lib/format/units";
import { changeLabel, changesTheBuild, type Changes } from "./history";

export interface TrendRun {
  id: number;
  title: string;
  status: string;
  startedAt: Date | null;
  createdAt: Date;
  summary: Record<string, unknown> | null;
}

export interface TrendPoint {
  /** When the run happened, Unix seconds. */
  t: number;
  v: number;
  runId: number;
  title: string;
}

export interface TrendMetric {
  key: "linkMin" | "range" | "failsafeLatency" | "xteRms" | "minCell";
  label: string;
  unit: string;
  points: TrendPoint[];
  /** Which way is better, for the reader. */
  better: "higher" | "lower";
  note: string | null;
}

export interface TrendMarker {
  t: number;
  label: string;
}

const LINK_WORDS: Record<string, string> = { lq: "LQ", "rssi-pct": "RSSI", "rssi-dbm": "RSSI" };

const at = (o: unknown, path: string[]): unknown => path.reduce<unknown>((v, k) => (v && typeof v === "object" ? (v as Record<string, unknown>)[k] : undefined), o);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : null);
const when = (r: TrendRun) => Math.floor((r.startedAt ?? r.createdAt).getTime() / 1000);

/**
 * The five trend series of a build (link minimum, range estimate, failsafe latency, cross-track
 * RMS, lowest cell voltage) over its ready runs, oldest first, and the change markers.
 * The link minimum is shown in one metric only (LQ %, RSSI % or RSSI dBm, whichever the latest
 * run used); runs measured in another are left out and counted in the note.
 */
export function buildTrends(runs: TrendRun[], changes: { createdAt: Date; changes: Changes }[], units: Units = "metric") {
  const ready = runs.filter((r) => r.status === "ready" && r.summary).sort((a, b) => when(a) - when(b) || a.id - b.id);
  const len = units === "imperial" ? { unit: "ft", k: 1 / M_PER_FT } : { unit: "m", k: 1 };
  const pick = (path: string[], k = 1) =>
    ready.flatMap((r) => {
      const v = num(at(r.summary, path));
      return v === null ? [] : [{ t: when(r), v: v * k, runId: r.id, title: r.title }];
    });

  const withLink = ready.filter((r) => num(at(r.summary, ["link", "min"])) !== null);
  const metric = withLink.length ? (at(withLink[withLink.length - 1].summary, ["link", "metric"]) as string) : null;
  const linkRuns = withLink.filter((r) => at(r.summary, ["link", "metric"]) === metric);
  const linkUnit = linkRuns.length ? String(at(linkRuns[0].summary, ["link", "unit"]) ?? "") : "";
  const left = withLink.length - linkRuns.length;

  const metrics: TrendMetric[] = [
    {
      key: "linkMin",
      label: `Link minimum${metric ? ` (${LINK_WORDS[metric] ?? metric}${linkUnit ? ` ${linkUnit}` : ""})` : ""}`,
      unit: linkUnit,
      points: linkRuns.map((r) => ({ t: when(r), v: num(at(r.summary, ["link", "min"]))!, runId: r.id, title: r.title })),
      better: "higher",
      note: left > 0 ? `${left} run${left === 1 ? "" : "s"} measured the link another way and ${left === 1 ? "is" : "are"} left out.` : null,
    },
    { key: "range", label: `Range estimate (${len.unit})`, unit: len.unit, points: pick(["range", "estimatedRangeM"], len.k), better: "higher", note: "Each an estimate from one run." },
    { key: "failsafeLatency", label: "Failsafe latency (s)", unit: "s", points: pick(["failsafe", "latencyS"]), better: "lower", note: null },
    { key: "xteRms", label: `Cross-track error RMS (${len.unit})`, unit: len.unit, points: pick(["route", "xteRmsM"], len.k), better: "lower", note: null },
    { key: "minCell", label: "Lowest cell voltage under load (V)", unit: "V", points: pick(["power", "minCellV"]), better: "higher", note: null },
  ];

  const markers: TrendMarker[] = changes
    .filter((c) => changesTheBuild(c.changes))
    .map((c) => {
      const keys = Object.keys(c.changes).filter((k) => k !== "photo" && k !== "retired");
      const sheet = keys.filter((k) => k.startsWith("ch")).length;
      const named = keys.filter((k) => !k.startsWith("ch")).map(changeLabel);
      const parts = [...named.slice(0, 3), ...(named.length > 3 ? [`${named.length - 3} more`] : []), ...(sheet ? ["link sheet"] : [])];
      return { t: Math.floor(c.createdAt.getTime() / 1000), label: parts.join(", ") };
    })
    .sort((a, b) => a.t - b.t);

  return { metrics, markers, runs: ready.length };
}

export type BuildTrends = ReturnType<typeof buildTrends>;
