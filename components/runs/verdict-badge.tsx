const looks = {
  clear: { word: "Clear", mark: "●", cls: "border-clear/40 bg-clear/10 text-clear" },
  watch: { word: "Watch", mark: "▲", cls: "border-watch/40 bg-watch/10 text-watch" },
  act: { word: "Act", mark: "■", cls: "border-act/40 bg-act/10 text-act" },
} as const;

/** A verdict as a word with a shape, so it never rests on colour alone. */
export function VerdictBadge({ level }: { level: string | null | undefined }) {
  const look = level && level in looks ? looks[level as keyof typeof looks] : null;
  if (!look) return <span className="text-ink-soft">—</span>;
  return (
    <span className={`inline-flex items-center gap-1 rounded border px-2 py-0.5 text-xs font-semibold ${look.cls}`}>
      <span aria-hidden="true">{look.mark}</span>
      {look.word}
    </span>
  );
}
