import { formatLength, formatSpeed, type Units } from "@/lib/format/units";

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

export function eventLabel(e: Pick<DebriefEvent, "kind" | "detail">): string {
  const base = words[e.kind]?.label ?? e.kind;
  const d = e.detail ?? {};
  if ((e.kind === "waypoint-reached" || e.kind === "waypoint-missed") && typeof d.waypoint === "string") return `${base}: ${d.waypoint}`;
  if (e.kind === "failsafe" && typeof d.outcome === "string") return `${base} (${outcomeWords[d.outcome] ?? d.outcome})`;
  return base;
}

const outcomeWords: Record<string, string> = {
  pass: "as planned",
  "no-plan": "no plan to judge by",
  late: "late",
  "wrong-action": "wrong action",
  "not-triggered": "did not trigger",
  "not-due": "not judged",
};

/** A failsafe that acted as planned is information, not an alarm. */
export function eventTone(e: Pick<DebriefEvent, "kind" | "detail">): EventTone {
  if (e.kind === "failsafe") {
    const outcome = e.detail?.outcome as string | undefined;
    return outcome === "pass" ? "info" : outcome === "no-plan" || outcome === "not-due" ? "watch" : "act";
  }
  return words[e.kind]?.tone ?? "info";
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
      return `${p.toFixed(1)} s to act` + (th != null ? ` (plan ${th} s)` : "");
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
export function eventWindow(e: Pick<DebriefEvent, "startS" | "endS">, durationS: number): { from: number; to: number } {
  const len = Math.max(0, e.endS - e.startS);
  const pad = Math.max(10, len * 0.75);
  const from = Math.max(0, e.startS - pad);
  const to = Math.min(durationS, e.endS + pad);
  return to > from ? { from, to } : { from: 0, to: durationS };
}
