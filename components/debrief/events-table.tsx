"use client";

import { useEffect, useRef, useState } from "react";
import { formatClock, formatDistance, formatSpan, type Units } from "@/lib/format/units";
import { eventDetail, eventLabel, eventPeak, eventTone, type DebriefEvent } from "./event-words";

const FIRST_ROWS = 200;
const toneMark = { act: "■", watch: "▲", info: "●" } as const;
const toneText = { act: "text-act", watch: "text-watch", info: "text-tide-700" } as const;

/** Every event of the run; choosing a row selects the event everywhere (charts, map, timeline). */
export function EventsTable(props: {
  events: DebriefEvent[];
  selectedId: number | null;
  onSelect: (id: number) => void;
  units: Units;
  linkUnit: string | null;
  /** A bench run has no positions: no "From home" column. */
  bench?: boolean;
}) {
  const { events, selectedId, onSelect, units, linkUnit, bench = false } = props;
  const [all, setAll] = useState(false);
  const selectedRow = useRef<HTMLTableRowElement>(null);
  const selectedIndex = events.findIndex((e) => e.id === selectedId);
  const shown = all || selectedIndex >= FIRST_ROWS ? events : events.slice(0, FIRST_ROWS);

  useEffect(() => {
    selectedRow.current?.scrollIntoView({ block: "nearest" });
  }, [selectedId]);

  if (events.length === 0) {
    return <p className="text-sm text-ink-soft">Nothing fired: no fades, losses, failsafe actions, route or battery events in this run.</p>;
  }
  return (
    <div className="max-h-[28rem] overflow-auto rounded-md border border-rule">
      <table className="w-full min-w-[560px] text-left text-sm" data-testid="events-table">
        <thead className="sticky top-0 bg-tide-50 text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">Event</th>
            <th scope="col" className="px-3 py-2 font-medium">At</th>
            <th scope="col" className="px-3 py-2 text-right font-medium">Lasted</th>
            <th scope="col" className="px-3 py-2 font-medium">Worst</th>
            {!bench && <th scope="col" className="px-3 py-2 text-right font-medium">From home</th>}
          </tr>
        </thead>
        <tbody className="divide-y divide-rule">
          {shown.map((e) => {
            const tone = eventTone(e);
            const selected = e.id === selectedId;
            const detail = eventDetail(e);
            return (
              <tr
                key={e.id}
                ref={selected ? selectedRow : undefined}
                data-event-id={e.id}
                aria-selected={selected}
                className={selected ? "bg-signal-100" : "hover:bg-tide-50"}
              >
                <td className="px-3 py-1">
                  <button type="button" onClick={() => onSelect(e.id)} className="flex min-h-10 w-full items-baseline gap-2 py-1 text-left font-medium">
                    <span aria-hidden="true" className={toneText[tone]}>
                      {toneMark[tone]}
                    </span>
                    <span>
                      {eventLabel(e)}
                      {detail && <span className="block text-xs font-normal text-ink-soft">{detail}</span>}
                    </span>
                  </button>
                </td>
                <td className="figures px-3 py-1">{formatClock(e.startS)}</td>
                <td className="figures px-3 py-1 text-right">{e.endS > e.startS ? formatSpan(e.endS - e.startS) : "—"}</td>
                <td className="figures px-3 py-1">{eventPeak(e, units, linkUnit)}</td>
                {!bench && <td className="figures px-3 py-1 text-right">{formatDistance(e.distanceFromHomeM, units)}</td>}
              </tr>
            );
          })}
        </tbody>
      </table>
      {shown.length < events.length && (
        <p className="border-t border-rule p-2 text-center text-sm">
          <button type="button" className="btn-quiet" onClick={() => setAll(true)}>
            Show all {events.length.toLocaleString("en")} events
          </button>
        </p>
      )}
    </div>
  );
}
