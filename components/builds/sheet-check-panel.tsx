import type { Severity, SheetCheckResult } from "@/lib/builds/sheet-check";

const groups: { severity: Severity; title: string; mark: string; cls: string }[] = [
  { severity: "error", title: "Fix before the next run", mark: "■", cls: "border-act text-act" },
  { severity: "warning", title: "Check", mark: "▲", cls: "border-watch text-watch" },
  { severity: "info", title: "For information", mark: "●", cls: "border-tide-500 text-tide-700" },
];

/** The sheet check, grouped by severity; each finding says why it matters and how to fix it. */
export function SheetCheckPanel({ check, compact = false }: { check: SheetCheckResult; compact?: boolean }) {
  const { findings, evidence } = check;
  const evidenceNote =
    evidence.runs === 0
      ? "No analysed runs yet, so only the sheet itself was checked."
      : evidence.runs === 1
        ? `Also checked against the log of its latest run (${evidence.runsWithRc ? "with" : "without"} RC channels).`
        : `Also checked against the logs of its latest ${evidence.runs} runs (${evidence.runsWithRc} with RC channels).`;
  return (
    <div data-testid="sheet-check" data-findings={findings.length}>
      {findings.length === 0 ? (
        <p className="rounded-md border-l-4 border-clear bg-clear/10 px-4 py-3 text-sm" data-testid="sheet-check-clear">
          <span aria-hidden="true">● </span>
          No findings: the link sheet and failsafe plan are consistent.
        </p>
      ) : (
        <div className="grid gap-5">
          {groups.map((g) => {
            const list = findings.filter((f) => f.severity === g.severity);
            if (list.length === 0) return null;
            return (
              <section key={g.severity} aria-label={g.title} className="break-inside-avoid">
                <h3 className={`mb-2 text-sm font-bold uppercase tracking-wide ${g.cls.split(" ")[1]}`}>
                  <span aria-hidden="true">{g.mark} </span>
                  {g.title} ({list.length})
                </h3>
                <ul className="grid gap-2">
                  {list.map((f, i) => (
                    <li key={`${f.rule}-${i}`} data-rule={f.rule} className={`break-inside-avoid rounded-md border-l-4 bg-card px-4 py-3 ${g.cls.split(" ")[0]}`}>
                      <p className="font-semibold">{f.title}</p>
                      <p className="mt-0.5 text-sm">{f.detail}</p>
                      {!compact && (
                        <>
                          <p className="mt-1 text-sm text-ink-soft">
                            <span className="font-medium text-ink">Why it matters: </span>
                            {f.why}
                          </p>
                          <p className="mt-1 text-sm text-ink-soft">
                            <span className="font-medium text-ink">How to fix: </span>
                            {f.fix}
                          </p>
                        </>
                      )}
                      <p className="figures mt-1 text-xs text-ink-soft">rule {f.rule}</p>
                    </li>
                  ))}
                </ul>
              </section>
            );
          })}
        </div>
      )}
      <p className="mt-3 text-sm text-ink-soft">{evidenceNote}</p>
    </div>
  );
}
