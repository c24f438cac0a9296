export type VerdictLevel = "act" | "watch" | "clear";

const looks = {
  act: { title: "Act before the next run", cls: "border-act", mark: "■" },
  watch: { title: "Watch", cls: "border-watch", mark: "▲" },
  clear: { title: "Clear", cls: "border-clear", mark: "●" },
} as const;

export const utcMinute = (d: Date) => d.toISOString().replace("T", " ").slice(0, 16) + " UTC";

/**
 * The verdict with its reasons and the sign-off state; the same on the debrief and the shared page.
 * `children` holds the lead's sign-off form where there is one.
 */
export function VerdictStrip(props: {
  verdict: { level: VerdictLevel; reasons: string[] };
  signOff: { by: string; at: Date } | null;
  notSignedHint?: string;
  children?: React.ReactNode;
}) {
  const { verdict, signOff } = props;
  const look = looks[verdict.level];
  if (!look) return null;
  return (
    <section aria-label="Verdict" data-testid="verdict" className={`mb-4 flex flex-col gap-3 rounded-lg border-l-8 bg-card p-4 sm:flex-row sm:items-start sm:justify-between ${look.cls}`}>
      <div>
        <p className="text-lg font-bold">
          <span aria-hidden="true">{look.mark} </span>
          {look.title}
        </p>
        {verdict.reasons.length > 0 ? (
          <ul className="mt-1 list-disc pl-5 text-sm">
            {verdict.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        ) : (
          <p className="mt-1 text-sm">No rule fired: the link held, the failsafe was not needed, the route and battery stayed in limits.</p>
        )}
      </div>
      <div className="text-sm sm:text-right" data-testid="sign-off">
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
