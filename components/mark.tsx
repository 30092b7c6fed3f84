/** Baywright's mark: a shop bay door, half raised, with a truck's light showing underneath. */
export function BaywrightMark({ className = "h-8 w-8" }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" className={className} aria-hidden="true">
      <rect x="2" y="2" width="28" height="28" rx="6" fill="var(--color-bay-700)" />
      <path d="M7 9h18M7 13h18M7 17h18" stroke="var(--color-bay-100)" strokeWidth="2.2" strokeLinecap="round" />
      <rect x="7" y="21" width="18" height="5" rx="1.5" fill="var(--color-bay-900)" />
      <circle cx="11" cy="23.5" r="1.6" fill="var(--color-spark-500)" />
      <circle cx="21" cy="23.5" r="1.6" fill="var(--color-spark-500)" />
    </svg>
  );
}

export function Wordmark() {
  return (
    <span className="flex items-center gap-2 font-semibold tracking-tight text-ink">
      <BaywrightMark />
      <span className="text-lg">Baywright</span>
    </span>
  );
}
