import { commandedWords, fadeLeadInWords, failsafeOutcomeWords, flownWords, type FailsafeCommanded, type FailsafeFlown } from "@/lib/analysis/evidence";
import { formatClock, formatLength, formatSpeed, type Units } from "@/lib/format/units";

export type EventTone = "act" | "watch" | "info";

/** One analysis event as the debrief shows it (SI units, seconds from the run's start). */
export interface DebriefEvent {
  id: number;
  kind: string;
  startS: number;
  endS: number;
  lat: number | null;
  lon: number | null;
  distanceFromHomeM: number | null;
  peak: number | null;
  threshold: number | null;
  detail: Record<string, unknown> | null;
}

const words: Record<string, { label: string; tone: EventTone }> = {
  "link-lost": { label: "Link lost", tone: "act" },
  "link-fade": { label: "Link fade", tone: "watch" },
  failsafe: { label: "Failsafe", tone: "act" },
  "return-to-home": { label: "Return to home", tone: "info" },
  "off-route": { label: "Off route", tone: "watch" },
  "waypoint-reached": { label: "Waypoint reached", tone: "info" },
  "waypoint-missed": { label: "Waypoint missed", tone: "act" },
  "fix-lost": { label: "GPS fix lost", tone: "watch" },
  "position-jump": { label: "Position jump", tone: "watch" },
  "low-voltage": { label: "Low voltage", tone: "act" },
  armed: { label: "Armed", tone: "info" },
  disarmed: { label: "Disarmed", tone: "info" },
};

const lower = (s: string) => s.charAt(0).toLowerCase() + s.slice(1);

/** "Link lost (faded from 1:51)", "Failsafe (acted as planned)", "Waypoint reached: Slipway". */
export function eventLabel(e: Pick<DebriefEvent, "kind" | "detail">): string {
  const base = words[e.kind]?.label ?? e.kind;
  const d = e.detail ?? {};
  if ((e.kind === "waypoint-reached" || e.kind === "waypoint-missed") && typeof d.waypoint === "string") return `${base}: ${d.waypoint}`;
  if (e.kind === "failsafe" && typeof d.outcome === "string") return `${base} (${lower(failsafeOutcomeWords(d.outcome))})`;
  if (e.kind === "link-lost" && typeof d.fadeStartS === "number") return `${base} (${fadeLeadInWords(formatClock(d.fadeStartS))})`;
  return base;
}

/**
 * What the event's detail adds, in a line under its label: a failsafe's commanded and flown halves
 * (DESIGN.md §10 "Failsafe is set in two places"); null when there is nothing more to say.
 */
export function eventDetail(e: Pick<DebriefEvent, "kind" | "detail">): string | null {
  const d = e.detail ?? {};
  if (e.kind === "failsafe" && ("commanded" in d || "flown" in d)) {
    return `commanded: ${commandedWords(d.commanded as FailsafeCommanded | null)} · flown: ${flownWords(d.flown as FailsafeFlown | null)}`;
  }
  return null;
}

/** A failsafe that acted as planned is information, not an alarm; one nobody could judge is to watch. */
export function eventTone(e: Pick<DebriefEvent, "kind" | "detail">): EventTone {
  if (e.kind === "failsafe") {
    const outcome = e.detail?.outcome as string | undefined;
    return outcome === "pass" ? "info" : outcome === "not-assessed" || outcome === "no-plan" || outcome === "not-due" ? "watch" : "act";
  }
  return words[e.kind]?.tone ?? "info";
}

/** Where a link loss's lead-in fade began (link-lost `detail.fadeStartS`), s from the run's start. */
export function fadeLeadIn(e: Pick<DebriefEvent, "kind" | "detail" | "startS">): number | null {
  const v = e.kind === "link-lost" ? e.detail?.fadeStartS : undefined;
  return typeof v === "number" && Number.isFinite(v) && v < e.startS ? v : null;
}

/** The event's worst value in words: "LQ 42 % (fade below 70 %)", "1.4 s to act (plan 2 s)". */
export function eventPeak(e: DebriefEvent, units: Units, linkUnit: string | null): string {
  const p = e.peak;
  if (p == null) return "—";
  const th = e.threshold;
  switch (e.kind) {
    case "link-fade":
      return `${round(p)} ${linkUnit ?? ""}`.trim() + (th != null ? ` (threshold ${round(th)})` : "");
    case "link-lost":
      return `${round(p)} ${linkUnit ?? ""}`.trim() + (th != null ? " (at its floor)" : "");
    case "failsafe":
      return `first sign ${p.toFixed(1)} s after the loss` + (th != null ? ` (plan ${th} s)` : "");
    case "waypoint-reached":
    case "waypoint-missed":
      return `closest ${formatLength(p, units)}` + (th != null ? ` (circle ${formatLength(th, units, 0)})` : "");
    case "off-route":
      return `${formatLength(p, units)} off` + (th != null ? ` (corridor ${formatLength(th, units, 0)})` : "");
    case "low-voltage":
      return `${p.toFixed(2)} V/cell` + (th != null ? ` (limit ${th.toFixed(2)})` : "");
    case "fix-lost":
      return `${p} satellites`;
    case "position-jump":
      return `${formatSpeed(p, units)} implied`;
    default:
      return round(p);
  }
}

const round = (v: number) => (Math.abs(v) >= 10 ? v.toFixed(0) : v.toFixed(1));

/** The range to show for an event: the event with context either side, inside the run. */
export function eventWindow(e: Pick<DebriefEvent, "startS" | "endS"> & Partial<Pick<DebriefEvent, "kind" | "detail">>, durationS: number): { from: number; to: number } {
  // A loss that began as a fade is shown from the fade's onset.
  const start = e.kind ? (fadeLeadIn({ kind: e.kind, detail: e.detail ?? null, startS: e.startS }) ?? e.startS) : e.startS;
  const len = Math.max(0, e.endS - start);
  const pad = Math.max(10, len * 0.75);
  const from = Math.max(0, start - pad);
  const to = Math.min(durationS, e.endS + pad);
  return to > from ? { from, to } : { from: 0, to: durationS };
}
