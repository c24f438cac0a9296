/** Sortie's mark: an outbound arc and its return leg, meeting at home. */
export function Logo({ className = "h-7 w-auto" }: { className?: string }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
        <circle cx="6" cy="26" r="3.2" fill="currentColor" />
        <path d="M6 26 C 8 10, 20 4, 27 6" fill="none" stroke="currentColor" strokeWidth="2.6" strokeLinecap="round" />
        <path d="M27 6 C 24 14, 16 22, 6 26" fill="none" stroke="#d97a07" strokeWidth="2.6" strokeLinecap="round" strokeDasharray="3 3.2" />
      </svg>
      <span className="text-lg font-bold tracking-[0.14em]">SORTIE</span>
    </span>
  );
}
