import { summaryFigures, type RunSummary } from "@/components/debrief/figure-list";
import { VERDICT_TITLES, verdictLines } from "@/components/debrief/verdict-words";
import { cleanText } from "@/lib/reports/layout";
import type { Units } from "@/lib/format/units";
import { escapeHtml, layout } from "./templates";
import type { Mail } from "./transport";

/** The figures a lead needs to decide what to do before opening the debrief. */
const KEY_FIGURES = ["Duration", "Distance travelled", "Farthest from home", "Link minimum", "Failsafe", "Waypoints", "Lowest cell under load"];

export interface RunAlertArgs {
  to: string;
  name: string;
  units: Units;
  crewName: string;
  run: { id: number; title: string; startedAt: Date | null; summary: RunSummary };
  reasons: string[];
  buildName: string | null;
  pilotName: string | null;
  /** `${APP_URL}/runs/{id}` */
  url: string;
  settingsUrl: string;
}

/** One line of user text for a header or a sentence: no control characters or line breaks. */
const line = (s: string) => cleanText(s);

/**
 * "Act before the next run" for one lead: why (the verdict's reasons), the key figures in the
 * lead's units, a link to the debrief, and where to turn these mails off. Every user text
 * (title, names, crew, waypoint names inside reasons and figures) is escaped in the HTML part.
 */
export function runAlertMail(a: RunAlertArgs): Mail {
  const title = line(a.run.title) || `Run ${a.run.id}`;
  const figures = summaryFigures(a.run.summary, a.units)
    .filter((f) => KEY_FIGURES.includes(f.label))
    .map((f) => {
      const more = [f.sub, ...(f.detail ?? [])].filter(Boolean).join("; ");
      return { label: f.label, value: more ? `${f.value} (${more})` : f.value };
    });
  // What the log could not show, so "act" is read with its gaps (DESIGN.md §10 "Evidence, not absence").
  const gaps = a.run.summary.verdict ? verdictLines(a.run.summary.verdict).notAssessed.map(line) : [];
  const context = [a.buildName && line(a.buildName), a.pilotName && `pilot ${line(a.pilotName)}`, a.run.startedAt && `log started ${a.run.startedAt.toUTCString()}`]
    .filter(Boolean)
    .join(" · ");
  const reasons = a.reasons.map(line);
  const crew = line(a.crewName);

  const text =
    `Hello ${line(a.name)},\n\n` +
    `The run "${title}" of ${crew} was analysed with the verdict ACT: act before the next run.\n` +
    (context ? `${context}\n` : "") +
    `\nWhy:\n${reasons.map((r) => `- ${r}`).join("\n")}\n\n` +
    (gaps.length ? `${gaps.join("\n")}\n\n` : "") +
    `Key figures:\n${figures.map((f) => `${f.label}: ${f.value}`).join("\n")}\n\n` +
    `Open the debrief: ${a.url}\n\n` +
    `You get this because you lead ${crew} and have verdict alerts on. Turn these off in Settings: ${a.settingsUrl}`;

  const html = layout(
    `${VERDICT_TITLES.act}: ${escapeHtml(title)}`,
    [
      `Hello ${escapeHtml(line(a.name))},`,
      `The run <b>${escapeHtml(title)}</b> of ${escapeHtml(crew)} was analysed with the verdict <b style="color:#b42318">act</b>.` +
        (context ? `<br><span style="color:#51636e">${escapeHtml(context)}</span>` : ""),
      `<b>Why</b><br>${reasons.map((r) => `&bull; ${escapeHtml(r)}`).join("<br>")}`,
      ...(gaps.length ? [gaps.map((g) => escapeHtml(g)).join("<br>")] : []),
      `<b>Key figures</b><br>${figures.map((f) => `${escapeHtml(f.label)}: ${escapeHtml(f.value)}`).join("<br>")}`,
    ],
    { label: "Open the debrief", url: a.url },
    `You get this because you lead ${escapeHtml(crew)} and have verdict alerts on. <a href="${escapeHtml(a.settingsUrl)}" style="color:#0f5e63">Turn these off in Settings</a>.`,
  );

  return {
    to: a.to,
    // A header: one line, and short enough for a phone's list.
    subject: `${VERDICT_TITLES.act}: ${title.length > 90 ? `${title.slice(0, 89)}…` : title}`,
    text,
    html,
  };
}
