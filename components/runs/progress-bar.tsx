export function ProgressBar({ value, label, tone = "tide" }: { value: number; label: string; tone?: "tide" | "signal" }) {
  const pct = Math.round(Math.max(0, Math.min(1, value)) * 100);
  return (
    <div>
      <div className="mb-1 flex justify-between text-sm">
        <span>{label}</span>
        <span className="figures">{pct} %</span>
      </div>
      <div className="h-3 overflow-hidden rounded-full bg-tide-100" role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct}>
        <div className={`h-full rounded-full transition-[width] duration-200 ${tone === "tide" ? "bg-tide-700" : "bg-signal-500"}`} style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}
