import { verdictLines, type StoredVerdict, type VerdictLevel } from "./verdict-words";

export type { VerdictLevel } from "./verdict-words";

const looks: Record<VerdictLevel, { cls: string; mark: string }> = {
  act: { cls: "border-act", mark: "■" },
  watch: { cls: "border-watch", mark: "▲" },
  clear: { cls: "border-clear", mark: "●" },
};

export const utcMinute = (d: Date) => d.toISOString().replace("T", " ").slice(0, 16) + " UTC";

/**
 * The verdict with its reasons, what held and what the log could not show, and the sign-off
 * state; the same on the debrief and the shared page. `children` holds the lead's sign-off form
 * where there is one.
 */
export function VerdictStrip(props: {
  verdict: StoredVerdict;
  signOff: { by: string; at: Date } | null;
  notSignedHint?: string;
  children?: React.ReactNode;
}) {
  const { verdict, signOff } = props;
  const look = looks[verdict.level];
  if (!look) return null;
  const words = verdictLines(verdict);
  return (
    <section aria-label="Verdict" data-testid="verdict" className={`mb-4 flex flex-col gap-3 rounded-lg border-l-8 bg-card p-4 sm:flex-row sm:items-start sm:justify-between ${look.cls}`}>
      <div className="min-w-0">
        <p className="text-lg font-bold">
          <span aria-hidden="true">{look.mark} </span>
          {words.title}
        </p>
        {words.reasons.length > 0 && (
          <ul className="mt-1 list-disc pl-5 text-sm" data-testid="verdict-reasons">
            {words.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        )}
        {words.held && (
          <p className="mt-1 text-sm" data-testid="verdict-held">
            {words.held}
          </p>
        )}
        {words.notAssessed.length > 0 && (
          <ul className="mt-2 space-y-0.5 text-sm text-ink-soft" data-testid="verdict-not-assessed">
            {words.notAssessed.map((n) => (
              <li key={n} className="flex gap-2">
                <span aria-hidden="true">○</span>
                <span>{n}</span>
              </li>
            ))}
          </ul>
        )}
        {words.legacy && <p className="mt-1 text-sm">{words.legacy}</p>}
      </div>
      <div className="shrink-0 text-sm sm:text-right" data-testid="sign-off">
        {signOff ? (
          <p>
            <span className="font-semibold">Signed off</span> by {signOff.by}
            <br />
            <span className="figures text-ink-soft">{utcMinute(signOff.at)}</span>
          </p>
        ) : (
          <p className="text-ink-soft">Not signed off yet{props.notSignedHint ?? ""}.</p>
        )}
        {props.children}
      </div>
    </section>
  );
}
