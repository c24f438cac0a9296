import type { ReactNode } from "react";
import { utcMinute } from "./verdict-strip";

export interface DebriefNote {
  id: number;
  body: string;
  authorName: string | null;
  createdAt: Date;
}

/** A debrief's notes, oldest first; the run page adds its note form below as `children`. */
export function NotesSection({ notes, emptyText, children }: { notes: DebriefNote[]; emptyText: string; children?: ReactNode }) {
  return (
    <section className="panel mt-6" aria-labelledby="notes-title">
      <h2 id="notes-title" className="text-lg font-semibold">
        Notes <span className="figures text-ink-soft">({notes.length})</span>
      </h2>
      {notes.length === 0 ? (
        <p className="mt-1 text-sm text-ink-soft">{emptyText}</p>
      ) : (
        <ol className="mt-2 space-y-3" data-testid="notes">
          {notes.map((n) => (
            <li key={n.id} className="border-l-4 border-tide-300 pl-3">
              <p className="text-sm whitespace-pre-wrap break-words">{n.body}</p>
              <p className="mt-1 text-xs text-ink-soft">
                {n.authorName ?? "a former member"} · <span className="figures">{utcMinute(n.createdAt)}</span>
              </p>
            </li>
          ))}
        </ol>
      )}
      {children}
    </section>
  );
}
