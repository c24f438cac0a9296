import { changeLabel, sheetChangeKey, type Changes } from "@/lib/builds/history";

const utc = (d: Date) => d.toISOString().replace("T", " ").slice(0, 16) + " UTC";

const words: Record<string, string> = {
  "return-to-home": "return to home",
  rssi: "RSSI",
  "fixed-wing": "fixed-wing",
};

function show(v: unknown): string {
  if (v === null || v === undefined || v === "") return "—";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "string") return words[v] ?? (v.length > 80 ? `${v.slice(0, 77)}…` : v);
  return String(v);
}

export interface HistoryEntry {
  id: number;
  createdAt: Date;
  byName: string | null;
  changes: Changes;
}

function FromTo({ from, to }: { from: unknown; to: unknown }) {
  return (
    <>
      <span className="sr-only">from </span>
      <span>{show(from)}</span>
      <span aria-hidden="true"> → </span>
      <span className="sr-only"> to </span>
      <span className="font-medium">{show(to)}</span>
    </>
  );
}

/** Who changed what in the build record, newest first. */
export function BuildHistory({ entries }: { entries: HistoryEntry[] }) {
  if (entries.length === 0) return <p className="text-sm text-ink-soft">No changes since the build was recorded.</p>;
  return (
    <ol className="grid gap-3" data-testid="build-history">
      {entries.map((e) => {
        const items = Object.entries(e.changes);
        const fields = items.filter(([k]) => !sheetChangeKey(k));
        // Link-sheet changes read per channel: "Channel 5: function unused → arm, switch — → A".
        const channels = new Map<number, { label: string; from: unknown; to: unknown }[]>();
        for (const [k, c] of items) {
          const sk = sheetChangeKey(k);
          if (sk) channels.set(sk.channel, [...(channels.get(sk.channel) ?? []), { label: sk.label, ...c }]);
        }
        return (
          <li key={e.id} className="rounded-md border border-rule px-4 py-3">
            <p className="text-sm">
              <span className="font-semibold">{e.byName ?? "A former member"}</span>{" "}
              <span className="figures text-ink-soft">{utc(e.createdAt)}</span>
            </p>
            <ul className="mt-1 grid gap-0.5 text-sm">
              {fields.map(([key, c]) => (
                <li key={key}>
                  <span className="text-ink-soft">{changeLabel(key)}: </span>
                  <FromTo from={c.from} to={c.to} />
                </li>
              ))}
              {[...channels].map(([ch, list]) => (
                <li key={`ch${ch}`}>
                  <span className="text-ink-soft">Channel {ch}: </span>
                  {list.map((c, i) => (
                    <span key={c.label}>
                      {i > 0 && ", "}
                      {c.label} <FromTo from={c.from} to={c.to} />
                    </span>
                  ))}
                </li>
              ))}
            </ul>
          </li>
        );
      })}
    </ol>
  );
}
