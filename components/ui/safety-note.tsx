import { safetyTexts, type SafetyTopic } from "./safety-texts";

/** The standing cautions: Sortie reviews runs, it does not certify anything. */
export function SafetyNote({ topic = "general" }: { topic?: SafetyTopic }) {
  const text = safetyTexts[topic];
  return (
    <aside className="flex gap-3 rounded-md border-l-4 border-signal-500 bg-signal-100 px-4 py-3 text-sm text-ink" role="note">
      <svg viewBox="0 0 24 24" className="mt-0.5 h-5 w-5 shrink-0 text-signal-700" fill="none" stroke="currentColor" strokeWidth="2" aria-hidden="true">
        <path d="M12 3 2 21h20L12 3zM12 10v5M12 18v.5" strokeLinecap="round" />
      </svg>
      <p>{text}</p>
    </aside>
  );
}
