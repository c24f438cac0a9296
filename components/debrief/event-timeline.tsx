"use client";

import { formatClock } from "@/lib/format/units";
import type { EventTone } from "./event-words";

export interface TimelineMark {
  id: number;
  startS: number;
  endS: number;
  tone: EventTone;
  label: string;
  /** Where a loss's lead-in fade began (drawn as a lower bar before the mark). */
  leadInS?: number | null;
}

const toneFill: Record<EventTone, string> = { act: "var(--color-act)", watch: "var(--color-watch)", info: "var(--color-tide-700)" };
// Height as well as colour tells the tones apart: act full, watch two thirds, info one third.
const toneHeight: Record<EventTone, number> = { act: 1, watch: 0.66, info: 0.36 };

/**
 * The whole run as one bar with every event on it, and the part the charts show outlined.
 * Selecting a mark selects the event; the bar itself is a quick way to see where trouble sits.
 */
export function EventTimeline(props: {
  durationS: number;
  marks: TimelineMark[];
  selectedId: number | null;
  range: { from: number; to: number } | null;
  onSelect: (id: number) => void;
}) {
  const { durationS, marks, selectedId, range, onSelect } = props;
  const W = 1000;
  const H = 36;
  const x = (s: number) => (durationS > 0 ? (Math.min(Math.max(s, 0), durationS) / durationS) * W : 0);
  const ticks = Array.from({ length: 5 }, (_, i) => (durationS * i) / 4);
  return (
    <figure className="select-none" data-testid="event-timeline">
      <svg viewBox={`0 0 ${W} ${H}`} className="h-10 w-full" preserveAspectRatio="none" role="group" aria-label="Events along the run">
        <rect x={0} y={0} width={W} height={H} fill="var(--color-tide-50)" stroke="var(--color-rule)" />
        {range && <rect x={x(range.from)} y={0} width={Math.max(2, x(range.to) - x(range.from))} height={H} fill="none" stroke="var(--color-ink)" strokeWidth={2} strokeDasharray="6 3" />}
        {marks.map((m) => {
          const h = H * toneHeight[m.tone];
          const w = Math.max(3, x(m.endS) - x(m.startS));
          const selected = m.id === selectedId;
          const leadIn = m.leadInS != null && m.leadInS < m.startS ? m.leadInS : null;
          return (
            <g key={m.id}>
              {leadIn != null && (
                <rect x={x(leadIn)} y={H - H * toneHeight.watch} width={Math.max(1, x(m.startS) - x(leadIn))} height={H * toneHeight.watch} fill={toneFill.watch} opacity={0.55} aria-hidden="true" />
              )}
              <rect
                x={x(m.startS)}
                y={H - h}
                width={w}
                height={h}
                fill={toneFill[m.tone]}
                opacity={selected ? 1 : 0.75}
                stroke={selected ? "var(--color-ink)" : "none"}
                strokeWidth={selected ? 2 : 0}
                className="cursor-pointer"
                onClick={() => onSelect(m.id)}
              >
                <title>{`${m.label} at ${formatClock(m.startS)}`}</title>
              </rect>
            </g>
          );
        })}
      </svg>
      {/* Labels outside the stretched SVG, so they keep their size on a narrow screen. */}
      <figcaption className="figures flex justify-between text-xs text-ink-soft" aria-hidden="true">
        {ticks.map((t, i) => (
          <span key={i}>{formatClock(t)}</span>
        ))}
      </figcaption>
    </figure>
  );
}
